// The farm's crop library: crops and their varieties.
import type { Knex } from 'knex';
import { db } from './db';
import type { CropInput, VarietyInput } from '$lib/schemas/crop';
import type { StarterCrop } from './starter-library';

import type { CropView, VarietyView } from '$lib/types';
import { listVarieties, shapeOf } from './variety-views';

export type { CropView, VarietyView };
export { curveOf, listVarieties } from './variety-views';

// ---- Editing the library (owner). Every write is scoped by farm; another farm's ids are "not found".

type CropRow = {
	id: number;
	name: string;
	family: string;
	harvest_unit: CropInput['harvestUnit'];
	frost_tolerance: CropInput['frostTolerance'];
	heat_limit_f: string | number | null;
	base_temp_f: string | number;
	price_cents_per_unit: number | null;
	source: string | null;
	archived_at: Date | null;
	harvest_curve: string;
	harvest_cut_interval_days: number | null;
	storage_weeks: number | null;
	storage_loss_per_week: string | number | null;
	sow_from: string | null;
	sow_to: string | null;
};

function toCrop(r: CropRow, varieties: VarietyView[]): CropView {
	return {
		id: r.id,
		name: r.name,
		family: r.family,
		harvestUnit: r.harvest_unit,
		frostTolerance: r.frost_tolerance,
		heatLimitF: r.heat_limit_f === null ? null : Number(r.heat_limit_f),
		baseTempF: Number(r.base_temp_f),
		harvestCurve: shapeOf(r.harvest_curve),
		cutIntervalDays: r.harvest_cut_interval_days,
		storageWeeks: r.storage_weeks,
		sowFrom: r.sow_from ?? null,
		sowTo: r.sow_to ?? null,
		storageLossPct: r.storage_loss_per_week === null ? null : Number(r.storage_loss_per_week),
		price: r.price_cents_per_unit === null ? null : r.price_cents_per_unit / 100,
		source: r.source,
		archived: r.archived_at !== null,
		varieties: varieties.filter((v) => v.cropId === r.id)
	};
}

/** The farm's crops with their varieties, by name; archived ones only when asked for. */
export async function listCrops(farmId: number, opts: { archived?: boolean } = {}): Promise<CropView[]> {
	const q = db()('crops').where({ farm_id: farmId }).orderBy('name');
	if (!opts.archived) q.whereNull('archived_at');
	const [rows, varieties] = await Promise.all([q.select<CropRow[]>('*'), listVarieties(farmId)]);
	return rows.map((r) =>
		toCrop(
			r,
			varieties.filter((v) => opts.archived || !v.archived)
		)
	);
}

export async function getCrop(farmId: number, cropId: number): Promise<CropView | null> {
	const r = await db()('crops').where({ farm_id: farmId, id: cropId }).first<CropRow | undefined>();
	if (!r) return null;
	return toCrop(r, await listVarieties(farmId));
}

/** The harvest unit of each of these crops of the farm (a crop of another farm is left out). */
export async function harvestUnits(farmId: number, cropIds: number[]): Promise<Map<number, string>> {
	const rows = await db()('crops')
		.where({ farm_id: farmId })
		.whereIn('id', cropIds)
		.select<{ id: number; harvest_unit: string }[]>('id', 'harvest_unit');
	return new Map(rows.map((r) => [r.id, r.harvest_unit]));
}

export class LibraryInputError extends Error {
	constructor(
		public field: string,
		message: string,
		public status: 400 | 404 | 409 = 400
	) {
		super(message);
	}
}

function isDuplicate(e: unknown): boolean {
	return typeof e === 'object' && e !== null && (e as { code?: string }).code === 'ER_DUP_ENTRY';
}

/** What a starter crop leaves at its default. */
const STARTER_CROP_EXTRAS: Pick<CropInput, 'harvestCurve' | 'cutIntervalDays' | 'storageWeeks' | 'storageLossPct'> &
	Pick<CropInput, 'sowFrom' | 'sowTo'> = {
	...{ harvestCurve: 'flat', cutIntervalDays: null, storageWeeks: null, storageLossPct: null },
	...{ sowFrom: null, sowTo: null }
};

