// A season's weekly harvest forecast against its demand: the engine's forecast() over the
// season's plantings (failed ones left out), logged harvests in place of the forecast for
// past weeks, and targets from the box contents with the recorded swaps applied. A storage
// crop's harvest goes through its store, so it feeds the weeks after it is dug.
import {
	applySwaps,
	cropWeekKey,
	deriveTargets,
	isoWeek,
	supplyWithActuals,
	weeksBetween,
	type BoxSwap,
	type ForecastPlanting,
	type ForecastRow,
	type TargetInput
} from '$lib/planning';
import { forecastFromWeeklySupply } from '$lib/planning/forecast';
import { throughStoresSplit } from '$lib/planning/storage';
import { todayIn } from '$lib/today';
import { plannedHarvest } from './planned-supply';
import {
	cropStores,
	livePlantings,
	loggedHarvests,
	plannedColumns,
	plannedFromRow,
	type PlannedRow
} from './planned-rows';
import { db } from './db';
import { targetInput } from './demand';
import type { Season } from './seasons';

export interface ForecastCrop {
	id: string;
	name: string;
	family: string;
	unit: string;
}

export interface SeasonForecastRow extends ForecastRow {
	/** True when logged harvests stand in for the forecast in this (past) week. */
	actual: boolean;
	/** The part of `supply` a storage crop sells from store (dug in an earlier week); the rest is from the field. */
	fromStore: number;
}

export interface SeasonForecast {
	/** The season's ISO weeks, first to last. */
	weeks: string[];
	/** The farm's current week: harvests logged before it replace the forecast. */
	currentWeek: string;
	crops: ForecastCrop[];
	rows: SeasonForecastRow[];
	/** Demand with the active swaps applied, as the rows were computed from. */
	demand: TargetInput;
	swaps: BoxSwap[];
	/** Milliseconds spent reading the database and in the engine, for a Server-Timing header. */
	timing: { db: number; engine: number };
}

export async function listCrops(farmId: number): Promise<ForecastCrop[]> {
	const rows = await db()('crops')
		.where({ farm_id: farmId })
		.orderBy('name')
		.select('id', 'name', 'family', 'harvest_unit');
	return rows.map((c) => ({ id: String(c.id), name: c.name, family: c.family, unit: c.harvest_unit }));
}

/** Swaps still in force, oldest first: the order they were made in is the order they apply. */
export async function activeSwaps(farmId: number, seasonId: number): Promise<BoxSwap[]> {
	const rows = await db()('box_swaps')
		.where({ farm_id: farmId, season_id: seasonId })
		.whereNull('undone_at')
		.orderBy('id')
		.select('id', 'share_size_id', 'week', 'from_crop_id', 'to_crop_id', 'quantity', 'to_quantity');
	return rows.map((s) => ({
		key: String(s.id),
		shareSizeId: String(s.share_size_id),
		week: s.week,
		fromCrop: String(s.from_crop_id),
		toCrop: String(s.to_crop_id),
		quantity: Number(s.quantity),
		...(s.to_quantity === null ? {} : { toQuantity: Number(s.to_quantity) })
	}));
}

export function seasonWeeks(season: Season): string[] {
	return weeksBetween(isoWeek(season.startsOn), isoWeek(season.endsOn));
}

export async function seasonForecast(farmId: number, season: Season): Promise<SeasonForecast> {
	const t0 = performance.now();
	// One round of queries in parallel; logged harvests are cut at the current week below, once
	// the farm's time zone is known.
	const [farm, crops, plantings, harvests, input, swaps, stores] = await Promise.all([
		db()('farms').where({ id: farmId }).first('time_zone'),
		listCrops(farmId),
		// Every planting harvesting in the season's dates, whatever season it belongs to (last
		// autumn's garlic, dug this summer, feeds this season's boxes).
		livePlantings(farmId)
			.where('p.first_harvest', '<=', season.endsOn)
			.where('p.last_harvest', '>=', season.startsOn)
			.select<PlannedRow[]>(...plannedColumns),
		loggedHarvests(farmId, season.id).select<
			{ planting_id: number; crop_id: number; harvested_on: string; quantity: string | number }[]
		>('h.planting_id', 'v.crop_id', 'h.harvested_on', 'h.quantity'),
		targetInput(farmId, season.id),
		activeSwaps(farmId, season.id),
		cropStores(farmId)
	]);
	const currentWeek = isoWeek(todayIn(farm?.time_zone ?? 'UTC'));
	const t1 = performance.now();
	// The one planned supply (planned-supply.ts): bed-feet × the variety's current yield, spread by
	// its curve, so a change of a planting's length or a variety's yield shows at once.
	const forecastPlantings: ForecastPlanting[] = plantings.map((p) => plannedHarvest(plannedFromRow(p)));
	const { supply, actual } = supplyWithActuals(
		forecastPlantings,
		harvests.map((h) => ({
			key: `p${h.planting_id}`,
			crop: String(h.crop_id),
			date: h.harvested_on,
			quantity: Number(h.quantity)
		})),
		currentWeek
	);
	const demand = applySwaps(input, swaps);
	// The supply is summed per crop-week already: join it with the targets directly rather than
	// through a second forecast() over one pseudo-planting per crop-week (same rows, bit for bit).
	const targets = deriveTargets(demand);
	const stored = throughStoresSplit(supply, targets, stores);
	const fromStore = new Map(stored.fromStore.map((q) => [cropWeekKey(q.crop, q.week), q.quantity]));
	const rows = forecastFromWeeklySupply(stored.supply, targets) as SeasonForecastRow[];
	for (const r of rows) {
		const k = cropWeekKey(r.crop, r.week);
		r.actual = actual.size > 0 && actual.has(k);
		r.fromStore = Math.min(r.supply, fromStore.get(k) ?? 0);
	}
	const timing = { db: t1 - t0, engine: performance.now() - t1 };
	return { weeks: seasonWeeks(season), currentWeek, crops, rows, demand, swaps, timing };
}

/**
 * One crop's figures across the response's weeks (the `shape=series` answer): supply[i] is null
 * where the crop has neither supply nor demand in weeks[i] (no row in the rows shape); demand[i]
 * is 0 there. Shortfall and surplus are max(0, demand − supply) and max(0, supply − demand), so
 * they are not sent. actual lists the indices of the weeks with logged harvests.
 */
export interface ForecastSeries {
	crop: string;
	supply: (number | null)[];
	demand: number[];
	actual: number[];
	/** Storage crops only: fromStore[i] of supply[i] is sold from store (0 where none). */
	fromStore?: number[];
}

/** Rows (sorted by crop, then week, all within `weeks`) as one series per crop, in the same order. */
export function toSeries(rows: SeasonForecastRow[], weeks: string[]): ForecastSeries[] {
	const index = new Map(weeks.map((w, i) => [w, i]));
	const out: ForecastSeries[] = [];
	let s: ForecastSeries | undefined;
	for (const r of rows) {
		if (s?.crop !== r.crop) {
			s = {
				crop: r.crop,
				supply: new Array<number | null>(weeks.length).fill(null),
				demand: new Array<number>(weeks.length).fill(0),
				actual: []
			};
			out.push(s);
		}
		const i = index.get(r.week)!;
		s.supply[i] = r.supply;
		s.demand[i] = r.demand;
		if (r.actual) s.actual.push(i);
		if (r.fromStore > 0) (s.fromStore ??= new Array<number>(weeks.length).fill(0))[i] = r.fromStore;
	}
	return out;
}
