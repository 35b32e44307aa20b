// What a season must supply: share sizes, box contents and market/restaurant demand, in the
// engine's shape (crops by id), for target derivation.
import type { TargetInput } from '$lib/planning';
import { db } from './db';
import type { Knex } from 'knex';
import { isoWeek, weeksBetween } from '$lib/planning/iso-week';
import { fieldErrors, type FieldErrors } from '$lib/schemas/common';
import {
	cellSchema,
	cellsSchema,
	copyWeekSchema,
	gridSchema,
	shareSizeSchema,
	type Channel,
	type GridKey,
	type HarvestUnit,
	type ShareSizeInput
} from '$lib/schemas/demand';
import { markDemandChanged, type Season } from './seasons';

export async function targetInput(farmId: number, seasonId: number): Promise<TargetInput> {
	const [shares, items, channels] = await Promise.all([
		db()('share_sizes')
			.where({ farm_id: farmId, season_id: seasonId })
			.select('id', 'members', 'first_week', 'last_week'),
		db()('box_items as i')
			.join('share_sizes as s', 's.id', 'i.share_size_id')
			.where({ 's.farm_id': farmId, 's.season_id': seasonId })
			.select('i.share_size_id', 'i.week', 'i.crop_id', 'i.quantity'),
		db()('channel_demand').where({ farm_id: farmId, season_id: seasonId }).select('crop_id', 'week', 'quantity')
	]);
	return {
		shareSizes: shares.map((s) => ({
			id: String(s.id),
			members: s.members,
			firstWeek: s.first_week,
			lastWeek: s.last_week
		})),
		boxItems: items.map((i) => ({
			shareSizeId: String(i.share_size_id),
			week: i.week,
			crop: String(i.crop_id),
			quantity: Number(i.quantity)
		})),
		channelDemand: channels.map((c) => ({ crop: String(c.crop_id), week: c.week, quantity: Number(c.quantity) }))
	};
}

// ---- Editing demand -------------------------------------------------------------------------
// Everything below writes in one transaction per call, and refuses the whole call when any
// part is wrong, with each bad field (or cell, by crop and week) named.

export interface ShareSizeView {
	id: number;
	name: string;
	members: number;
	firstWeek: string;
	lastWeek: string;
	pickupDays: string[];
	priceCents: number;
}

export interface DemandCrop {
	id: number;
	name: string;
	family: string;
	unit: HarvestUnit;
}

export interface BoxItemView {
	shareSizeId: number;
	week: string;
	cropId: number;
	quantity: number;
	unit: HarvestUnit;
}

export interface ChannelDemandView {
	channel: Channel;
	cropId: number;
	week: string;
	quantity: number;
}

export interface DemandView {
	shareSizes: ShareSizeView[];
	boxItems: BoxItemView[];
	channelDemand: ChannelDemandView[];
	crops: DemandCrop[];
}

/** A refused write: `errors` name each bad field; status is 400, 404 (not this farm's) or 409. */
export class DemandInputError extends Error {
	constructor(
		readonly errors: FieldErrors,
		readonly status: 400 | 404 | 409 = 400
	) {
		super(
			Object.entries(errors)
				.map(([k, v]) => `${k}: ${v}`)
				.join('; ')
		);
	}
}

/** The season's weeks, first to last, as ISO weeks (1 January may fall in the year before's W53). */
export function seasonWeekSpan(season: Season): { first: string; last: string } {
	return { first: isoWeek(season.startsOn), last: isoWeek(season.endsOn) };
}

export async function listCrops(farmId: number): Promise<DemandCrop[]> {
	const rows = await db()('crops')
		.where({ farm_id: farmId })
		.orderBy('name')
		.select('id', 'name', 'family', 'harvest_unit');
	return rows.map((r) => ({ id: r.id, name: r.name, family: r.family, unit: r.harvest_unit }));
}

export async function listShareSizes(farmId: number, seasonId: number): Promise<ShareSizeView[]> {
	const rows = await db()('share_sizes')
		.where({ farm_id: farmId, season_id: seasonId })
		.orderBy([{ column: 'first_week' }, { column: 'name' }]);
	return rows.map((r) => ({
		id: r.id,
		name: r.name,
		members: r.members,
		firstWeek: r.first_week,
		lastWeek: r.last_week,
		pickupDays: r.pickup_days ? String(r.pickup_days).split(/,\s*/).filter(Boolean) : [],
		priceCents: r.price_cents
	}));
}

