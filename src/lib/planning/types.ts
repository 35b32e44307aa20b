/**
 * Plain-data shapes shared by the engine. Dates are `YYYY-MM-DD` calendar
 * dates, weeks are ISO 8601 `YYYY-Www`; lengths in feet (bed-feet) and inches
 * (spacing), temperatures in °F, seed in grams, money in cents. Quantities are
 * in the crop's harvest unit (lb, bunch, head, each) — the engine never mixes
 * units: targets and yields for one crop must use the same unit.
 */
import type { HarvestCurve } from './harvest-curve';

export type SowingMethod = 'direct' | 'transplant';

/** A variety's figures for growing and sowing it, as the crop library keeps them and the engine reads them. */
export interface GrowingFigures {
	method: SowingMethod;
	/** Days from the field date (sowing for direct, transplanting for transplants) to first harvest. */
	daysToMaturity: number;
	harvestWindowDays: number;
	/** Harvest units per bed-foot over the whole harvest window. */
	yieldPerBedFoot: number;
	rows: number;
	inRowSpacingIn: number;
	seedsPerSpot: number;
	/** Germination as a fraction in (0, 1]. */
	germinationRate: number;
	seedsPerGram: number;
}

export interface Variety extends GrowingFigures {
	id?: string;
	name?: string;
	crop?: string;
	cropId?: string;
	/** Botanical family, for rotation (e.g. "Apiaceae"). */
	family?: string;
	/** Days from tray sowing to transplanting; required for transplants. */
	daysInTray?: number;
	/** Required for transplants. */
	cellsPerTray?: number;
	frostTender: boolean;
	/** Mean weekly °F above which the crop bolts or spoils in harvest. */
	heatLimitF?: number;
	baseTempF?: number;
	/** Growing degree days (°F·day, base baseTempF) from field date to first harvest. */
	gddToMaturity?: number;
	seedPriceCentsPerGram?: number;
	seedsPerPacket?: number;
	/** Extra seed margin (fraction) for this variety; falls back to options.seedMargin. */
	margin?: number;
	/**
	 * The crop's earliest and latest field date in the year, "MM-DD" (both or neither; the window
	 * may run over the new year). Outside it the grid warns and the planner proposes nothing.
	 */
	sowFrom?: string;
	sowTo?: string;
	/** How the yield spreads over the harvest window; default flat. */
	harvestCurve?: HarvestCurve;
	/**
	 * A storage crop (garlic, storage onions, winter squash): harvested once and sold from store
	 * for up to keepWeeks weeks, losing lossPerWeek (a fraction) of what is left each week. The
	 * planner sizes one harvest to feed the demand weeks that follow it (storage-sizing.ts).
	 */
	storage?: { keepWeeks: number; lossPerWeek: number };
}

export type WarningCode =
	| 'frost_before_last_spring'
	| 'frost_after_first_fall'
	| 'heat_in_harvest'
	| 'unreachable_week'
	| 'interval_shortened'
	| 'gdd_not_met'
	| 'gdd_data_missing'
	| 'supply_short'
	| 'past_bed_end'
	| 'overlap'
	| 'unknown_bed'
	| 'not_placed'
	| 'no_variety'
	| 'rotation_conflict'
	| 'split_across_beds'
	| 'outside_sowing_window'
	| 'too_cold_to_sow'
	| 'heat_in_growth';

export interface PlanningWarning {
	code: WarningCode;
	message: string;
	/** ISO weeks the warning is about, when it is about weeks. */
	weeks?: string[];
}

/** One line of "how was this figure reached", shown on hover. */
export interface ExplainStep {
	label: string;
	value: number | string;
	unit?: string;
	formula?: string;
}

export interface WeeklyTarget {
	week: string;
	quantity: number;
}

export interface CropWeekQuantity {
	crop: string;
	week: string;
	quantity: number;
}
