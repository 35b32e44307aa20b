// The one planned supply: what a planting is expected to harvest, week by week, worked out in one
// place on the engine's forecast. The Forecast page and share boxes, the crew sheets' expected
// harvest, the workbook's Weekly tasks and Forecast sheets and actual against plan all read it,
// so one workbook, screen or sheet never shows another figure for the same crop and week.
//
// The rule: a planting's expected figures follow its variety — bed-feet × the variety's current
// yield per bed-foot, spread by the variety's harvest curve over its full harvest window, picked
// from the planting's first to last harvest date (a harvest cut short of the window yields the
// curve's share up to then). The stored expected yield is a record of that figure, not a second
// source. Taking a variety's observed yield therefore moves every planting of it at once.
// Pure (no database): the server's readers pass rows in.
import {
	type ForecastPlanting,
	type ForecastRow,
	type CropWeekQuantity,
	type HarvestCurve,
	deriveTargets,
	forecast
} from '$lib/planning';
import { forecastFromWeeklySupply } from '$lib/planning/forecast';
import { type CropStore, throughStores } from '$lib/planning/storage';
import { type CropCover, cropCover } from '$lib/planning/cover';
import type { TargetInput } from '$lib/planning';
import type { VarietyView } from '$lib/types';
import { toEngineVariety } from '$lib/engine-inputs';

export interface PlannedPlanting {
	key?: string;
	crop: string;
	firstHarvest: string;
	lastHarvest: string;
	lengthFt: number;
	/** The variety's current figures. */
	yieldPerBedFoot: number;
	harvestWindowDays: number;
	curve?: HarvestCurve;
}

/**
 * A planting under the rule: its own dates and bed-feet, its variety's current yield, window and
 * curve (null without its variety, or with no harvest days).
 */
export function plannedOf(
	p: { firstHarvest: string; lastHarvest: string; lengthFt: number },
	v: VarietyView | undefined
): PlannedPlanting | null {
	if (!v || p.lastHarvest < p.firstHarvest) return null;
	return {
		crop: String(v.cropId),
		firstHarvest: p.firstHarvest,
		lastHarvest: p.lastHarvest,
		lengthFt: p.lengthFt,
		yieldPerBedFoot: v.yieldPerBedFoot,
		harvestWindowDays: v.harvestWindowDays,
		curve: toEngineVariety(v).harvestCurve
	};
}

/** The planting as the engine's forecast takes it, under the rule above. */
export function plannedHarvest(p: PlannedPlanting): ForecastPlanting {
	return {
		key: p.key,
		crop: p.crop,
		firstHarvest: p.firstHarvest,
		lastHarvest: p.lastHarvest,
		bedFeet: p.lengthFt,
		yieldPerBedFoot: p.yieldPerBedFoot,
		curve: p.curve,
		windowDays: p.harvestWindowDays
	};
}

/** One planting's expected harvest per ISO week (weeks with none left out). */
export function plannedByWeek(p: PlannedPlanting): { week: string; quantity: number }[] {
	if (p.lastHarvest < p.firstHarvest) return [];
	return forecast([plannedHarvest(p)], [])
		.filter((r) => r.supply > 0)
		.map((r) => ({ week: r.week, quantity: r.supply }));
}

/**
 * A season's planned supply per crop and week against its targets: every planting passed in
 * (the caller passes every planting harvesting in the season's dates, whatever its season),
 * storage crops through their store.
 */
export function plannedSupply(
	plantings: PlannedPlanting[],
	demand: TargetInput | CropWeekQuantity[],
	stores: CropStore[] = []
): ForecastRow[] {
	const targets = Array.isArray(demand) ? demand : deriveTargets(demand);
	const field = forecast(plantings.filter((p) => p.lastHarvest >= p.firstHarvest).map(plannedHarvest), targets);
	if (!stores.some((s) => s.keepWeeks > 0)) return field;
	const harvested = field.filter((r) => r.supply > 0).map((r) => ({ crop: r.crop, week: r.week, quantity: r.supply }));
	return forecastFromWeeklySupply(throughStores(harvested, targets, stores), targets);
}

/**
 * Who covers each crop-week under the same rule (planning/cover.ts): the targets and each
 * planting's share, storage crops through their store. The shares of a week add up to
 * plannedSupply's supply for it.
 */
export function plannedCover(
	plantings: (PlannedPlanting & { key: string })[],
	targets: CropWeekQuantity[],
	stores: CropStore[] = []
): CropCover[] {
	const live = plantings.filter((p) => p.lastHarvest >= p.firstHarvest);
	return cropCover(
		live.map((p) => ({ ...plannedHarvest(p), key: p.key })),
		targets,
		stores
	);
}