export async function getDemand(farmId: number, seasonId: number): Promise<DemandView> {
	const [shareSizes, items, channelRows, crops] = await Promise.all([
		listShareSizes(farmId, seasonId),
		db()('box_items as i')
			.join('share_sizes as s', 's.id', 'i.share_size_id')
			.where({ 's.farm_id': farmId, 's.season_id': seasonId })
			.orderBy(['i.share_size_id', 'i.week', 'i.crop_id'])
			.select('i.share_size_id', 'i.week', 'i.crop_id', 'i.quantity', 'i.unit'),
		db()('channel_demand')
			.where({ farm_id: farmId, season_id: seasonId })
			.orderBy(['channel', 'week', 'crop_id'])
			.select('channel', 'crop_id', 'week', 'quantity'),
		listCrops(farmId)
	]);
	return {
		shareSizes,
		boxItems: items.map((i) => ({
			shareSizeId: i.share_size_id,
			week: i.week,
			cropId: i.crop_id,
			quantity: Number(i.quantity),
			unit: i.unit
		})),
		channelDemand: channelRows.map((c) => ({
			channel: c.channel,
			cropId: c.crop_id,
			week: c.week,
			quantity: Number(c.quantity)
		})),
		crops
	};
}

function parseShare(raw: unknown, season: Season): ShareSizeInput {
	const parsed = shareSizeSchema.safeParse(raw);
	if (!parsed.success) throw new DemandInputError(fieldErrors(parsed.error));
	const span = seasonWeekSpan(season);
	const errors: FieldErrors = {};
	for (const f of ['firstWeek', 'lastWeek'] as const) {
		const w = parsed.data[f];
		if (w < span.first || w > span.last)
			errors[f] =
				`${f === 'firstWeek' ? 'First' : 'Last'} week must fall in ${season.name} (${span.first}–${span.last}).`;
	}
	if (Object.keys(errors).length) throw new DemandInputError(errors);
	return parsed.data;
}

function shareRow(input: ShareSizeInput): Record<string, unknown> {
	return {
		name: input.name,
		members: input.members,
		first_week: input.firstWeek,
		last_week: input.lastWeek,
		pickup_days: input.pickupDays.join(', '),
		price_cents: input.price
	};
}

function isDuplicate(e: unknown): boolean {
	return typeof e === 'object' && e !== null && (e as { code?: string }).code === 'ER_DUP_ENTRY';
}

/** Adds a share size; a name already used in the season is a 409 naming `name`. */
export async function createShareSize(farmId: number, season: Season, raw: unknown): Promise<ShareSizeView> {
	const input = parseShare(raw, season);
	try {
		const [id] = await db()('share_sizes').insert({ farm_id: farmId, season_id: season.id, ...shareRow(input) });
		await markDemandChanged(farmId, season.id);
		return (await listShareSizes(farmId, season.id)).find((s) => s.id === id)!;
	} catch (e) {
		if (isDuplicate(e))
			throw new DemandInputError({ name: `This season already has a share size named ${input.name}.` }, 409);
		throw e;
	}
}

/** Changes a share size; null when it is not this farm's in this season. */
export async function updateShareSize(
	farmId: number,
	season: Season,
	id: number,
	raw: unknown
): Promise<ShareSizeView | null> {
	const input = parseShare(raw, season);
	try {
		const n = await db()('share_sizes').where({ id, farm_id: farmId, season_id: season.id }).update(shareRow(input));
		if (n === 0) return null;
		await markDemandChanged(farmId, season.id);
	} catch (e) {
		if (isDuplicate(e))
			throw new DemandInputError({ name: `This season already has a share size named ${input.name}.` }, 409);
		throw e;
	}
	return (await listShareSizes(farmId, season.id)).find((s) => s.id === id) ?? null;
}

/** Removes a share size and its box contents (the foreign key cascades). */
export async function removeShareSize(farmId: number, seasonId: number, id: number): Promise<boolean> {
	const removed = (await db()('share_sizes').where({ id, farm_id: farmId, season_id: seasonId }).delete()) > 0;
	if (removed) await markDemandChanged(farmId, seasonId);
	return removed;
}

export interface GridTarget {
	kind: 'share' | 'channel';
	share?: ShareSizeView;
	channel?: Channel;
	label: string;
	first: string;
	last: string;
}

