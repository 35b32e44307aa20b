import { dayLengthHours, dayOfYearOfDay } from './day-length';
import { type DayNumber, fromDayNumber, weekdayOf } from './day-number';
import { ceilSafe } from './numbers';
import { meanDegreeDays } from './degree-days';
import type { TempLookup } from './weekly-temps';
import type { PlanningWarning, Variety } from './types';

/** gdd_cold: the degree days before that harvest do not add up since the last cold spell. */
export type DtmSource = 'variety' | 'short_day' | 'gdd' | 'gdd_cold';

export interface EffectiveDtm {
	days: number;
	source: DtmSource;
	varietyDays: number;
	/** Day length at the farm's latitude on the first-harvest date, hours. */
	dayLengthHours: number;
	thresholdHours: number;
	allowanceDays: number;
	gdd?: { required: number; accumulated: number; baseF: number; days: number };
	warnings: PlanningWarning[];
}

export interface DtmContext {
	latitude: number;
	shortDayAllowanceDays: number;
	shortDayThresholdHours: number;
	gddWalkLimitDays: number;
	temps?: TempLookup;
}

/**
 * Effective days to maturity for a first harvest on `firstHarvest` (DESIGN step 3).
 * With weekly temperatures and a GDD requirement, walk back day by day from the
 * day before first harvest, adding max(0, weekly mean − base), until the
 * requirement is met; the degree-day figure then replaces the calendar rule
 * (temperature already slows an autumn crop). Otherwise: the variety's figure,
 * plus the short-day allowance when day length at first harvest is under the
 * threshold (common practice: about two weeks longer in autumn's short days).
 */
export function effectiveDaysToMaturity(variety: Variety, firstHarvest: DayNumber, ctx: DtmContext): EffectiveDtm {
	return effectiveDaysInto(blankDtm(), variety, firstHarvest, ctx);
}

// Day length by day of the year, per latitude: a plan asks for the same few hundred days over and over.
const dayLengths = new Map<number, Float64Array>();

function dayLengthAt(latitude: number, doy: number): number {
	let t = dayLengths.get(latitude);
	if (!t) {
		if (dayLengths.size > 64) dayLengths.clear();
		t = new Float64Array(367).fill(NaN);
		dayLengths.set(latitude, t);
	}
	let h = t[doy];
	if (Number.isNaN(h)) h = t[doy] = dayLengthHours(latitude, doy);
	return h;
}

/** An empty record for effectiveDaysInto to fill. */
export function blankDtm(): EffectiveDtm {
	return {
		days: 0,
		source: 'variety',
		varietyDays: 0,
		dayLengthHours: 0,
		thresholdHours: 0,
		allowanceDays: 0,
		warnings: []
	};
}

/**
 * effectiveDaysToMaturity written into `out` (a record from blankDtm, possibly filled
 * before): season planning reuses one record per variety instead of making one per
 * succession. A caller that keeps `out.warnings` must take it before the next call.
 */
export function effectiveDaysInto(
	out: EffectiveDtm,
	variety: Variety,
	firstHarvest: DayNumber,
	ctx: DtmContext
): EffectiveDtm {
	const dl = dayLengthAt(ctx.latitude, dayOfYearOfDay(firstHarvest));
	if (out.warnings.length > 0) out.warnings = [];
	const warnings = out.warnings;
	out.days = variety.daysToMaturity;
	out.source = 'variety';
	out.varietyDays = variety.daysToMaturity;
	out.dayLengthHours = dl;
	out.thresholdHours = ctx.shortDayThresholdHours;
	out.allowanceDays = 0;
	if (out.gdd !== undefined) out.gdd = undefined;
	if (ctx.temps && variety.gddToMaturity !== undefined && variety.baseTempF !== undefined) {
		const required = variety.gddToMaturity;
		const baseF = variety.baseTempF;
		let acc = 0;
		let walked = 0;
		let missing: string | undefined;
		// Days in a row, walking back, that add no heat: four weeks of it is winter, and a crop
		// does not grow through winter, so the walk stops there.
		let cold = 0;
		let winter = false;
		// Walk back a week at a time: within a week every day adds the same max(0, mean − base),
		// so the day that meets the requirement is found by division, not by stepping.
		let day = firstHarvest - 1;
		while (walked < ctx.gddWalkLimitDays) {
			const monday = day - weekdayOf(day) + 1;
			const chunk = Math.min(day - monday + 1, ctx.gddWalkLimitDays - walked);
			const mean = ctx.temps(day);
			if (mean === undefined) {
				missing = fromDayNumber(day);
				break;
			}
			const perDay = meanDegreeDays(mean, baseF);
			if (perDay > 0 && acc + perDay * chunk >= required - 1e-9) {
				const k = Math.max(1, ceilSafe((required - acc) / perDay));
				const days = walked + k;
				acc += perDay * k;
				out.days = days;
				out.source = 'gdd';
				out.gdd = { required, accumulated: acc, baseF, days };
				return out;
			}
			acc += perDay * chunk;
			walked += chunk;
			day = monday - 1;
			cold = perDay > 0 ? 0 : cold + chunk;
			if (cold >= 28 && acc > 0) {
				winter = true;
				break;
			}
		}
		if (winter) {
			out.source = 'gdd_cold';
			warnings.push({
				code: 'gdd_not_met',
				message: `Only ${acc.toFixed(0)} of ${required} degree days (base ${baseF} °F) accumulate after the last cold spell before first harvest; it cannot be ready then.`
			});
			return out;
		}
		warnings.push(
			missing
				? {
						code: 'gdd_data_missing',
						message: `No weekly mean temperature for the week of ${missing}; used the calendar days to maturity instead of degree days.`
					}
				: {
						code: 'gdd_not_met',
						message: `Only ${acc.toFixed(0)} of ${required} degree days (base ${baseF} °F) accumulate in the ${ctx.gddWalkLimitDays} days before first harvest; used the calendar days to maturity instead.`
					}
		);
	}
	if (dl < ctx.shortDayThresholdHours) {
		out.days = variety.daysToMaturity + ctx.shortDayAllowanceDays;
		out.source = 'short_day';
		out.allowanceDays = ctx.shortDayAllowanceDays;
	}
	return out;
}
