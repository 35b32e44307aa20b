// The harvest log: records of what each planting gave, with every create, edit and delete
// written to harvest_audit in the same transaction. Checks that need the database (the
// planting is this season's, the unit is its crop's harvest unit, the date is not before it
// went into the field, the harvester is on the farm) name the field like the zod schema does.
// A planting's actual_first_harvest follows its earliest record; marking a record "finished"
// sets actual_last_harvest and the status. Both bump the planting's version, so a grid open
// elsewhere sees the change instead of overwriting it.
import type { Knex } from 'knex';
import { isoWeek, weekStart, addDays } from '$lib/planning';
import type { HarvestInput, HarvestPatch } from '$lib/schemas/harvest';
import type { FieldErrors } from '$lib/schemas/common';
import { todayIn } from '$lib/today';
import { db } from './db';
import { lockSeason } from './seasons';

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
	const rows = await db()('plantings as p')
		.join('varieties as v', 'v.id', 'p.variety_id')
		.join('crops as c', 'c.id', 'v.crop_id')
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

function baseList(farmId: number, seasonId: number) {
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

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function toView(r: any): HarvestView {
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

interface PlantingFacts {
	id: number;
	unit: string;
	crop: string;
	fieldDate: string;
	status: string;
	actualFirstHarvest: string | null;
	actualLastHarvest: string | null;
	version: number;
}

async function plantingFacts(
	trx: Knex.Transaction,
	farmId: number,
	seasonId: number,
	ids: number[]
): Promise<Map<number, PlantingFacts>> {
	const rows = await trx('plantings as p')
		.join('varieties as v', 'v.id', 'p.variety_id')
		.join('crops as c', 'c.id', 'v.crop_id')
		.where({ 'p.farm_id': farmId, 'p.season_id': seasonId })
		.whereIn('p.id', ids)
		.forUpdate()
		.select(
			'p.id',
			'c.harvest_unit',
			'c.name as crop',
			'p.field_date',
			'p.actual_field_date',
			'p.status',
			'p.actual_first_harvest',
			'p.actual_last_harvest',
			'p.version'
		);
	return new Map(
		rows.map((r) => [
			r.id,
			{
				id: r.id,
				unit: r.harvest_unit,
				crop: r.crop,
				// The date it actually went into the field, when the crew recorded one.
				fieldDate: r.actual_field_date ?? r.field_date,
				status: r.status,
				actualFirstHarvest: r.actual_first_harvest,
				actualLastHarvest: r.actual_last_harvest,
				version: r.version
			}
		])
	);
}

function checkAgainst(
	p: PlantingFacts,
	v: { harvestedOn: string; unit: string },
	prefix: string,
	errors: FieldErrors,
	today: string
): void {
	if (v.unit !== p.unit) errors[`${prefix}unit`] = `${p.crop} is harvested in ${p.unit}, not ${v.unit}.`;
	if (v.harvestedOn < p.fieldDate)
		errors[`${prefix}harvestedOn`] =
			`Date ${v.harvestedOn} is before this planting went into the field (${p.fieldDate}).`;
	// A day's grace past the farm's today, for a clock or time zone a little off.
	else if (v.harvestedOn > addDays(today, 1))
		errors[`${prefix}harvestedOn`] = `Date ${v.harvestedOn} is in the future (today is ${today}).`;
}

async function memberIds(trx: Knex.Transaction, farmId: number): Promise<Set<string>> {
	return new Set(
		(await trx('farm_members').where({ farm_id: farmId }).select('user_id')).map((r) => r.user_id as string)
	);
}

function recordValues(r: {
	planting_id: number;
	harvested_on: string;
	quantity: number | string;
	unit: string;
	recorded_by: string | null;
	notes: string | null;
}): Record<string, unknown> {
	return {
		plantingId: r.planting_id,
		harvestedOn: r.harvested_on,
		quantity: Number(r.quantity),
		unit: r.unit,
		harvestedBy: r.recorded_by,
		notes: r.notes
	};
}

/**
 * Brings a planting's actual harvest dates in line with its records: first harvest is the
 * earliest record; a planting still planned, sown or transplanted that has records is now
 * harvesting; `finishOn` closes its window. A finished planting's last harvest never stands
 * before its latest record.
 */
async function syncPlanting(
	trx: Knex.Transaction,
	farmId: number,
	plantingId: number,
	finishOn?: string,
	removedOn?: string
): Promise<void> {
	const cur = await trx('plantings')
		.where({ id: plantingId, farm_id: farmId })
		.first('status', 'actual_first_harvest', 'actual_last_harvest', 'version');
	if (!cur) return;
	const span = await trx('harvest_records')
		.where({ planting_id: plantingId })
		.min({ first: 'harvested_on' })
		.max({ last: 'harvested_on' })
		.first();
	const first: string | null = span?.first ?? null;
	const last: string | null = span?.last ?? null;
	const next: Record<string, unknown> = {};
	// A first harvest the crew set by hand (no records yet) stands, unless it came from the record just removed.
	if (first) next.actual_first_harvest = first;
	else if (removedOn && cur.actual_first_harvest === removedOn) next.actual_first_harvest = null;
	if (first && ['planned', 'sown', 'transplanted'].includes(cur.status)) next.status = 'harvesting';
	if (finishOn) {
		next.status = 'finished';
		next.actual_last_harvest = last && last > finishOn ? last : finishOn;
	} else if (cur.actual_last_harvest && last && last > cur.actual_last_harvest) {
		next.actual_last_harvest = last;
	}
	const changed = Object.entries(next).some(([k, v]) => (cur as Record<string, unknown>)[k] !== v);
	if (changed)
		await trx('plantings')
			.where({ id: plantingId, farm_id: farmId })
			.update({ ...next, version: cur.version + 1, updated_at: trx.fn.now() });
}

export type WriteResult<T> = { ok: true; value: T } | { ok: false; status: 400 | 404; errors: FieldErrors };

/**
 * Logs one or more records (a phone entry, or a morning's sheet) in one transaction: every
 * row or none. Errors are keyed by field, with `records.{i}.` in front for a batch.
 */
export async function create(
	farmId: number,
	seasonId: number,
	actorId: string,
	inputs: HarvestInput[],
	batch = false
): Promise<WriteResult<HarvestView[]>> {
	const today = await farmToday(farmId);
	return db().transaction(async (trx) => {
		// The season first, as every writer of its plantings does: the sync below moves plantings on.
		await lockSeason(trx, farmId, seasonId, 'shared');
		const facts = await plantingFacts(trx, farmId, seasonId, [...new Set(inputs.map((i) => i.plantingId))]);
		const members = await memberIds(trx, farmId);
		const errors: FieldErrors = {};
		inputs.forEach((input, i) => {
			const prefix = batch ? `records.${i}.` : '';
			const p = facts.get(input.plantingId);
			if (!p) errors[`${prefix}plantingId`] = 'Choose a planting of this season.';
			else checkAgainst(p, input, prefix, errors, today);
			if (input.harvestedBy && !members.has(input.harvestedBy))
				errors[`${prefix}harvestedBy`] = 'Who must be a member of the farm.';
		});
		if (Object.keys(errors).length) return { ok: false, status: 400, errors } as const;
		const ids: number[] = [];
		for (const input of inputs) {
			const row = {
				farm_id: farmId,
				planting_id: input.plantingId,
				harvested_on: input.harvestedOn,
				quantity: input.quantity,
				unit: input.unit,
				recorded_by: input.harvestedBy ?? actorId,
				notes: input.notes ?? null
			};
			const [id] = await trx('harvest_records').insert(row);
			ids.push(id);
			await trx('harvest_audit').insert({
				farm_id: farmId,
				harvest_id: id,
				planting_id: input.plantingId,
				action: 'create',
				changed_by: actorId,
				new_values: JSON.stringify(recordValues(row))
			});
		}
		const finishing = new Map<number, string>();
		for (const input of inputs)
			if (input.finished)
				finishing.set(input.plantingId, [finishing.get(input.plantingId) ?? '', input.harvestedOn].sort().at(-1)!);
		for (const pid of new Set(inputs.map((i) => i.plantingId)))
			await syncPlanting(trx, farmId, pid, finishing.get(pid));
		const views = (await baseList(farmId, seasonId).transacting(trx).whereIn('h.id', ids)).map(toView);
		const order = new Map(ids.map((id, i) => [id, i]));
		views.sort((a, b) => order.get(a.id)! - order.get(b.id)!);
		return { ok: true, value: views } as const;
	});
}

async function lockRecord(trx: Knex.Transaction, farmId: number, seasonId: number, id: number) {
	return trx('harvest_records as h')
		.join('plantings as p', 'p.id', 'h.planting_id')
		.where({ 'h.id': id, 'h.farm_id': farmId, 'p.season_id': seasonId })
		.forUpdate()
		.first('h.*');
}

export async function update(
	farmId: number,
	seasonId: number,
	id: number,
	actorId: string,
	patch: HarvestPatch
): Promise<WriteResult<HarvestView>> {
	const today = await farmToday(farmId);
	return db().transaction(async (trx) => {
		await lockSeason(trx, farmId, seasonId, 'shared');
		const cur = await lockRecord(trx, farmId, seasonId, id);
		if (!cur) return { ok: false, status: 404, errors: { _form: 'No such harvest record in this season.' } } as const;
		const p = (await plantingFacts(trx, farmId, seasonId, [cur.planting_id])).get(cur.planting_id)!;
		const errors: FieldErrors = {};
		checkAgainst(p, patch, '', errors, today);
		if (patch.harvestedBy && !(await memberIds(trx, farmId)).has(patch.harvestedBy))
			errors.harvestedBy = 'Who must be a member of the farm.';
		if (Object.keys(errors).length) return { ok: false, status: 400, errors } as const;
		const next = {
			harvested_on: patch.harvestedOn,
			quantity: patch.quantity,
			unit: patch.unit,
			recorded_by: patch.harvestedBy ?? cur.recorded_by,
			notes: patch.notes ?? null
		};
		await trx('harvest_records').where({ id, farm_id: farmId }).update(next);
		await trx('harvest_audit').insert({
			farm_id: farmId,
			harvest_id: id,
			planting_id: cur.planting_id,
			action: 'update',
			changed_by: actorId,
			old_values: JSON.stringify(recordValues(cur)),
			new_values: JSON.stringify(recordValues({ ...cur, ...next }))
		});
		await syncPlanting(trx, farmId, cur.planting_id, undefined, cur.harvested_on);
		return {
			ok: true,
			value: toView(await baseList(farmId, seasonId).transacting(trx).andWhere('h.id', id).first())
		} as const;
	});
}

/** Deletes a record; the audit trail keeps what it held. False when it is not this season's. */
export async function remove(farmId: number, seasonId: number, id: number, actorId: string): Promise<boolean> {
	return db().transaction(async (trx) => {
		await lockSeason(trx, farmId, seasonId, 'shared');
		const cur = await lockRecord(trx, farmId, seasonId, id);
		if (!cur) return false;
		await trx('harvest_records').where({ id, farm_id: farmId }).delete();
		await trx('harvest_audit').insert({
			farm_id: farmId,
			harvest_id: id,
			planting_id: cur.planting_id,
			action: 'delete',
			changed_by: actorId,
			old_values: JSON.stringify(recordValues(cur))
		});
		await syncPlanting(trx, farmId, cur.planting_id, undefined, cur.harvested_on);
		return true;
	});
}