/** A write whose clash with a name already in the library becomes the 409 that names the field. */
async function uniqueName<T>(write: () => Promise<T>, message: string): Promise<T> {
	try {
		return await write();
	} catch (e) {
		if (isDuplicate(e)) throw new LibraryInputError('name', message, 409);
		throw e;
	}
}
const cropTaken = (c: CropInput): string => `The library already has a crop named "${c.name}".`;
const varietyTaken = (v: VarietyInput): string => `This crop already has a variety named "${v.name}".`;

function cropColumns(input: CropInput) {
	return {
		name: input.name,
		family: input.family,
		harvest_unit: input.harvestUnit,
		frost_tolerance: input.frostTolerance,
		heat_limit_f: input.heatLimitF,
		base_temp_f: input.baseTempF,
		price_cents_per_unit: input.price === null ? null : Math.round(input.price * 100),
		source: input.source,
		harvest_curve: input.harvestCurve,
		harvest_cut_interval_days: input.cutIntervalDays,
		storage_weeks: input.storageWeeks,
		sow_from: input.sowFrom,
		sow_to: input.sowTo,
		storage_loss_per_week: input.storageLossPct
	};
}

export async function createCrop(
	farmId: number,
	input: CropInput,
	trx: Knex | Knex.Transaction = db()
): Promise<number> {
	return uniqueName(
		async () => (await trx('crops').insert({ farm_id: farmId, ...cropColumns(input) }))[0],
		cropTaken(input)
	);
}

/**
 * Changes a crop. Its harvest unit may change only while nothing counts in the old one (no demand,
 * box contents or harvest records), since those quantities would silently change meaning.
 */
export async function updateCrop(farmId: number, cropId: number, input: CropInput): Promise<boolean> {
	return db().transaction(async (trx) => {
		const old = await trx('crops').where({ farm_id: farmId, id: cropId }).forUpdate().first('harvest_unit');
		if (!old) return false;
		if (old.harvest_unit !== input.harvestUnit) {
			const [box, channel, logged] = await Promise.all([
				trx('box_items').where({ crop_id: cropId }).first('id'),
				trx('channel_demand').where({ farm_id: farmId, crop_id: cropId }).first('id'),
				trx('harvest_records as h')
					.join('plantings as p', 'p.id', 'h.planting_id')
					.join('varieties as v', 'v.id', 'p.variety_id')
					.where('v.crop_id', cropId)
					.first('h.id')
			]);
			if (box || channel || logged) {
				throw new LibraryInputError(
					'harvestUnit',
					`Harvest unit stays ${old.harvest_unit}: demand, box contents or logged harvests already count this crop in ${old.harvest_unit}.`
				);
			}
		}
		await uniqueName(
			() => trx('crops').where({ farm_id: farmId, id: cropId }).update(cropColumns(input)),
			cropTaken(input)
		);
		return true;
	});
}

/** Archives a crop or variety (or brings it back); false when the farm has no such row. */
async function setArchived(
	table: 'crops' | 'varieties',
	farmId: number,
	id: number,
	archived: boolean
): Promise<boolean> {
	return (
		(await db()(table)
			.where({ farm_id: farmId, id })
			.update({ archived_at: archived ? db().fn.now() : null })) > 0
	);
}

export const setCropArchived = (farmId: number, cropId: number, archived: boolean): Promise<boolean> =>
	setArchived('crops', farmId, cropId, archived);

export const setVarietyArchived = (farmId: number, varietyId: number, archived: boolean): Promise<boolean> =>
	setArchived('varieties', farmId, varietyId, archived);

