// Everything the season workbook shows, read in one go (independent queries run together).
// Scoped by farm: a season of another farm is never read.
import type { TargetInput } from '$lib/planning';
import type { UnitSystem } from '$lib/format';
import { db } from '../db';
import * as farms from '../farms';
import * as beds from '../beds';
import { listVarieties, type CropView, type VarietyView } from '../crops';
import { targetInput } from '../demand';
import type { Season } from '../seasons';
import { listForSeason, listHarvestingFromOtherSeasons, type PlantingView } from '../plantings';

/** A planting as the workbook shows it: the plantings repository's view (plantings.ts). */
export type ExportPlanting = PlantingView;

/** A crop as the workbook shows it; a store's weekly loss reads 0 where the library has none. */
export type CropRow = Pick<
	CropView,
	| 'id'
	| 'name'
	| 'family'
	| 'harvestUnit'
	| 'frostTolerance'
	| 'heatLimitF'
	| 'baseTempF'
	| 'storageWeeks'
	| 'sowFrom'
	| 'sowTo'
> & { storageLossPerWeek: number };

export interface ExportBed {
	block: string;
	blockPosition: number;
	name: string;
	position: number;
	lengthFt: number;
	widthIn: number;
}

export interface SeasonData {
	farmName: string;
	farmTimeZone: string;
	/** The farm's units: the rows are in the database's, the file converts them (units.ts). */
	unitSystem: UnitSystem;
	/** ISO 4217: money columns are headed and formatted in it. */
	currency: string;
	season: Season;
	plantings: ExportPlanting[];
	/** Other seasons' plantings harvesting in this season's dates: on Weekly tasks (harvest) and Forecast only. */
	otherHarvests: PlantingView[];
	crops: CropRow[];
	varieties: VarietyView[];
	beds: ExportBed[];
	demand: TargetInput;
}

const num = (v: unknown): number => Number(v);
const numOrNull = (v: unknown): number | null => (v === null || v === undefined ? null : Number(v));

async function listCrops(farmId: number): Promise<CropRow[]> {
	const rows = await db()('crops').where({ farm_id: farmId }).orderBy('name').select('*');
	return rows.map((r) => ({
		id: r.id,
		name: r.name,
		family: r.family,
		harvestUnit: r.harvest_unit,
		frostTolerance: r.frost_tolerance,
		heatLimitF: numOrNull(r.heat_limit_f),
		baseTempF: num(r.base_temp_f),
		storageWeeks: numOrNull(r.storage_weeks),
		storageLossPerWeek: num(r.storage_loss_per_week ?? 0),
		sowFrom: r.sow_from ?? null,
		sowTo: r.sow_to ?? null
	}));
}

export async function loadSeasonData(farmId: number, season: Season): Promise<SeasonData> {
	const [farm, plantings, otherHarvests, crops, varieties, bedList, blocks, demand] = await Promise.all([
		farms.get(farmId),
		listForSeason(farmId, season.id),
		listHarvestingFromOtherSeasons(farmId, season),
		listCrops(farmId),
		listVarieties(farmId),
		beds.list(farmId),
		beds.listBlocks(farmId),
		targetInput(farmId, season.id)
	]);
	const blockPosition = new Map(blocks.map((b) => [b.id, b.position]));
	return {
		farmName: farm.name,
		farmTimeZone: farm.timeZone,
		unitSystem: farm.unitSystem === 'metric' ? 'metric' : 'imperial',
		currency: farm.currency ?? 'USD',
		season,
		plantings,
		otherHarvests,
		crops,
		varieties,
		beds: bedList.map((b) => ({
			block: b.blockName,
			blockPosition: blockPosition.get(b.blockId) ?? 0,
			name: b.name,
			position: b.position,
			lengthFt: b.lengthFt,
			widthIn: b.widthIn
		})),
		demand
	};
}
