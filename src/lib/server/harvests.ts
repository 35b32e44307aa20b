// The harvest log read: records of what each planting gave, the plantings one may log against,
// and the audit trail. Writing a record is harvest-log.ts.
import { isoWeek, weekStart, addDays } from '$lib/planning';
import { todayIn } from '$lib/today';
import { db } from './db';
import { plantingsWithCrop } from './planting-query';

export interface HarvestView {
	id: number;
	plantingId: number;
	crop: string;
	variety: string;
	bed: string | null;
	harvestedOn: string;
	quantity: number;
	unit: string;
	harvestedBy: string | null;
	harvestedByName: string | null;
	notes: string | null;
}

export interface PlantingOption {
	id: number;
	crop: string;
	variety: string;
	family: string;
	unit: string;
	bed: string | null;
	block: string | null;
	startFt: number;
	lengthFt: number;
	fieldDate: string;
	firstHarvest: string;
	lastHarvest: string;
	status: string;
	actualFirstHarvest: string | null;
	/** Its planned harvest window touches the farm's current week. */
	dueThisWeek: boolean;
}

export interface AuditEntry {
	id: number;
	harvestId: number;
	action: 'create' | 'update' | 'delete';
	changedBy: string | null;
	changedAt: string;
	oldValues: Record<string, unknown> | null;
	newValues: Record<string, unknown> | null;
}

export async function farmToday(farmId: number): Promise<string> {
	const farm = await db()('farms').where({ id: farmId }).first('time_zone');
	return todayIn(farm?.time_zone ?? 'UTC');
}

/** The season's plantings a harvest can be logged against (failed ones left out). */
export async function plantingOptions(farmId: number, seasonId: number, today: string): Promise<PlantingOption[]> {
	const monday = weekStart(isoWeek(today));
	const sunday = addDays(monday, 6);
	const rows = await plantingsWithCrop()
		.leftJoin('beds as b', 'b.id', 'p.bed_id')
		.leftJoin('blocks as k', 'k.id', 'b.block_id')
		.where({ 'p.farm_id': farmId, 'p.season_id': seasonId })
		.whereNot('p.status', 'failed')
		.orderBy([{ column: 'c.name' }, { column: 'p.first_harvest' }, { column: 'p.id' }])
		.select(
			'p.id',
			'c.name as crop',
			'v.name as variety',
			'c.family',
			'c.harvest_unit',
			'b.name as bed',
			'k.name as block',
			'p.start_ft',
			'p.length_ft',
			'p.field_date',
			'p.first_harvest',
			'p.last_harvest',
			'p.status',
			'p.actual_first_harvest'
		);
	return rows.map((r) => ({
		id: r.id,
		crop: r.crop,
		variety: r.variety,
		family: r.family,
		unit: r.harvest_unit,
		bed: r.bed,
		block: r.block,
		startFt: Number(r.start_ft),
		lengthFt: Number(r.length_ft),
		fieldDate: r.field_date,
		firstHarvest: r.first_harvest,
		lastHarvest: r.last_harvest,
		status: r.status,
		actualFirstHarvest: r.actual_first_harvest,
		dueThisWeek: r.first_harvest <= sunday && r.last_harvest >= monday && r.status !== 'finished'
	}));
}

/** The season's harvest records with their planting's crop, variety and bed, and who logged them. */
export function baseList(farmId: number, seasonId: number) {
	return db()('harvest_records as h')
		.join('plantings as p', 'p.id', 'h.planting_id')
		.join('varieties as v', 'v.id', 'p.variety_id')
		.join('crops as c', 'c.id', 'v.crop_id')
		.leftJoin('beds as b', 'b.id', 'p.bed_id')
		.leftJoin('users as u', 'u.id', 'h.recorded_by')
		.where({ 'h.farm_id': farmId, 'p.season_id': seasonId })
		.select(
			'h.id',
			'h.planting_id',
			'c.name as crop',
			'v.name as variety',
			'b.name as bed',
			'h.harvested_on',
			'h.quantity',
			'h.unit',
			'h.recorded_by',
			'u.name as who',
			'h.notes'
		);
}

/** A row of baseList(). */
export interface HarvestRow {
	id: number;
	planting_id: number;
	crop: string;
	variety: string;
	bed: string | null;
	harvested_on: string;
	quantity: string | number;
	unit: string;
	recorded_by: string | null;
	who: string | null;
	notes: string | null;
}

export function toView(r: HarvestRow): HarvestView {
	return {
		id: r.id,
		plantingId: r.planting_id,
		crop: r.crop,
		variety: r.variety,
		bed: r.bed,
		harvestedOn: r.harvested_on,
		quantity: Number(r.quantity),
		unit: r.unit,
		harvestedBy: r.recorded_by,
		harvestedByName: r.who ?? null,
		notes: r.notes
	};
}

export async function list(farmId: number, seasonId: number): Promise<HarvestView[]> {
	return (
		await baseList(farmId, seasonId).orderBy([
			{ column: 'h.harvested_on', order: 'desc' },
			{ column: 'h.id', order: 'desc' }
		])
	).map(toView);
}

export async function get(farmId: number, seasonId: number, id: number): Promise<HarvestView | null> {
	const r = await baseList(farmId, seasonId).andWhere('h.id', id).first();
	return r ? toView(r) : null;
}

export async function auditTrail(farmId: number, seasonId: number, limit = 200): Promise<AuditEntry[]> {
	const rows = await db()('harvest_audit as a')
		.leftJoin('plantings as p', 'p.id', 'a.planting_id')
		.leftJoin('users as u', 'u.id', 'a.changed_by')
		.where('a.farm_id', farmId)
		// A deleted planting takes its season with it; its trail stays but no longer shows here.
		.andWhere('p.season_id', seasonId)
		.orderBy('a.id', 'desc')
		.limit(limit)
		.select('a.id', 'a.harvest_id', 'a.action', 'u.name as who', 'a.changed_at', 'a.old_values', 'a.new_values');
	return rows.map((r) => ({
		id: r.id,
		harvestId: r.harvest_id,
		action: r.action,
		changedBy: r.who ?? null,
		changedAt: new Date(r.changed_at).toISOString(),
		oldValues: r.old_values ? JSON.parse(r.old_values) : null,
		newValues: r.new_values ? JSON.parse(r.new_values) : null
	}));
}
