// The database side of the one planned supply (planned-supply.ts): the columns a planting's
// expected harvest is worked out from, read and mapped the same way by every reader, and the
// farm's storage crops. Aliases: p = plantings, v = varieties, c = crops.
import type { Knex } from 'knex';
import type { CropStore } from '$lib/planning/storage';
import { db } from './db';
import type { PlannedPlanting } from './planned-supply';
import { curveOf } from './variety-views';
import { plantingsWithCrop } from './planting-query';

/** What the planned supply reads of a variety and its crop. */
export const varietySupplyColumns = [
	'v.yield_per_bed_foot',
	'v.harvest_window_days',
	'v.harvest_curve',
	'c.harvest_curve as crop_harvest_curve',
	'c.harvest_cut_interval_days'
] as const;

/** … and of the planting, with its crop. */
export const plannedColumns = [
	'p.id',
	'v.crop_id',
	'p.first_harvest',
	'p.last_harvest',
	'p.length_ft',
	...varietySupplyColumns
] as const;

export interface VarietySupplyRow {
	yield_per_bed_foot: number | string;
	harvest_window_days: number;
	harvest_curve: string | null;
	crop_harvest_curve: string | null;
	harvest_cut_interval_days: number | null;
}

export interface PlannedRow extends VarietySupplyRow {
	id: number;
	crop_id: number;
	first_harvest: string;
	last_harvest: string;
	length_ft: number | string;
}

/** A variety's current figures under the one rule: its yield, window, and curve (its own, else its crop's). */
export function varietySupply(
	r: VarietySupplyRow
): Pick<PlannedPlanting, 'yieldPerBedFoot' | 'harvestWindowDays' | 'curve'> {
	return {
		yieldPerBedFoot: Number(r.yield_per_bed_foot),
		harvestWindowDays: Number(r.harvest_window_days),
		curve: curveOf(r.harvest_curve ?? r.crop_harvest_curve, r.harvest_cut_interval_days)
	};
}

/** A stored planting as the planned supply takes it, keyed `p{id}`. */
export function plannedFromRow(r: PlannedRow): PlannedPlanting & { key: string } {
	return {
		key: `p${r.id}`,
		crop: String(r.crop_id),
		firstHarvest: r.first_harvest,
		lastHarvest: r.last_harvest,
		lengthFt: Number(r.length_ft),
		...varietySupply(r)
	};
}

/**
 * The farm's plantings joined to their variety and crop, failed ones left out (they supply nothing),
 * in the order they were made, so every page lists them the same way on every load.
 */
export function livePlantings(farmId: number, conn: Knex = db()): Knex.QueryBuilder {
	return plantingsWithCrop(conn).where({ 'p.farm_id': farmId }).whereNot('p.status', 'failed').orderBy('p.id');
}

/** Logged harvests of a season's plantings in the crop's own unit (another unit cannot be added in). */
export function loggedHarvests(farmId: number, seasonId: number, conn: Knex = db()): Knex.QueryBuilder {
	return conn('harvest_records as h')
		.join('plantings as p', 'p.id', 'h.planting_id')
		.join('varieties as v', 'v.id', 'p.variety_id')
		.join('crops as c', 'c.id', 'v.crop_id')
		.where({ 'h.farm_id': farmId, 'p.season_id': seasonId })
		.andWhereRaw('h.unit = c.harvest_unit');
}

/** The farm's storage crops: how many weeks a harvest keeps and the share it loses a week in store. */
export async function cropStores(farmId: number, conn: Knex = db()): Promise<CropStore[]> {
	const rows = await conn('crops')
		.where({ farm_id: farmId })
		.where('storage_weeks', '>', 0)
		.select<{ id: number; storage_weeks: number; storage_loss_per_week: string | number | null }[]>(
			'id',
			'storage_weeks',
			'storage_loss_per_week'
		);
	return rows.map((c) => ({
		crop: String(c.id),
		keepWeeks: Number(c.storage_weeks),
		lossPerWeek: Number(c.storage_loss_per_week ?? 0)
	}));
}
