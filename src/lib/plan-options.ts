// What a season plan is asked with, built in one place so that the owner's plan (the server's
// preview and apply) and the demo seed make the same call: the farm's bed-foot increment and
// turnaround, the request's interval and margin, "today" (no work planned before it), the first
// day the ground can take a planting, and the families each bed held in the years before the
// season (rotation).
import { addDays, type PlanOptions } from './planning';

/** How many years back a bed's families count for rotation (common practice: a 3-year rotation). */
export const ROTATION_LOOK_BACK_YEARS = 3;

/**
 * Days before the last spring frost that the ground can first be worked: common practice (no
 * published source), hardy crops go in "as soon as the soil can be worked", 4 to 6 weeks before
 * the last spring frost. Nothing is planned into the field before then in the season's year.
 */
export const GROUND_WORKABLE_DAYS_BEFORE_LAST_FROST = 42;

/** The season year's first workable day: its last spring frost (month and day of the farm's) less the lead. */
export function earliestFieldDate(lastSpringFrost: string, seasonYear: number): string {
	const monthDay = lastSpringFrost.slice(4) === '-02-29' ? '-02-28' : lastSpringFrost.slice(4);
	return addDays(`${String(seasonYear).padStart(4, '0')}${monthDay}`, -GROUND_WORKABLE_DAYS_BEFORE_LAST_FROST);
}

export function seasonPlanOptions(
	farm: { bedFootIncrement: number; turnaroundDays: number; lastSpringFrost: string },
	request: { intervalWeeks?: number; margin?: number },
	today: string,
	seasonYear: number
): PlanOptions & { turnaroundDays: number } {
	const out: PlanOptions & { turnaroundDays: number } = {
		bedFootIncrement: farm.bedFootIncrement,
		turnaroundDays: farm.turnaroundDays,
		today,
		earliestFieldDate: earliestFieldDate(farm.lastSpringFrost, seasonYear)
	};
	if (request.intervalWeeks !== undefined) out.intervalWeeks = request.intervalWeeks;
	if (request.margin !== undefined) out.margin = request.margin;
	return out;
}

/**
 * The families each bed held before the season: plantings in a bed that went into the field in
 * the `years` years before `seasonStart` (the farm's rotation look-back, default
 * ROTATION_LOOK_BACK_YEARS; last autumn's garlic included).
 */
export function previousFamiliesByBed(
	plantings: readonly { bedId: string | null; family?: string | null; fieldDate: string }[],
	seasonStart: string,
	years: number = ROTATION_LOOK_BACK_YEARS
): Record<string, string[]> {
	const from = `${String(Number(seasonStart.slice(0, 4)) - years).padStart(4, '0')}${seasonStart.slice(4)}`;
	const out: Record<string, string[]> = {};
	for (const p of plantings) {
		if (p.bedId === null || !p.family || p.fieldDate >= seasonStart || p.fieldDate < from) continue;
		const list = (out[p.bedId] ??= []);
		if (!list.includes(p.family)) list.push(p.family);
	}
	return out;
}