export async function resolveGrid(farmId: number, season: Season, grid: GridKey): Promise<GridTarget> {
	if (grid === 'market' || grid === 'restaurant') {
		const span = seasonWeekSpan(season);
		return { kind: 'channel', channel: grid, label: grid === 'market' ? 'Market' : 'Restaurants', ...span };
	}
	const id = Number(grid.slice('share:'.length));
	const share = (await listShareSizes(farmId, season.id)).find((s) => s.id === id);
	if (!share) throw new DemandInputError({ grid: 'No such share size in this season.' }, 404);
	return { kind: 'share', share, label: share.name, first: share.firstWeek, last: share.lastWeek };
}

export function outside(target: GridTarget, week: string): string | null {
	if (week >= target.first && week <= target.last) return null;
	return target.kind === 'share'
		? `outside ${target.label}'s distribution weeks ${target.first}–${target.last}`
		: `outside the season's weeks ${target.first}–${target.last}`;
}

/** Rows to write for one grid: upserts for set cells, deletes for cleared ones. */
export interface GridWrite {
	target: GridTarget;
	set: { cropId: number; week: string; quantity: number; unit: HarvestUnit }[];
	clear: { cropId: number; week: string }[];
}

async function writeGrid(trx: Knex.Transaction, farmId: number, seasonId: number, w: GridWrite): Promise<void> {
	const byWeek = new Map<string, number[]>();
	for (const c of w.clear) byWeek.set(c.week, [...(byWeek.get(c.week) ?? []), c.cropId]);
	if (w.target.kind === 'share') {
		const shareId = w.target.share!.id;
		for (const [week, crops] of byWeek)
			await trx('box_items').where({ share_size_id: shareId, week }).whereIn('crop_id', crops).delete();
		if (w.set.length)
			await trx('box_items')
				.insert(
					w.set.map((c) => ({
						share_size_id: shareId,
						week: c.week,
						crop_id: c.cropId,
						quantity: c.quantity,
						unit: c.unit
					}))
				)
				.onConflict(['share_size_id', 'week', 'crop_id'])
				.merge(['quantity', 'unit']);
	} else {
		const channel = w.target.channel!;
		for (const [week, crops] of byWeek)
			await trx('channel_demand')
				.where({ farm_id: farmId, season_id: seasonId, channel, week })
				.whereIn('crop_id', crops)
				.delete();
		if (w.set.length)
			await trx('channel_demand')
				.insert(
					w.set.map((c) => ({
						farm_id: farmId,
						season_id: seasonId,
						channel,
						crop_id: c.cropId,
						week: c.week,
						quantity: c.quantity
					}))
				)
				.onConflict(['season_id', 'channel', 'crop_id', 'week'])
				.merge(['quantity']);
	}
}

/** Several grid writes in one transaction: all of them or none. */
export async function writeGrids(
	farmId: number,
	seasonId: number,
	writes: GridWrite[],
	replaceAll = false
): Promise<void> {
	await db().transaction(async (trx) => {
		if (replaceAll) {
			const shareIds = (await trx('share_sizes').where({ farm_id: farmId, season_id: seasonId }).select('id')).map(
				(r) => r.id
			);
			if (shareIds.length) await trx('box_items').whereIn('share_size_id', shareIds).delete();
			await trx('channel_demand').where({ farm_id: farmId, season_id: seasonId }).delete();
		}
		for (const w of writes) await writeGrid(trx, farmId, seasonId, w);
		await markDemandChanged(farmId, seasonId, trx);
	});
}

/**
 * Sets the listed cells of one grid (an empty or zero quantity clears the cell). Each bad cell
 * is named `cells.<i>.<field>` with its crop and week in the message; nothing is written then.
 */
