// Plantings of a farm's seasons, with their variety, crop and bed joined in for display.
import { db } from './db';
import type { Knex } from 'knex';
import type { Role } from '$lib/roles';
import { editableFields, type PlantingCreate, type PlantingField, type PlantingPatch } from '$lib/schemas/planting';
import {
	figureColumns,
	figuresOf,
	fromColumns,
	fromStored,
	initialValue,
	plantingFieldNames,
	storedColumnNames,
	toColumns,
	type PlantingValues
} from '$lib/plantings/fields';
import { deriveRow, storedHarvestDays, type GridBed, type GridFarm, type GridVariety } from '$lib/plantings/derive';
import type { TaskKind } from '$lib/plantings/tasks';
import { whereTask } from './planting-tasks';
import { engineFarm } from '$lib/engine-inputs';
import * as farmsData from './farms';
import * as bedsData from './beds';
import { listVarieties } from './crops';
import { lockSeason, shareSeasonLockOfPlanting } from './seasons';

import type { PlantingView } from '$lib/types';
import { seasonDateProblem, type FieldErrors as DateErrors } from '$lib/schemas/common';
import { todayIn } from '$lib/today';
import { plantingsWithCrop } from './planting-query';
import { pick } from '$lib/pick';

export type { PlantingView };

function base(farmId: number) {
	return plantingsWithCrop()
		.leftJoin('beds as b', 'b.id', 'p.bed_id')
		.leftJoin('blocks as k', 'k.id', 'b.block_id')
		.leftJoin('users as u', 'u.id', 'p.updated_by')
		.where('p.farm_id', farmId)
		.select(
			...storedColumnNames.map((c) => `p.${c}`),
			'p.id',
			'p.season_id',
			'v.name as variety',
			'c.name as crop',
			'c.family',
			'c.harvest_unit',
			'b.name as bed',
			'k.name as block',
			'k.position as block_position',
			'b.position as bed_position',
			'p.version',
			'u.name as updated_by_name',
			'p.updated_at'
		);
}

/** A row of base(): the plantings table's columns with the joined names. */
type JoinedRow = Record<string, unknown> & {
	id: number;
	season_id: number;
	variety: string;
	crop: string;
	family: string;
	harvest_unit: string;
	bed: string | null;
	block: string | null;
	block_position: number | null;
	bed_position: number | null;
	version: number;
	updated_by_name: string | null;
	updated_at: Date | string | null;
};

function toView(r: JoinedRow): PlantingView {
	return {
		...fromStored(r),
		id: r.id,
		seasonId: r.season_id,
		variety: r.variety,
		crop: r.crop,
		family: r.family,
		harvestUnit: r.harvest_unit,
		bed: r.bed,
		block: r.block,
		blockPosition: r.block_position,
		bedPosition: r.bed_position,
		version: r.version,
		updatedBy: r.updated_by_name ?? null,
		updatedAt: r.updated_at ? new Date(r.updated_at).toISOString() : null
	};
}

export async function listForSeason(farmId: number, seasonId: number): Promise<PlantingView[]> {
	return (
		await base(farmId)
			.andWhere('p.season_id', seasonId)
			.orderBy([{ column: 'p.field_date' }, { column: 'p.id' }])
	).map(toView);
}

/**
 * The farm's plantings of other seasons whose harvest falls in `season`'s dates, failed ones left
 * out: last autumn's garlic dug this summer supplies this season's weeks (the workbook's Forecast
 * and Weekly tasks count them, as the Forecast page does).
 */
export async function listHarvestingFromOtherSeasons(
	farmId: number,
	season: { id: number; startsOn: string; endsOn: string }
): Promise<PlantingView[]> {
	return (
		await base(farmId)
			.andWhereNot('p.season_id', season.id)
			.andWhereNot('p.status', 'failed')
			.andWhere('p.first_harvest', '<=', season.endsOn)
			.andWhere('p.last_harvest', '>=', season.startsOn)
			.orderBy([{ column: 'p.first_harvest' }, { column: 'p.id' }])
	).map(toView);
}

export interface WeekTasks {
	traySowing: PlantingView[];
	directSowing: PlantingView[];
	transplanting: PlantingView[];
	harvest: PlantingView[];
}

/**
 * What the crew does in the week monday..sunday (the task rule of plantings/tasks.ts), in walking
 * order (block, bed, start foot); tray work by crop, as the tray bench holds it.
 */
export async function tasksForWeek(farmId: number, monday: string, sunday: string): Promise<WeekTasks> {
	const walking = [{ column: 'k.position' }, { column: 'b.position' }, { column: 'p.start_ft' }];
	const task = (kind: TaskKind) => whereTask(base(farmId), kind, monday, sunday);
	const [tray, direct, transplant, harvest] = await Promise.all([
		task('tray_sow').orderBy('c.name'),
		task('direct_sow').orderBy(walking),
		task('transplant').orderBy(walking),
		task('harvest').orderBy(walking)
	]);
	return {
		traySowing: tray.map(toView),
		directSowing: direct.map(toView),
		transplanting: transplant.map(toView),
		harvest: harvest.map(toView)
	};
}

