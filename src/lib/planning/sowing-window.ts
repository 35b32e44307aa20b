/**
 * A crop's sowing window: the earliest and latest field date in the year (month-day, "MM-DD"),
 * entered by the grower in the crop library. A window may run over the new year ("10-01" to "03-15"). A field date
 * outside it gets a warning in the grid, and the planner never proposes one.
 */
import { PlanningInputError } from './errors';
import { type DayNumber, civilFromDays, fromDayNumber } from './day-number';
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
 * Whether the field date's week is too cold for the crop: its weekly mean below the crop's base
 * temperature. Only for a crop without a grower's window (the window, when given, decides: garlic
 * goes in as the ground cools). The weekly mean air temperature stands for the soil's (common
 * practice, from memory: shallow soil follows the air within a few degrees); under the base a seed
 * barely comes up — Knott's Handbook (after Harrington & Minges 1954): parsnip 172 days to emerge at
 * 32 °F, 57 at 41 °F; carrot 51 at 41 °F.
 */
export function tooColdToSow(v: Variety, fieldDay: DayNumber, temps: TempLookup | undefined): number | null {
	if (!temps || v.baseTempF === undefined || (v.sowFrom !== undefined && v.sowTo !== undefined)) return null;
	const mean = temps(fieldDay);
	return mean !== undefined && mean < v.baseTempF ? mean : null;
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
