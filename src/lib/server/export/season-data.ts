// Everything the season workbook shows, read in one go (independent queries run together).
// Scoped by farm: a season of another farm is never read.
import type { TargetInput } from '$lib/planning';
import type { UnitSystem } from '$lib/format';
import { db } from '../db';
import * as farms from '../farms';
import * as beds from '../beds';
import { listVarieties, type VarietyView } from '../crops';
import { targetInput } from '../demand';
import type { Season } from '../seasons';
import { listHarvestingFromOtherSeasons, type PlantingView } from '../plantings';

export interface ExportPlanting {
	id: number;
	varietyId: number;
	cropId: number;
	crop: string;
	variety: string;
	harvestUnit: string;
	bed: string | null;
	block: string | null;
	blockPosition: number | null;
	bedPosition: number | null;
	startFt: number;
	lengthFt: number;
	rows: number;
	inRowSpacingIn: number;
	seedsPerSpot: number;
	method: 'direct' | 'transplant';
	traySowDate: string | null;
	fieldDate: string;
	firstHarvest: string;
	lastHarvest: string;
	expectedYield: number;
	seedsNeeded: number;
	status: string;
	actualTraySowDate: string | null;
	actualFieldDate: string | null;
	actualFirstHarvest: string | null;
	actualLastHarvest: string | null;
	notes: string | null;
}

export interface CropRow {
	id: number;
	name: string;
	family: string;
	harvestUnit: string;
	frostTolerance: string;
	heatLimitF: number | null;
	baseTempF: number;
	/** Storage crops: weeks a harvest keeps (null: sold fresh) and the share lost each week. */
	storageWeeks: number | null;
	storageLossPerWeek: number;
	/** Field dates, month-day (MM-DD), both or neither. */
	sowFrom: string | null;
	sowTo: string | null;
}

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

async function listPlantings(farmId: number, seasonId: number): Promise<ExportPlanting[]> {
	const rows = await db()('plantings as p')
		.join('varieties as v', 'v.id', 'p.variety_id')
		.join('crops as c', 'c.id', 'v.crop_id')
		.leftJoin('beds as b', 'b.id', 'p.bed_id')
		.leftJoin('blocks as k', 'k.id', 'b.block_id')
		.where({ 'p.farm_id': farmId, 'p.season_id': seasonId })
		.orderBy([{ column: 'p.field_date' }, { column: 'p.id' }])
		.select(
			'p.*',
			'v.name as variety',
			'v.crop_id',
			'c.name as crop',
			'c.harvest_unit',
			'b.name as bed',
			'k.name as block',
			'k.position as block_position',
			'b.position as bed_position'
		);
	return rows.map((r) => ({
		id: r.id,
		varietyId: r.variety_id,
		cropId: r.crop_id,
		crop: r.crop,
		variety: r.variety,
		harvestUnit: r.harvest_unit,
		bed: r.bed ?? null,
		block: r.block ?? null,
		blockPosition: numOrNull(r.block_position),
		bedPosition: numOrNull(r.bed_position),
		startFt: num(r.start_ft),
		lengthFt: num(r.length_ft),
		rows: r.rows,
		inRowSpacingIn: num(r.in_row_spacing_in),
		seedsPerSpot: r.seeds_per_spot,
		method: r.method,
		traySowDate: r.tray_sow_date,
		fieldDate: r.field_date,
		firstHarvest: r.first_harvest,
		lastHarvest: r.last_harvest,
		expectedYield: num(r.expected_yield),
		seedsNeeded: r.seeds_needed,
		status: r.status,
		actualTraySowDate: r.actual_tray_sow_date,
		actualFieldDate: r.actual_field_date,
		actualFirstHarvest: r.actual_first_harvest,
		actualLastHarvest: r.actual_last_harvest,
		notes: r.notes
	}));
}

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
		listPlantings(farmId, season.id),
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
