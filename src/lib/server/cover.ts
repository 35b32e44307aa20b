// One planting's weekly cover, for the grid's explain panel: each week it harvests, the crop's
// target, its own share, the other plantings that harvest then (this season's and other seasons')
// with their shares, and what is left short or over. Read as the Forecast page reads the season
// (forecast.ts): every planting of the crop harvesting in the season's dates, failed ones left out,
// the demand with its box swaps, storage crops through their store; planned figures throughout
// (logged harvests do not stand in for past weeks here).
import { applySwaps, deriveTargets } from '$lib/planning';
import { successionCover, type CoverWeek } from '$lib/planning/cover';
import { db } from './db';
import { targetInput } from './demand';
import { activeSwaps } from './forecast';
import { plannedCover } from './planned-supply';
import { livePlantings, plannedColumns, plannedFromRow, type PlannedRow } from './planned-rows';
import * as seasons from './seasons';

/** A planting named in a cover: enough to find it (variety, bed, field date, its season). */
export interface CoverPlantingLabel {
	id: number;
	variety: string;
	bed: string | null;
	startFt: number;
	fieldDate: string;
	/** The planting's season's name when it is not the season explained (see `season`). */
	otherSeason: string | null;
}

export interface PlantingCoverAnswer {
	plantingId: number;
	/** The season whose demand it is weighed against: the one its first harvest falls in (else its own). */
	season: { id: number; name: string };
	crop: { id: number; name: string; unit: string; stored: boolean };
	/** The weeks this planting gives something; `others` name plantings by id (see `plantings`). */
	weeks: (Omit<CoverWeek, 'others'> & { others: { id: number; quantity: number }[] })[];
	plantings: CoverPlantingLabel[];
}

interface Row extends PlannedRow {
	season_id: number;
	season_name: string;
	variety: string;
	bed: string | null;
	block: string | null;
	start_ft: number | string;
	field_date: string;
}

/** The cover of a planting of this farm; null when the farm has no such planting. */
export async function plantingCover(farmId: number, plantingId: number): Promise<PlantingCoverAnswer | null> {
	const own = await db()('plantings as p')
		.join('varieties as v', 'v.id', 'p.variety_id')
		.join('crops as c', 'c.id', 'v.crop_id')
		.where({ 'p.farm_id': farmId, 'p.id': plantingId })
		.first<
			| {
					season_id: number;
					first_harvest: string;
					crop_id: number;
					crop: string;
					unit: string;
					storage_weeks: number | null;
					loss: unknown;
			  }
			| undefined
		>(
			'p.first_harvest',
			'p.season_id',
			'v.crop_id',
			'c.name as crop',
			'c.harvest_unit as unit',
			'c.storage_weeks',
			'c.storage_loss_per_week as loss'
		);
	if (!own) return null;
	// Explained against the season whose weeks it harvests in: its own, or, for last autumn's garlic
	// dug this summer, the season its harvest falls in.
	const harvestSeason = await db()('seasons')
		.where({ farm_id: farmId })
		.where('starts_on', '<=', own.first_harvest)
		.where('ends_on', '>=', own.first_harvest)
		.orderByRaw('id = ? DESC', [own.season_id])
		.orderBy('starts_on')
		.first<{ id: number } | undefined>('id');
	const season = await seasons.get(farmId, harvestSeason?.id ?? own.season_id);
	if (!season) return null;
	const [rows, input, swaps] = await Promise.all([
		livePlantings(farmId)
			.join('seasons as s', 's.id', 'p.season_id')
			.leftJoin('beds as b', 'b.id', 'p.bed_id')
			.leftJoin('blocks as k', 'k.id', 'b.block_id')
			.where({ 'v.crop_id': own.crop_id })
			.where('p.first_harvest', '<=', season.endsOn)
			.where('p.last_harvest', '>=', season.startsOn)
			.orderBy(['p.field_date', 'p.id'])
			.select<Row[]>(
				...plannedColumns,
				'p.season_id',
				's.name as season_name',
				'v.name as variety',
				'b.name as bed',
				'k.name as block',
				'p.start_ft',
				'p.field_date'
			),
		targetInput(farmId, season.id),
		activeSwaps(farmId, season.id)
	]);
	const crop = String(own.crop_id);
	const targets = deriveTargets(applySwaps(input, swaps)).filter((t) => t.crop === crop);
	const keepWeeks = Number(own.storage_weeks ?? 0);
	const stores = keepWeeks > 0 ? [{ crop, keepWeeks, lossPerWeek: Number(own.loss ?? 0) }] : [];
	const covers = plannedCover(
		// Keyed by the bare id: the answer names the other plantings by id.
		rows.map((r) => ({ ...plannedFromRow(r), key: String(r.id) })),
		targets,
		stores
	);
	const weeks = covers.length ? successionCover(covers[0], String(plantingId)) : [];
	const named = new Set(weeks.flatMap((w) => w.others.map((o) => Number(o.key))));
	return {
		plantingId,
		season: { id: season.id, name: season.name },
		crop: { id: own.crop_id, name: own.crop, unit: own.unit, stored: stores.length > 0 },
		weeks: weeks.map((w) => ({ ...w, others: w.others.map((o) => ({ id: Number(o.key), quantity: o.quantity })) })),
		plantings: rows
			.filter((r) => named.has(r.id))
			.map((r) => ({
				id: r.id,
				variety: r.variety,
				bed: r.bed === null ? null : `${r.block ?? ''} · ${r.bed}`.replace(/^ · /, ''),
				startFt: Number(r.start_ft),
				fieldDate: r.field_date,
				otherSeason: r.season_id === season.id ? null : r.season_name
			}))
	};
}
