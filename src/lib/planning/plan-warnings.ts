import { type DayNumber, weekdayOf } from './day-number';
import { isoWeekOfDay, weekDateOfDay } from './iso-week';
import type { TempLookup } from './weekly-temps';
import type { PlanningWarning, Variety } from './types';
import { sowingWindowWarning } from './sowing-window';

export interface SeasonFacts {
	lastSpringFrost: DayNumber;
	firstFallFrost: DayNumber;
	temps?: TempLookup;
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
	if (variety.frostTender && fieldDay < season.lastSpringFrost) {
		out.push({
			code: 'frost_before_last_spring',
			message: `Frost-tender crop goes into the field on ${weekDateOfDay(fieldDay)}, before the last spring frost (${weekDateOfDay(season.lastSpringFrost)}).`
		});
	}
	if (variety.frostTender && lastHarvest > season.firstFallFrost) {
		out.push({
			code: 'frost_after_first_fall',
			message: `Frost-tender crop is still harvesting on ${weekDateOfDay(lastHarvest)}, after the first fall frost (${weekDateOfDay(season.firstFallFrost)}).`
		});
	}
	if (variety.heatLimitF !== undefined && season.temps) {
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
