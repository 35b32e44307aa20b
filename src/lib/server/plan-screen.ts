// What the plan screen shows of a preview besides the engine's answer: which plantings stay,
// go, come and find no bed; totals before and after; and, per crop, supply against demand.
import type { ProposedPlanting } from '$lib/planning';
import { plantingSeed } from '$lib/engine-inputs';
import type { VarietyView } from '$lib/types';
import { db } from './db';
import { listVarieties } from './crops';
import type { PlanPreview } from './plan';
import { proposedKey } from './plan-cover';
import type { Season } from './seasons';

/** One planting as the change lists show it. */
export interface ChangeRow {
	id: number | null;
	cropId: number;
	varietyId: number;
	status: string;
	bedId: number | null;
	startFt: number;
	lengthFt: number;
	fieldDate: string;
	firstHarvest: string;
	lastHarvest: string;
	method: string;
	/** Why it has no bed (added plantings only). */
	reason: string | null;
	/** A proposed planting's key in the preview's cover (plan-cover.ts). */
	key?: string;
}

export interface Totals {
	plantings: number;
	bedFeet: number;
	seeds: number;
	grams: number;
	trays: number;
	costCents: number;
}

export interface CropBalance {
	cropId: number;
	weeks: string[];
	demand: number[];
	before: number[];
	after: number[];
}

export interface PreviewDetails {
	kept: ChangeRow[];
	/** Planned plantings the plan recreates exactly (same variety, bed, feet, dates and layout). */
	unchanged: ChangeRow[];
	removed: ChangeRow[];
	added: ChangeRow[];
	withoutBed: ChangeRow[];
	totals: { before: Totals; after: Totals };
	balance: CropBalance[];
	units: Record<string, string>;
}

interface Row {
	id: number;
	variety_id: number;
	crop_id: number;
	status: string;
	bed_id: number | null;
	start_ft: number;
	length_ft: number;
	rows: number;
	in_row_spacing_in: number;
	seeds_per_spot: number;
	method: 'direct' | 'transplant';
	field_date: string;
	first_harvest: string;
	last_harvest: string;
	yield_per_bed_foot: number;
}

type Shape = {
	varietyId: number;
	bedId: number | null;
	startFt: number;
	lengthFt: number;
	fieldDate: string;
	method: string;
	rows: number;
	spacing: number;
	perSpot: number;
};
const shapeKey = (s: Shape): string =>
	[
		s.varietyId,
		s.bedId ?? '-',
		Number(s.startFt).toFixed(1),
		Number(s.lengthFt).toFixed(1),
		s.fieldDate,
		s.method,
		s.rows,
		Number(s.spacing).toFixed(2),
		s.perSpot
	].join('|');

function emptyTotals(): Totals {
	return { plantings: 0, bedFeet: 0, seeds: 0, grams: 0, trays: 0, costCents: 0 };
}

function addTo(
	t: Totals,
	p: { method: 'direct' | 'transplant'; lengthFt: number; rows: number; inRowSpacingIn: number; seedsPerSpot: number },
	v: VarietyView | undefined
): void {
	t.plantings += 1;
	t.bedFeet += p.lengthFt;
	if (!v) return;
	try {
		const s = plantingSeed(p, v);
		t.seeds += s.seeds;
		t.grams += s.grams;
		t.trays += s.trays;
		t.costCents += s.costCents ?? 0;
	} catch {
		// A planting the engine cannot size (a bad figure in the library) adds its feet only.
	}
}

