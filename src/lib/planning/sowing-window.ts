/**
 * A crop's sowing window: the earliest and latest field date in the year (month-day, "MM-DD"),
 * entered by the grower in the crop library. A window may run over the new year ("10-01" to "03-15"). A field date
 * outside it gets a warning in the grid, and the planner never proposes one.
 */
import { PlanningInputError } from './errors';
import { type DayNumber, civilFromDays, daysFromCivil, fromDayNumber } from './day-number';
import { emergenceTableOf, soilForEmergence } from './emergence';
import type { TempLookup } from './weekly-temps';
import type { PlanningWarning, Variety } from './types';

const MONTH_DAY = /^(\d{2})-(\d{2})$/;
const DAYS_IN_MONTH = [31, 29, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** "MM-DD" → month × 100 + day; throws PlanningInputError naming `field` when it is no day of the year. */
export function monthDayValue(md: string, field: string): number {
	const m = typeof md === 'string' ? MONTH_DAY.exec(md) : null;
	const month = m ? Number(m[1]) : 0;
	const day = m ? Number(m[2]) : 0;
	if (!m || month < 1 || month > 12 || day < 1 || day > DAYS_IN_MONTH[month - 1])
		throw new PlanningInputError(field, `must be a day of the year as MM-DD (got ${String(md)})`);
	return month * 100 + day;
}

/** Whether a day falls in the window from `from` to `to` (month × 100 + day, both inclusive; may wrap the year). */
export function inMonthDayWindow(day: DayNumber, from: number, to: number): boolean {
	const { month, day: d } = civilFromDays(day);
	const md = month * 100 + d;
	return from <= to ? md >= from && md <= to : md >= from || md <= to;
}

/** The variety's window as numbers, or null when it has none (both ends are needed). */
export function sowingWindowOf(v: Variety): { from: number; to: number } | null {
	if (v.sowFrom === undefined || v.sowTo === undefined) return null;
	return { from: monthDayValue(v.sowFrom, 'variety.sowFrom'), to: monthDayValue(v.sowTo, 'variety.sowTo') };
}

/**
 * The coldest weekly mean a crop without a grower's window may be sown or set out into, and where
 * it comes from. A direct-sown crop with a published emergence table (emergence.ts: carrot, beet,
 * spinach, parsnip) waits for soil that brings its seed up within EMERGENCE_LIMIT_DAYS; any other
 * crop for its base temperature: under it a seed barely comes up — Knott's Handbook (after
 * Harrington & Minges 1954): parsnip 172 days to emerge at 32 °F, 57 at 41 °F; carrot 51 at 41 °F.
 * The weekly mean air temperature stands for the soil's (common practice, from memory: shallow soil
 * follows the air within a few degrees). Null: no rule (a window decides, or nothing is known).
 */
export function soilMinimumOf(v: Variety): { tempF: number; source: 'emergence' | 'base' } | null {
	if (v.sowFrom !== undefined && v.sowTo !== undefined) return null;
	let out = soilMinimum.get(v);
	if (out !== undefined) return out;
	const table = v.method === 'direct' ? emergenceTableOf(v.crop) : undefined;
	const fromTable = table ? soilForEmergence(table) : null;
	out =
		fromTable !== null
			? { tempF: Math.round(fromTable * 10) / 10, source: 'emergence' }
			: v.baseTempF === undefined
				? null
				: { tempF: v.baseTempF, source: 'base' };
	soilMinimum.set(v, out);
	return out;
}
const soilMinimum = new WeakMap<Variety, { tempF: number; source: 'emergence' | 'base' } | null>();

/** Whether the field date's week is too cold for the crop (see soilMinimumOf): its weekly mean, or null. */
export function tooColdToSow(v: Variety, fieldDay: DayNumber, temps: TempLookup | undefined): number | null {
	if (!temps) return null;
	const min = soilMinimumOf(v);
	if (min === null) return null;
	const mean = temps(fieldDay);
	return mean !== undefined && mean < min.tempF ? mean : null;
}

/**
 * A crop's default earliest field date in `year` where the grower gave none: the first day whose
 * week is warm enough by soilMinimumOf (null when no day of the year is, or there is no rule or
 * no temperatures).
 */
export function defaultEarliestFieldDate(v: Variety, temps: TempLookup | undefined, year: number): string | null {
	if (!temps || soilMinimumOf(v) === null) return null;
	const first = daysFromCivil(year, 1, 1);
	const last = daysFromCivil(year, 12, 31);
	for (let d = first; d <= last; d++)
		if (temps(d) !== undefined && tooColdToSow(v, d, temps) === null) return fromDayNumber(d);
	return null;
}

/** The warning for a field date outside the crop's window, if it is. */
export function sowingWindowWarning(v: Variety, fieldDay: DayNumber): PlanningWarning | null {
	const w = sowingWindowOf(v);
	if (!w || inMonthDayWindow(fieldDay, w.from, w.to)) return null;
	const what = v.method === 'direct' ? 'Sown' : 'Set out';
	return {
		code: 'outside_sowing_window',
		message: `${what} on ${fromDayNumber(fieldDay)}, outside this crop's field dates (${v.sowFrom} to ${v.sowTo}): too early or too late in the year for it.`
	};
}
