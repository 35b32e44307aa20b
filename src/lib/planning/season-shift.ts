/**
 * Next season from this one: dates and weeks moved to the same ISO week and weekday a year
 * on. ISO years have 52 or 53 weeks, so a week-53 date or week lands in week 52 of the next
 * year (2026-W53-3 → 2027-W52-3): the season keeps its rhythm rather than spilling into the
 * year after. A planting moves by its field date; its other dates keep their distance from it,
 * so days in tray, to maturity and in harvest stay what they were.
 */
import { civilFromDays, daysFromCivil, fromDayNumber, toDayNumber, weekdayOf } from './day-number';
import { isoWeekPartsOfDay, parseIsoWeek, weekStartDay, weeksInIsoYear, yearKey } from './iso-week';
import { successionWarnings } from './plan-warnings';
import { makeTempLookup, type WeeklyMeanTempF } from './weekly-temps';
import type { PlanningWarning, Variety } from './types';

function pad2(n: number): string {
	return n < 10 ? `0${n}` : String(n);
}

/** The same ISO weekday of the same ISO week one ISO year on (week 53 → week 52). */
export function nextYearDate(date: string): string {
	const n = toDayNumber(date);
	const { year, week } = isoWeekPartsOfDay(n);
	const weekday = weekdayOf(n) - 1; // Monday = 0
	const w = Math.min(week, weeksInIsoYear(year + 1));
	return fromDayNumber(weekStartDay(`${yearKey(year + 1)}-W${pad2(w)}`) + weekday);
}

/** The same ISO week one year on ('2026-W53' → '2027-W52'). */
export function nextYearWeek(week: string): string {
	const { year, week: w } = parseIsoWeek(week);
	return `${yearKey(year + 1)}-W${pad2(Math.min(w, weeksInIsoYear(year + 1)))}`;
}

export interface PlantingDates {
	traySowDate: string | null;
	fieldDate: string;
	firstHarvest: string;
	lastHarvest: string;
}

/** A planting's dates a season on: the field date by nextYearDate, the rest at the same distance. */
export function shiftPlantingDates(d: PlantingDates): PlantingDates & { shiftDays: number } {
	const field = nextYearDate(d.fieldDate);
	const shift = toDayNumber(field) - toDayNumber(d.fieldDate);
	const move = (x: string): string => fromDayNumber(toDayNumber(x) + shift);
	return {
		traySowDate: d.traySowDate ? move(d.traySowDate) : null,
		fieldDate: field,
		firstHarvest: move(d.firstHarvest),
		lastHarvest: move(d.lastHarvest),
		shiftDays: shift
	};
}

/** A frost date (month and day) in another calendar year; 29 February becomes 28 February. */
export function sameDayIn(year: number, date: string): string {
	const { month, day } = civilFromDays(toDayNumber(date));
	const d = month === 2 && day === 29 && fromDayNumber(daysFromCivil(year, 2, 29)).slice(5) !== '02-29' ? 28 : day;
	return fromDayNumber(daysFromCivil(year, month, d));
}

export interface CheckFarm {
	lastSpringFrost: string;
	firstFallFrost: string;
	tenderDaysAfterFrost?: number;
	frostProbabilityPct?: number;
	weeklyMeanTempF?: WeeklyMeanTempF;
}

/**
 * Frost and heat checks of a planting on its own dates, with the farm's frost dates taken in
 * the calendar year of the field date (the farm keeps one pair of dates, not one per season).
 */
export function frostHeatChecks(
	variety: Pick<Variety, 'frostTender' | 'heatLimitF'>,
	d: PlantingDates,
	farm: CheckFarm
): PlanningWarning[] {
	const year = civilFromDays(toDayNumber(d.fieldDate)).year;
	const temps =
		farm.weeklyMeanTempF && Object.keys(farm.weeklyMeanTempF).length ? makeTempLookup(farm.weeklyMeanTempF) : undefined;
	return successionWarnings(
		variety as Variety,
		toDayNumber(d.fieldDate),
		toDayNumber(d.firstHarvest),
		toDayNumber(d.lastHarvest),
		{
			lastSpringFrost: toDayNumber(sameDayIn(year, farm.lastSpringFrost)),
			firstFallFrost: toDayNumber(sameDayIn(year, farm.firstFallFrost)),
			tenderDaysAfterFrost: farm.tenderDaysAfterFrost,
			frostProbabilityPct: farm.frostProbabilityPct,
			temps
		}
	);
}

export interface CheckChange {
	/** Warning codes the planting has on its new dates and did not have before. */
	added: PlanningWarning[];
	/** Codes it had before and no longer has. */
	cleared: PlanningWarning[];
}

/** What changed between a planting's checks on its old dates and on its new ones. */
export function compareChecks(before: PlanningWarning[], after: PlanningWarning[]): CheckChange {
	const had = new Set(before.map((w) => w.code));
	const has = new Set(after.map((w) => w.code));
	return { added: after.filter((w) => !had.has(w.code)), cleared: before.filter((w) => !has.has(w.code)) };
}
