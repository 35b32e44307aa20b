// The farm's varieties as the crop library, the grid, the planner and the files read them: each
// with its crop's figures joined in (VarietyView), and the harvest curve a stored row names.
import type { Knex } from 'knex';
import { db } from './db';
import type { VarietyView } from '$lib/types';
import type { HarvestCurve } from '$lib/planning';

export async function listVarieties(farmId: number, conn: Knex = db()): Promise<VarietyView[]> {
	const rows = await conn('varieties as v')
		.join('crops as c', 'c.id', 'v.crop_id')
		.where('v.farm_id', farmId)
		.orderBy([{ column: 'c.name' }, { column: 'v.name' }])
		.select(
			'v.*',
			'c.name as crop',
			'c.family',
			'c.harvest_unit',
			'c.frost_tolerance',
			'c.heat_limit_f',
			'c.base_temp_f',
			'c.harvest_curve as crop_harvest_curve',
			'c.harvest_cut_interval_days',
			'c.sow_from',
			'c.sow_to',
			'c.storage_weeks',
			'c.storage_loss_per_week',
			'c.archived_at as crop_archived_at'
		);
	return rows.map((r) => ({
		id: r.id,
		cropId: r.crop_id,
		crop: r.crop,
		family: r.family,
		harvestUnit: r.harvest_unit,
		frostTolerance: r.frost_tolerance,
		heatLimitF: r.heat_limit_f === null ? null : Number(r.heat_limit_f),
		baseTempF: Number(r.base_temp_f),
		name: r.name,
		method: r.method,
		daysToMaturity: r.days_to_maturity,
		daysInTray: r.days_in_tray,
		harvestWindowDays: r.harvest_window_days,
		yieldPerBedFoot: Number(r.yield_per_bed_foot),
		rows: r.rows_per_bed,
		inRowSpacingIn: Number(r.in_row_spacing_in),
		seedsPerSpot: r.seeds_per_spot,
		germinationRate: Number(r.germination_rate),
		seedsPerGram: Number(r.seeds_per_gram),
		seedPriceCentsPerGram: r.seed_price_cents_per_gram,
		seedsPerPacket: r.seeds_per_packet,
		cellsPerTray: r.cells_per_tray,
		margin: Number(r.margin),
		gddToMaturity: r.gdd_to_maturity,
		// A variety of an archived crop is archived with it.
		archived: r.archived_at !== null || r.crop_archived_at !== null,
		source: r.source ?? null,
		ownHarvestCurve: r.harvest_curve ?? null,
		harvestCurve: shapeOf(r.harvest_curve ?? r.crop_harvest_curve),
		cutIntervalDays: r.harvest_cut_interval_days === null ? null : Number(r.harvest_cut_interval_days),
		sowFrom: r.sow_from ?? null,
		sowTo: r.sow_to ?? null,
		storageWeeks: r.storage_weeks === null ? null : Number(r.storage_weeks),
		storageLossPerWeek: r.storage_loss_per_week === null ? null : Number(r.storage_loss_per_week)
	}));
}

const CURVES = ['flat', 'ramp', 'single', 'cuts'] as const;

export function shapeOf(x: unknown): (typeof CURVES)[number] {
	return CURVES.find((c) => c === x) ?? 'flat';
}

/**
 * A stored curve (the variety's, else the crop's) as the engine takes it; undefined for flat.
 * One rule for every screen and file: a planting's expected harvest follows its variety's
 * current yield, window and curve, spread from its first to its last harvest date.
 */
export function curveOf(shape: unknown, cutIntervalDays?: unknown): HarvestCurve | undefined {
	const s = shapeOf(shape);
	if (s === 'flat') return undefined;
	const out: HarvestCurve = { shape: s };
	if (s === 'cuts' && cutIntervalDays !== null && cutIntervalDays !== undefined && Number(cutIntervalDays) > 0)
		out.intervalDays = Number(cutIntervalDays);
	return out;
}
