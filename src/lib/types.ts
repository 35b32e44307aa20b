// Shapes shared by the server and the browser (no server code here).
import type { GrowingFigures } from '$lib/planning';
import type { CropInput } from '$lib/schemas/crop';
import type { PlantingValues } from '$lib/plantings/fields';

/** A planting with its variety, crop and bed joined in, as pages and the API show it. */
export interface PlantingView extends PlantingValues {
	id: number;
	seasonId: number;
	variety: string;
	crop: string;
	family: string;
	harvestUnit: string;
	bed: string | null;
	block: string | null;
	blockPosition: number | null;
	bedPosition: number | null;
	/** Worked out by the engine on every save (plantings/derive.ts). */
	traySowDate: string | null;
	firstHarvest: string;
	lastHarvest: string;
	expectedYield: number;
	seedsNeeded: number;
	version: number;
	/** Who saved the current version, and when (ISO timestamp). */
	updatedBy?: string | null;
	updatedAt?: string | null;
}

export interface Block {
	id: number;
	name: string;
	position: number;
}

export interface Bed {
	id: number;
	blockId: number;
	blockName: string;
	name: string;
	lengthFt: number;
	widthIn: number;
	position: number;
}

/** A crop of the farm's library with its varieties, as the library pages and forms read it. */
export interface CropView {
	id: number;
	name: string;
	family: string;
	harvestUnit: CropInput['harvestUnit'];
	frostTolerance: CropInput['frostTolerance'];
	heatLimitF: number | null;
	baseTempF: number;
	harvestCurve: CropInput['harvestCurve'];
	cutIntervalDays: number | null;
	storageWeeks: number | null;
	/** Earliest and latest field date in the year, MM-DD, or null. */
	sowFrom: string | null;
	sowTo: string | null;
	/** Fraction lost each week in store, or null. */
	storageLossPct: number | null;
	/** Dollars per harvest unit, or null when unknown. */
	price: number | null;
	source: string | null;
	archived: boolean;
	varieties: VarietyView[];
}

/** A variety with its crop's figures joined in, as the crop library, grid and planner read it. */
export interface VarietyView extends GrowingFigures {
	id: number;
	cropId: number;
	crop: string;
	family: string;
	harvestUnit: string;
	frostTolerance: 'tender' | 'hardy';
	heatLimitF: number | null;
	baseTempF: number;
	name: string;
	daysInTray: number;
	seedPriceCentsPerGram: number;
	seedsPerPacket: number | null;
	cellsPerTray: number;
	margin: number;
	gddToMaturity: number | null;
	/** Archived varieties (or varieties of an archived crop) stay for history but are left out of new plans. */
	archived?: boolean;
	/** Where the variety's figures come from (handbook, extension guide, own records). */
	source?: string | null;
	/** The variety's own curve (null: the crop's), as the library form edits it. */
	ownHarvestCurve?: string | null;
	/** How the yield spreads over the harvest window: the variety's, else the crop's (default flat). */
	harvestCurve?: 'flat' | 'ramp' | 'single' | 'cuts';
	/** Days between cuts, for a curve of several cuts (null: the engine's default). */
	cutIntervalDays?: number | null;
	/** The crop's earliest and latest field date in the year, "MM-DD" (both or neither). */
	sowFrom?: string | null;
	sowTo?: string | null;
	/** A storage crop's weeks in store (null or 0: sold fresh) and share lost a week, from its crop. */
	storageWeeks?: number | null;
	storageLossPerWeek?: number | null;
}