export async function saveCells(
	farmId: number,
	season: Season,
	raw: unknown
): Promise<{ set: number; cleared: number }> {
	const crops = new Map((await listCrops(farmId)).map((c) => [c.id, c]));
	const rawCells = (raw as { cells?: unknown })?.cells;
	const where = (i: number): string => {
		const c = Array.isArray(rawCells) ? (rawCells[i] as { crop?: unknown; week?: unknown } | undefined) : undefined;
		const crop = crops.get(Number(c?.crop));
		return `${crop ? crop.name : `crop ${String(c?.crop ?? '?')}`}, ${String(c?.week ?? '?')}`;
	};
	const errors: FieldErrors = {};
	const parsed = cellsSchema.safeParse(raw);
	if (!parsed.success) {
		for (const issue of parsed.error.issues) {
			const key = issue.path.join('.') || '_form';
			const i = issue.path[0] === 'cells' && typeof issue.path[1] === 'number' ? issue.path[1] : null;
			errors[key] ??= i === null ? issue.message : `${where(i)}: ${issue.message}`;
		}
	}
	// Cells that are well-formed on their own are still checked against the library and the
	// weeks, so one answer names every bad cell, not just the first kind of mistake.
	const grid = gridSchema.safeParse((raw as { grid?: unknown })?.grid);
	if (!grid.success || !Array.isArray(rawCells)) throw new DemandInputError(errors);
	const target = await resolveGrid(farmId, season, grid.data);
	const write: GridWrite = { target, set: [], clear: [] };
	const seen = new Map<string, number>();
	rawCells.forEach((rawCell, i) => {
		const one = cellSchema.safeParse(rawCell);
		if (!one.success) return;
		const c = one.data;
		const crop = crops.get(c.crop);
		if (!crop) return void (errors[`cells.${i}.crop`] = `${where(i)}: no such crop in this farm's library.`);
		const away = outside(target, c.week);
		if (away) return void (errors[`cells.${i}.week`] = `${where(i)}: ${away}.`);
		if (c.unit !== crop.unit)
			return void (errors[`cells.${i}.unit`] =
				`${where(i)}: unit must be ${crop.unit}, ${crop.name}'s harvest unit (got ${c.unit}).`);
		const k = `${c.crop}|${c.week}`;
		if (seen.has(k))
			return void (errors[`cells.${i}.week`] =
				`${where(i)}: the same cell is listed twice (also cell ${seen.get(k)}).`);
		seen.set(k, i);
		// Sent as it was when the editor opened it: not the editor's change, so not written.
		if (c.was !== undefined && (c.quantity ?? 0) === (c.was ?? 0)) return;
		if (c.quantity === null || c.quantity === 0) write.clear.push({ cropId: c.crop, week: c.week });
		else write.set.push({ cropId: c.crop, week: c.week, quantity: c.quantity, unit: crop.unit });
	});
	if (Object.keys(errors).length) throw new DemandInputError(errors);
	await writeGrids(farmId, season.id, [write]);
	return { set: write.set.length, cleared: write.clear.length };
}

/** Copies one week's column of a grid onto every week of a range (replacing what they held). */
export async function copyWeek(
	farmId: number,
	season: Season,
	raw: unknown
): Promise<{ weeks: number; cells: number }> {
	const parsed = copyWeekSchema.safeParse(raw);
	if (!parsed.success) throw new DemandInputError(fieldErrors(parsed.error));
	const { grid, fromWeek, toFirst, toLast } = parsed.data;
	const target = await resolveGrid(farmId, season, grid);
	const errors: FieldErrors = {};
	for (const [field, week] of [
		['fromWeek', fromWeek],
		['toFirst', toFirst],
		['toLast', toLast]
	] as const) {
		const away = outside(target, week);
		if (away) errors[field] = `${week} is ${away}.`;
	}
	if (Object.keys(errors).length) throw new DemandInputError(errors);
	const view = await getDemand(farmId, season.id);
	const source =
		target.kind === 'share'
			? view.boxItems
					.filter((b) => b.shareSizeId === target.share!.id && b.week === fromWeek)
					.map((b) => ({ cropId: b.cropId, quantity: b.quantity, unit: b.unit }))
			: view.channelDemand
					.filter((c) => c.channel === target.channel && c.week === fromWeek)
					.map((c) => ({
						cropId: c.cropId,
						quantity: c.quantity,
						unit: view.crops.find((k) => k.id === c.cropId)!.unit
					}));
	const weeks = weeksBetween(toFirst, toLast).filter((w) => w !== fromWeek);
	const existing =
		target.kind === 'share'
			? view.boxItems.filter((b) => b.shareSizeId === target.share!.id)
			: view.channelDemand.filter((c) => c.channel === target.channel);
	const write: GridWrite = { target, set: [], clear: [] };
	for (const week of weeks) {
		for (const e of existing)
			if (e.week === week && !source.some((s) => s.cropId === e.cropId)) write.clear.push({ cropId: e.cropId, week });
		for (const s of source) write.set.push({ ...s, week });
	}
	await writeGrids(farmId, season.id, [write]);
	return { weeks: weeks.length, cells: write.set.length };
}
