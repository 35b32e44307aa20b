import { type DayNumber, civilFromDays, daysFromCivil, fromDayNumber, weekdayOf, yearOfDay } from './day-number';
import { varietyLabel } from './variety';
import { requireNonNegativeInteger } from './errors';
import { isoWeekOfDay, weekDateOfDay } from './iso-week';
import type { TempLookup } from './weekly-temps';
import type { PlanningWarning, Variety } from './types';
import { EMERGENCE_LIMIT_DAYS } from './emergence';
import { soilMinimumOf, sowingWindowWarning, tooColdToSow } from './sowing-window';

export interface SeasonFacts {
	/**
	 * The farm's frost dates: climate normals, so only their month and day count. Each planting is
	 * checked against them in its own year (a 2028 planting against 2028's dates).
	 */
	lastSpringFrost: DayNumber;
	firstFallFrost: DayNumber;
	/** Days after the last spring frost that frost-tender crops go out. Default 0. */
	tenderDaysAfterFrost?: number;
	/** The probability the frost dates stand for (e.g. 50: one year in two frosts later in spring / earlier in autumn). */
	frostProbabilityPct?: number;
	temps?: TempLookup;
}

/** The same month and day as `normal` in `year` (29 February → 28 February when `year` has none). */
export function sameMonthDay(year: number, normal: DayNumber): DayNumber {
	const { month, day } = civilFromDays(normal);
	if (month === 2 && day === 29) {
		const feb29 = daysFromCivil(year, 2, 29);
		return civilFromDays(feb29).month === 2 ? feb29 : feb29 - 1;
	}
	return daysFromCivil(year, month, day);
}

/** The farm's days after the last spring frost for tender crops (default 0), checked. */
export function tenderDaysOf(days: number | undefined): number {
	return days === undefined ? 0 : requireNonNegativeInteger('farm.tenderDaysAfterFrost', days);
}

/**
 * A tender crop's first field day in each year: the last spring frost (a normal: its month and day)
 * of that year plus `after` days. Memoised for the year asked last (a plan asks one year over and over).
 */
export function tenderFieldStart(lastSpringFrost: DayNumber, after: number): (year: number) => DayNumber {
	let y = NaN;
	let d = 0;
	return (year) => {
		if (year !== y) {
			y = year;
			d = sameMonthDay(year, lastSpringFrost) + after;
		}
		return d;
	};
}

/**
 * The last day a frost-tender crop with this field date can be picked: the first fall frost after
 * it (common practice, no published source: a frost kills tomatoes, peppers, beans, squash and
 * basil, so their harvest ends with the first fall frost). Infinity for a hardy crop.
 */
export function tenderHarvestEnd(frostTender: boolean | undefined, fieldDay: DayNumber, season: SeasonFacts): number {
	return frostTender ? frostDatesFor(fieldDay, season).firstFall : Infinity;
}

/**
 * The last day the plan counts on picking a crop with this field date: for a frost-tender crop the
 * Sunday before the week of the first fall frost (the frost's own week could give only a day or
 * two, and the frost may come any day of it), or the frost day when it is a Sunday; else Infinity.
 */
export function plannedPickEnd(frostTender: boolean | undefined, fieldDay: DayNumber, season: SeasonFacts): number {
	const end = tenderHarvestEnd(frostTender, fieldDay, season);
	return end === Infinity || weekdayOf(end) === 7 ? end : end - weekdayOf(end);
}

/** The frost dates a planting with this field date is checked against: its year's spring, the first autumn after it. */
export function frostDatesFor(
	fieldDay: DayNumber,
	season: SeasonFacts
): { lastSpring: DayNumber; firstFall: DayNumber } {
	const year = yearOfDay(fieldDay);
	const lastSpring = sameMonthDay(year, season.lastSpringFrost);
	let firstFall = sameMonthDay(year, season.firstFallFrost);
	if (firstFall < fieldDay) firstFall = sameMonthDay(year + 1, season.firstFallFrost);
	return { lastSpring, firstFall };
}

/**
 * The list of a succession with no frost or heat warning: one list, shared, and frozen so
 * that nothing can add to it (a season plan would otherwise make thousands of empty lists).
 */
const NO_WARNINGS: PlanningWarning[] = Object.freeze([]) as unknown as PlanningWarning[];