function varietyColumns(input: VarietyInput) {
	return {
		name: input.name,
		method: input.method,
		days_to_maturity: input.daysToMaturity,
		days_in_tray: input.daysInTray,
		harvest_window_days: input.harvestWindowDays,
		yield_per_bed_foot: input.yieldPerBedFoot,
		rows_per_bed: input.rows,
		in_row_spacing_in: input.inRowSpacingIn,
		seeds_per_spot: input.seedsPerSpot,
		germination_rate: input.germinationRate,
		seeds_per_gram: input.seedsPerGram,
		seed_price_cents_per_gram: Math.round(input.seedPrice * 100),
		seeds_per_packet: input.seedsPerPacket,
		cells_per_tray: input.cellsPerTray,
		margin: input.margin,
		gdd_to_maturity: input.gddToMaturity,
		source: input.source,
		harvest_curve: input.harvestCurve === '' ? null : input.harvestCurve
	};
}

export async function createVariety(
	farmId: number,
	cropId: number,
	input: VarietyInput,
	trx: Knex | Knex.Transaction = db()
): Promise<number> {
	if (!(await trx('crops').where({ farm_id: farmId, id: cropId }).first('id')))
		throw new LibraryInputError('_form', "That crop is not in this farm's library.", 404);
	return uniqueName(
		async () => (await trx('varieties').insert({ farm_id: farmId, crop_id: cropId, ...varietyColumns(input) }))[0],
		varietyTaken(input)
	);
}

/** Changes a variety's figures. Plantings already made keep the figures they were planned with. */
export async function updateVariety(farmId: number, varietyId: number, input: VarietyInput): Promise<boolean> {
	return uniqueName(
		async () => (await db()('varieties').where({ farm_id: farmId, id: varietyId }).update(varietyColumns(input))) > 0,
		varietyTaken(input)
	);
}

export type RemoveResult =
	{ ok: true } | { ok: false; status: 404 } | { ok: false; status: 409; plantings: number; seasons: string[] };

/** Deletes a variety no planting uses; one that plantings use is refused with how many and where. */
export async function removeVariety(farmId: number, varietyId: number): Promise<RemoveResult> {
	return db().transaction(async (trx) => {
		const v = await trx('varieties').where({ farm_id: farmId, id: varietyId }).forUpdate().first('id');
		if (!v) return { ok: false, status: 404 } as const;
		const used: { name: string; n: number | string }[] = await trx('plantings as p')
			.join('seasons as s', 's.id', 'p.season_id')
			.where({ 'p.farm_id': farmId, 'p.variety_id': varietyId })
			.groupBy('s.id', 's.name')
			.select('s.name')
			.count({ n: '*' });
		if (used.length)
			return {
				ok: false,
				status: 409,
				plantings: used.reduce((a, u) => a + Number(u.n), 0),
				seasons: used.map((u) => u.name)
			} as const;
		await trx('variety_figure_changes').where({ farm_id: farmId, variety_id: varietyId }).delete();
		await trx('varieties').where({ farm_id: farmId, id: varietyId }).delete();
		return { ok: true } as const;
	});
}

export interface StarterResult {
	crops: string[];
	varieties: number;
	/** Picked crops whose name the farm's library already holds: left as the farm has them. */
	skipped: string[];
}

/** Copies the picked starter crops, with their varieties and sources, into the farm's library. */
export async function addStarterCrops(farmId: number, picked: StarterCrop[]): Promise<StarterResult> {
	return db().transaction(async (trx) => {
		const existing = new Set(
			(await trx('crops').where({ farm_id: farmId }).select('name')).map((r: { name: string }) => r.name.toLowerCase())
		);
		const out: StarterResult = { crops: [], varieties: 0, skipped: [] };
		for (const c of picked) {
			if (existing.has(c.name.toLowerCase())) {
				out.skipped.push(c.name);
				continue;
			}
			const { key: _key, varieties, ...crop } = c;
			const cropId = await createCrop(farmId, { ...STARTER_CROP_EXTRAS, ...crop, price: null }, trx);
			for (const sv of varieties) {
				await createVariety(
					farmId,
					cropId,
					{ ...sv, harvestCurve: '', seedPrice: 0, seedsPerPacket: null, gddToMaturity: null },
					trx
				);
				out.varieties++;
			}
			out.crops.push(c.name);
		}
		return out;
	});
}