// ---- The planting grid's verbs: context, create (one row or a paste), update with a version, remove.
// Derived columns (dates, expected yield, seeds) are recomputed here on every save by the same
// engine the grid runs in the browser; what the browser sent for them is never trusted.

export interface GridContext {
	varieties: GridVariety[];
	beds: GridBed[];
	farm: GridFarm;
}

/** Everything the grid needs to recalculate rows in the browser the way the server will. */
export async function gridContext(farmId: number): Promise<GridContext> {
	const [farm, temps, varieties, beds] = await Promise.all([
		farmsData.get(farmId),
		farmsData.weeklyTemps(farmId),
		listVarieties(farmId),
		bedsData.list(farmId)
	]);
	return {
		varieties,
		beds: beds.map((b) => pick(b, ['id', 'name', 'blockId', 'blockName', 'lengthFt'])),
		farm: {
			...engineFarm(farm, temps),
			turnaroundDays: farm.turnaroundDays,
			bedFootIncrement: farm.bedFootIncrement
		}
	};
}

export async function getOne(farmId: number, id: number, trx?: Knex.Transaction): Promise<PlantingView | null> {
	const q = base(farmId).andWhere('p.id', id);
	if (trx) q.transacting(trx);
	const r = await q.first();
	return r ? toView(r) : null;
}

/** Bad input that only the database can judge (another farm's variety or bed, a row the engine cannot work out). */
export type FieldErrors = Record<string, string>;

/** The row as stored, with derived columns recomputed; errors keyed by field. */
function buildRow(
	values: PlantingValues,
	variety: GridVariety | undefined,
	ctx: GridContext,
	prefix: string,
	/** Days of harvest the stored planting keeps (an update); a new planting harvests its whole window. */
	harvestDays: number | null = null
): { row?: Record<string, unknown>; errors: FieldErrors } {
	const errors: FieldErrors = {};
	if (!variety) errors[`${prefix}varietyId`] = "Choose one of this farm's varieties.";
	if (values.bedId !== null && !ctx.beds.some((b) => b.id === values.bedId))
		errors[`${prefix}bedId`] = "Choose one of this farm's beds.";
	if (!variety || Object.keys(errors).length) return { errors };
	const d = deriveRow({ ...values, harvestDays }, variety, ctx.farm);
	if (!d.ok) return { errors: { [`${prefix}${d.field === 'bedFeet' ? 'lengthFt' : d.field}`]: d.message } };
	return { row: { ...toColumns(values), ...figureColumns(figuresOf(d.value)) }, errors };
}

function withDefaults(input: PlantingCreate, v: GridVariety | undefined): PlantingValues {
	const out: Record<string, unknown> = { ...input };
	for (const f of plantingFieldNames) if (out[f] === undefined) out[f] = initialValue(f, v);
	return out as PlantingValues;
}

const dateLabels = {
	fieldDate: 'Field date',
	actualTraySowDate: 'Actual tray sowing',
	actualFieldDate: 'Actual field date',
	actualFirstHarvest: 'Actual first harvest',
	actualLastHarvest: 'Actual last harvest'
} as const;
type DateField = keyof typeof dateLabels;
const actualFields: DateField[] = ['actualTraySowDate', 'actualFieldDate', 'actualFirstHarvest', 'actualLastHarvest'];

/** The season's year and the farm's today, which a planting's dates are held to. */
export interface DateLimits {
	seasonYear: number;
	today: string;
}

export async function dateLimits(farmId: number, seasonId: number, trx?: Knex.Transaction): Promise<DateLimits | null> {
	const q = trx ?? db();
	const row = await q('seasons as s')
		.join('farms as f', 'f.id', 's.farm_id')
		.where({ 's.id': seasonId, 's.farm_id': farmId })
		.first('s.year', 'f.time_zone');
	return row ? { seasonYear: Number(row.year), today: todayIn(row.time_zone) } : null;
}

/**
 * The rules every writer of a planting's dates follows (grid, API, crew sheet alike): each date
 * within the season's year ± 1; actual dates never after the farm's today; harvests not before
 * the planting went into the field, the last not before the first. Only the fields being
 * written are judged, so an old row's odd value does not block an unrelated edit.
 */
export function plantingDateErrors(
	values: Partial<Record<DateField, string | null>>,
	written: readonly string[],
	limits: DateLimits,
	prefix = ''
): DateErrors {
	const errors: DateErrors = {};
	const field = values.actualFieldDate ?? values.fieldDate ?? null;
	for (const f of Object.keys(dateLabels) as DateField[]) {
		const v = values[f];
		if (!written.includes(f) || !v) continue;
		const label = dateLabels[f];
		const problem =
			seasonDateProblem(label, v, limits.seasonYear) ??
			(actualFields.includes(f) && v > limits.today ? `${label} cannot be after today (${limits.today}).` : null) ??
			((f === 'actualFirstHarvest' || f === 'actualLastHarvest') && field && v < field
				? `${label} cannot be before the planting went into the field (${field}).`
				: null) ??
			(f === 'actualLastHarvest' && values.actualFirstHarvest && v < values.actualFirstHarvest
				? `${label} cannot be before the actual first harvest (${values.actualFirstHarvest}).`
				: null);
		if (problem) errors[`${prefix}${f}`] = problem;
	}
	return errors;
}