/** Frost and heat warnings for one succession (DESIGN step 4); an empty result is a shared, frozen list. */
export function successionWarnings(
	variety: Variety,
	fieldDay: DayNumber,
	firstHarvest: DayNumber,
	lastHarvest: DayNumber,
	season: SeasonFacts
): PlanningWarning[] {
	const out: PlanningWarning[] = [];
	const outside = sowingWindowWarning(variety, fieldDay);
	if (outside) out.push(outside);
	const cold = tooColdToSow(variety, fieldDay, season.temps);
	const soil = cold === null ? null : soilMinimumOf(variety);
	if (cold !== null && soil !== null)
		out.push({
			code: 'too_cold_to_sow',
			message:
				soil.source === 'emergence'
					? `Sown on ${weekDateOfDay(fieldDay)}, when the weekly mean (${cold} °F) is under the ${soil.tempF} °F at which its seed comes up within ${EMERGENCE_LIMIT_DAYS} days (emergence table): too cold; sow later.`
					: `${variety.method === 'direct' ? 'Sown' : 'Set out'} on ${weekDateOfDay(fieldDay)}, when the weekly mean (${cold} °F) is below this crop's base temperature of ${variety.baseTempF} °F: too cold for it to come up or take; sow later.`
		});
	if (variety.frostTender) {
		const { lastSpring, firstFall } = frostDatesFor(fieldDay, season);
		const after = season.tenderDaysAfterFrost ?? 0;
		const odds = season.frostProbabilityPct === undefined ? '' : `, ${season.frostProbabilityPct} % normal`;
		const dated = (d: DayNumber) => `${weekDateOfDay(d)} ${yearOfDay(d)}`;
		if (fieldDay < lastSpring + after) {
			out.push({
				code: 'frost_before_last_spring',
				message:
					after > 0
						? `Frost-tender crop goes into the field on ${weekDateOfDay(fieldDay)}, earlier than ${after} days after the last spring frost (${dated(lastSpring)}${odds}): not before ${weekDateOfDay(lastSpring + after)}.`
						: `Frost-tender crop goes into the field on ${weekDateOfDay(fieldDay)}, before the last spring frost (${dated(lastSpring)}${odds}).`
			});
		}
		// A harvest past the frost (dates entered so), or one whose window the frost cut short: the
		// engine ends a tender crop's harvest at the first fall frost (planting-derive, sizing).
		const windowEnd = firstHarvest + (variety.harvestWindowDays ?? 1) - 1;
		if (lastHarvest > firstFall) {
			out.push({
				code: 'frost_after_first_fall',
				message: `Frost-tender crop is still harvesting on ${weekDateOfDay(lastHarvest)}, after the first fall frost (${dated(firstFall)}${odds}).`
			});
		} else if (lastHarvest === firstFall && windowEnd > firstFall && firstHarvest <= firstFall) {
			out.push({
				code: 'frost_after_first_fall',
				message: `Frost-tender crop's harvest ends at the first fall frost (${dated(firstFall)}${odds}): its window would run to ${weekDateOfDay(windowEnd)}, ${windowEnd - firstFall} days more.`
			});
		}
	}
	if (variety.heatLimitF !== undefined && season.temps) {
		// Germination and growth: a bolting crop sown (or set out) into hot weeks bolts or fails to
		// come up before any harvest (common practice, no published source: spinach and lettuce
		// germinate poorly and bolt in hot weather). Weeks from the field date to the day before first harvest.
		const growing: string[] = [];
		for (let monday = fieldDay - weekdayOf(fieldDay) + 1; monday < firstHarvest; monday += 7) {
			const mean = season.temps(monday);
			if (mean !== undefined && mean > variety.heatLimitF) growing.push(isoWeekOfDay(monday));
		}
		if (growing.length > 0) {
			out.push({
				code: 'heat_in_growth',
				message: `${variety.method === 'direct' ? 'Sown' : 'Set out'} into ${growing.join(', ')}, when the weekly mean is above this crop's heat limit of ${variety.heatLimitF} °F: it may not come up well, or bolt before harvest.`,
				weeks: growing
			});
		}
		const hot: string[] = [];
		for (let monday = firstHarvest - weekdayOf(firstHarvest) + 1; monday <= lastHarvest; monday += 7) {
			const mean = season.temps(monday);
			if (mean !== undefined && mean > variety.heatLimitF) hot.push(isoWeekOfDay(monday));
		}
		if (hot.length > 0) {
			out.push({
				code: 'heat_in_harvest',
				message: `Harvest runs through ${hot.join(', ')}, when the weekly mean is above this crop's heat limit of ${variety.heatLimitF} °F (bolting risk).`,
				weeks: hot.slice()
			});
		}
	}
	// An exact-size copy: a list grown by push keeps room for 16 more, and a season plan keeps thousands.
	return out.length === 0 ? NO_WARNINGS : out.slice();
}

/** The `unreachable_week` warning's text: why no succession of `v` can be ready in `weeks`. */
export function unreachableMessage(
	v: Variety,
	earliestField: DayNumber | undefined,
	today: DayNumber | undefined,
	hasTemps: boolean,
	weeks: string[]
): string {
	const window = v.sowFrom !== undefined && v.sowTo !== undefined;
	const before = [
		earliestField !== undefined ? `the earliest field date ${fromDayNumber(earliestField)}` : '',
		today !== undefined ? `today (${fromDayNumber(today)})` : ''
	]
		.filter(Boolean)
		.join(' or ');
	const soil = hasTemps && !window ? soilMinimumOf(v) : null;
	return (
		`No succession of ${varietyLabel(v)} can be ready in ${weeks.join(', ')}: it would have to be sown too early ` +
		`(before ${before ? `${before}, ` : ''}the last spring frost for a tender crop, or before the last cold spell for a degree-day crop)` +
		(window ? `, or outside the crop's field dates (${v.sowFrom} to ${v.sowTo})` : '') +
		(soil === null
			? ''
			: soil.source === 'base'
				? `, or into weeks colder than its base temperature (${soil.tempF} °F)`
				: `, or into weeks under the ${soil.tempF} °F its seed needs to come up within ${EMERGENCE_LIMIT_DAYS} days`) +
		'.' +
		(v.frostTender ? ' A frost-tender crop is not planned to pick in or after the week of the first fall frost.' : '')
	);
}
