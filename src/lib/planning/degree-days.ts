import { PlanningInputError, requireFinite } from './errors';

/**
 * Growing degree days for one day, standard average method (McMaster & Wilhelm
 * 1997): ((Tmax + Tmin) / 2) − Tbase, floored at 0. With a cap (the 86/50 °F
 * convention for corn) both temperatures are first held inside [base, cap], so
 * a day can add at most cap − base. All temperatures in °F.
 */
export function growingDegreeDays(tMaxF: number, tMinF: number, baseF: number, capF?: number): number {
	requireFinite('tMaxF', tMaxF);
	requireFinite('tMinF', tMinF);
	requireFinite('baseF', baseF);
	if (tMaxF < tMinF) throw new PlanningInputError('tMaxF', `must not be below tMinF (${tMaxF} < ${tMinF})`);
	let hi = tMaxF;
	let lo = tMinF;
	if (capF !== undefined) {
		requireFinite('capF', capF);
		if (capF <= baseF) throw new PlanningInputError('capF', `must be above baseF (${capF} <= ${baseF})`);
		hi = Math.min(Math.max(hi, baseF), capF);
		lo = Math.min(Math.max(lo, baseF), capF);
	}
	return Math.max(0, (hi + lo) / 2 - baseF);
}

/** Daily GDD from a day's mean temperature alone (the weekly-normal case): max(0, mean − base). */
export function meanDegreeDays(meanF: number, baseF: number): number {
	return Math.max(0, meanF - baseF);
}
