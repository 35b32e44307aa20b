// The plain data a season plan takes and gives (see season.ts).
import type { Bed, BedPlanting } from './bed-types';
import type { HarvestCurve } from './harvest-curve';
import type { SeedNeed } from './seed';
import type { Farm, PlanOptions } from './successions';
import type { CropWeekQuantity, PlanningWarning, SowingMethod, Variety } from './types';

export interface SeasonVariety extends Variety {
	id: string;
	cropId: string;
}

/** A share of a crop's targets given to one variety: weeks of the year from..to, a fraction of each. */
export interface VarietyShare {
	varietyId: string;
	fromWeek?: number;
	toWeek?: number;
	fraction?: number;
}

/** A planting the plan keeps as it is (sown, growing, or planned elsewhere): it supplies and occupies. */
export interface KeptPlanting {
	key: string;
	cropId: string;
	family?: string;
	bedId: string | null;
	startFt: number;
	lengthFt: number;
	fieldDate: string;
	firstHarvest: string;
	lastHarvest: string;
	yieldPerBedFoot: number;
	/** How its yield spreads over its window (default flat). */
	curve?: HarvestCurve;
	/** The variety's full window, when this planting's harvest is cut short of it. */
	windowDays?: number;
}

export interface SeasonPlanInput {
	farm: Farm;
	varieties: SeasonVariety[];
	beds: Bed[];
	/** Weekly targets, `crop` being the crop id. */
	targets: CropWeekQuantity[];
	kept?: KeptPlanting[];
	/**
	 * Plantings outside this plan that hold bed-feet during it (another season's garlic, dug
	 * next summer): placement works around them; they supply nothing to this plan's targets.
	 */
	obstacles?: BedPlanting[];
	/** Which varieties carry each crop's targets (by crop id); default: the crop's first variety. */
	varietyPlan?: Record<string, VarietyShare[]>;
	previousFamilyByBed?: Record<string, string[]>;
	options?: PlanOptions & { turnaroundDays?: number };
}

export interface ProposedPlanting {
	key: string;
	cropId: string;
	varietyId: string;
	bedId: string | null;
	startFt: number;
	lengthFt: number;
	rows: number;
	inRowSpacingIn: number;
	seedsPerSpot: number;
	method: SowingMethod;
	traySowDate: string | null;
	fieldDate: string;
	firstHarvest: string;
	lastHarvest: string;
	/** Harvest units over the whole window for this range (up to lastHarvest, when cut short). */
	expectedYield: number;
	/** The variety's full harvest window, days: the yield and curve are given over it. */
	harvestWindowDays: number;
	/** How the yield spreads over the window (absent: flat). */
	curve?: HarvestCurve;
	seed: SeedNeed;
	warnings: PlanningWarning[];
	/** Why it has no bed, when it has none. */
	unplacedReason: string | null;
}

export interface SeasonPlan {
	plantings: ProposedPlanting[];
	/** Target left unmet per crop id and week after planning. */
	shortfall: CropWeekQuantity[];
	warnings: (PlanningWarning & { key?: string; cropId?: string })[];
}
