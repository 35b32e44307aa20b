// The farm's crop library: crops and their varieties.
import type { Knex } from 'knex';
import { db } from './db';

import type { VarietyView } from '$lib/types';

export type { VarietyView };

export async function listVarieties(farmId: number, conn: Knex = db()): Promise<VarietyView[]> {
	const rows = await conn('varieties as v')
		.join('crops as c', 'c.id', 'v.crop_id')
		.where('v.farm_id', farmId)
		.orderBy([{ column: 'c.name' }, { column: 'v.name' }])
		.select('v.*', 'c.name as crop', 'c.family', 'c.harvest_unit', 'c.frost_tolerance', 'c.heat_limit_f', 'c.base_temp_f');
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
		gddToMaturity: r.gdd_to_maturity
	}));
}