export type CreateResult = { ok: true; plantings: PlantingView[] } | { ok: false; errors: FieldErrors };

/** New rows (one, or a whole paste) in one transaction: all of them or none. */
export async function create(
	farmId: number,
	seasonId: number,
	userId: string,
	inputs: PlantingCreate[]
): Promise<CreateResult> {
	const ctx = await gridContext(farmId);
	const limits = await dateLimits(farmId, seasonId);
	if (!limits) return { ok: false, errors: { seasonId: 'No such season on this farm.' } };
	const byId = new Map(ctx.varieties.map((v) => [v.id, v]));
	const rows: Record<string, unknown>[] = [];
	const errors: FieldErrors = {};
	inputs.forEach((input, i) => {
		const v = byId.get(input.varietyId);
		const values = withDefaults(input, v);
		const dateErrors = plantingDateErrors(
			values as Partial<Record<DateField, string | null>>,
			Object.keys(input),
			limits,
			`plantings.${i}.`
		);
		Object.assign(errors, dateErrors);
		if (Object.keys(dateErrors).length) return;
		const built = buildRow(values, v, ctx, `plantings.${i}.`);
		Object.assign(errors, built.errors);
		if (built.row) rows.push({ ...built.row, farm_id: farmId, season_id: seasonId, updated_by: userId });
	});
	if (Object.keys(errors).length) return { ok: false, errors };
	const ids = await db().transaction(async (trx) => {
		await lockSeason(trx, farmId, seasonId, 'shared');
		const out: number[] = [];
		// One INSERT per row: MariaDB reports only the first id of a multi-row insert.
		for (const r of rows) out.push(...(await trx('plantings').insert(r)));
		return out;
	});
	const views = (await base(farmId).whereIn('p.id', ids)).map(toView);
	const order = new Map(ids.map((id, i) => [id, i]));
	views.sort((a, b) => (order.get(a.id) ?? 0) - (order.get(b.id) ?? 0));
	return { ok: true, plantings: views };
}

export type UpdateResult =
	| { kind: 'ok'; planting: PlantingView }
	| { kind: 'not_found' }
	| { kind: 'forbidden'; fields: string[] }
	| { kind: 'conflict'; current: PlantingView }
	| { kind: 'invalid'; errors: FieldErrors };

/** An edit made on `patch.version`; a stale version is refused with the row as it now stands. */
export async function update(
	farmId: number,
	id: number,
	user: { id: string; role: Role },
	patch: PlantingPatch
): Promise<UpdateResult> {
	const { version, ...changes } = patch;
	const allowed = editableFields(user.role);
	const refused = Object.keys(changes).filter((f) => !allowed.includes(f as PlantingField));
	if (refused.length) return { kind: 'forbidden', fields: refused };
	const ctx = await gridContext(farmId);
	return db().transaction(async (trx) => {
		await shareSeasonLockOfPlanting(trx, farmId, id);
		const cur = await trx('plantings').where({ id, farm_id: farmId }).forUpdate().first();
		if (!cur) return { kind: 'not_found' } as const;
		if (cur.version !== version) {
			const current = await getOne(farmId, id, trx);
			return { kind: 'conflict', current: current! } as const;
		}
		const values: PlantingValues = { ...fromColumns(cur), ...changes };
		const limits = await dateLimits(farmId, cur.season_id, trx);
		const dateErrors = limits ? plantingDateErrors(values, Object.keys(changes), limits) : {};
		if (Object.keys(dateErrors).length) return { kind: 'invalid', errors: dateErrors } as const;
		const built = buildRow(
			values,
			ctx.varieties.find((v) => v.id === values.varietyId),
			ctx,
			'',
			storedHarvestDays(cur.first_harvest, cur.last_harvest)
		);
		if (!built.row) return { kind: 'invalid', errors: built.errors } as const;
		await trx('plantings')
			.where({ id, farm_id: farmId })
			.update({ ...built.row, version: version + 1, updated_by: user.id, updated_at: trx.fn.now() });
		return { kind: 'ok', planting: (await getOne(farmId, id, trx))! } as const;
	});
}

/**
 * Removes a planting; returns it as it was, so the grid can offer to put it back (POST).
 * A planting with harvests logged is refused ('has_harvests'): deleting it would take the
 * harvest records with it (ON DELETE CASCADE), and undo could not bring those back.
 */
export async function remove(farmId: number, id: number): Promise<PlantingView | null | 'has_harvests'> {
	return db().transaction(async (trx) => {
		await shareSeasonLockOfPlanting(trx, farmId, id);
		const view = await getOne(farmId, id, trx);
		if (!view) return null;
		const logged = await trx('harvest_records').where({ planting_id: id }).first('id');
		if (logged) return 'has_harvests' as const;
		await trx('plantings').where({ id, farm_id: farmId }).delete();
		return view;
	});
}
