// The harvest log written: every create, edit and delete also written to harvest_audit in the same
// transaction. Checks that need the database (the planting is this season's, the unit is its crop's
// harvest unit, the date is not before it went into the field, the harvester is on the farm) name
// the field like the zod schema does. A planting's actual_first_harvest follows its earliest record;
// marking a record "finished" sets actual_last_harvest and the status. Both bump the planting's
// version, so a grid open elsewhere sees the change instead of overwriting it.
import type { Knex } from 'knex';
import { addDays } from '$lib/planning';
import type { HarvestInput, HarvestPatch } from '$lib/schemas/harvest';
import type { FieldErrors } from '$lib/schemas/common';
import { db } from './db';
import { lockSeason } from './seasons';
import { baseList, farmToday, toView, type HarvestView } from './harvests';
import { plantingsWithCrop } from './planting-query';

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
	const rows = await plantingsWithCrop(trx)
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