/** The preview's lists and totals; its per-crop balance comes with its cover (plan-cover.ts). */
export async function describePreview(
	farmId: number,
	season: Season,
	result: PlanPreview
): Promise<Omit<PreviewDetails, 'balance'>> {
	const [rows, varieties, crops] = await Promise.all([
		db()('plantings as p')
			.join('varieties as v', 'v.id', 'p.variety_id')
			.where({ 'p.farm_id': farmId, 'p.season_id': season.id })
			.orderBy(['p.field_date', 'p.id'])
			.select(
				'p.id',
				'p.variety_id',
				'v.crop_id',
				'p.status',
				'p.bed_id',
				'p.start_ft',
				'p.length_ft',
				'p.rows',
				'p.in_row_spacing_in',
				'p.seeds_per_spot',
				'p.method',
				'p.field_date',
				'p.first_harvest',
				'p.last_harvest',
				'v.yield_per_bed_foot'
			) as Promise<Row[]>,
		listVarieties(farmId),
		db()('crops').where({ farm_id: farmId }).select('id', 'harvest_unit') as Promise<
			{ id: number; harvest_unit: string }[]
		>
	]);
	const varietyById = new Map(varieties.map((v) => [v.id, v]));
	const existing = (r: Row): ChangeRow => ({
		id: r.id,
		cropId: r.crop_id,
		varietyId: r.variety_id,
		status: r.status,
		bedId: r.bed_id,
		startFt: Number(r.start_ft),
		lengthFt: Number(r.length_ft),
		fieldDate: r.field_date,
		firstHarvest: r.first_harvest,
		lastHarvest: r.last_harvest,
		method: r.method,
		reason: null
	});
	const indexOf = new Map(result.plan.plantings.map((p, i) => [p, i]));
	const proposed = (p: ProposedPlanting): ChangeRow => ({
		key: proposedKey(indexOf.get(p) ?? -1),
		id: null,
		cropId: Number(p.cropId),
		varietyId: Number(p.varietyId),
		status: 'planned',
		bedId: p.bedId === null ? null : Number(p.bedId),
		startFt: p.startFt,
		lengthFt: p.lengthFt,
		fieldDate: p.fieldDate,
		firstHarvest: p.firstHarvest,
		lastHarvest: p.lastHarvest,
		method: p.method,
		reason: p.unplacedReason
	});

	// Planned rows the plan would recreate identically are "unchanged"; each matches at most once.
	const pool = new Map<string, Row[]>();
	for (const r of rows.filter((r) => r.status === 'planned')) {
		const k = shapeKey({
			varietyId: r.variety_id,
			bedId: r.bed_id,
			startFt: r.start_ft,
			lengthFt: r.length_ft,
			fieldDate: r.field_date,
			method: r.method,
			rows: r.rows,
			spacing: r.in_row_spacing_in,
			perSpot: r.seeds_per_spot
		});
		(pool.get(k) ?? pool.set(k, []).get(k)!).push(r);
	}
	const unchanged: ChangeRow[] = [];
	const added: ChangeRow[] = [];
	for (const p of result.plan.plantings) {
		const k = shapeKey({
			varietyId: Number(p.varietyId),
			bedId: p.bedId === null ? null : Number(p.bedId),
			startFt: p.startFt,
			lengthFt: p.lengthFt,
			fieldDate: p.fieldDate,
			method: p.method,
			rows: p.rows,
			spacing: p.inRowSpacingIn,
			perSpot: p.seedsPerSpot
		});
		const match = pool.get(k)?.shift();
		if (match) unchanged.push(existing(match));
		else added.push(proposed(p));
	}
	const unchangedIds = new Set(unchanged.map((u) => u.id));
	const removed = rows.filter((r) => r.status === 'planned' && !unchangedIds.has(r.id)).map(existing);

	// Totals: every planting that is not failed, now and after the apply.
	const before = emptyTotals();
	const after = emptyTotals();
	const seedShape = (r: Row) => ({
		method: r.method,
		lengthFt: Number(r.length_ft),
		rows: r.rows,
		inRowSpacingIn: Number(r.in_row_spacing_in),
		seedsPerSpot: r.seeds_per_spot
	});
	for (const r of rows) {
		if (r.status === 'failed') continue;
		addTo(before, seedShape(r), varietyById.get(r.variety_id));
		if (r.status !== 'planned') addTo(after, seedShape(r), varietyById.get(r.variety_id));
	}
	for (const p of result.plan.plantings) {
		after.plantings += 1;
		after.bedFeet += p.lengthFt;
		after.seeds += p.seed.seeds;
		after.grams += p.seed.grams;
		after.trays += p.seed.trays;
		after.costCents += p.seed.costCents ?? 0;
	}
	for (const t of [before, after]) t.grams = Math.round(t.grams * 100) / 100;

	return {
		kept: rows.filter((r) => r.status !== 'planned').map(existing),
		unchanged,
		removed,
		added,
		withoutBed: result.plan.plantings.filter((p) => p.bedId === null).map(proposed),
		totals: { before, after },
		units: Object.fromEntries(crops.map((c) => [String(c.id), c.harvest_unit]))
	};
}
