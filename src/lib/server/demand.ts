// What a season must supply: share sizes, box contents and market/restaurant demand: read as the
// demand screen shows it, and share sizes written. The weekly cells are written in demand-cells.ts.
import { db } from './db';
import { isoWeek } from '$lib/planning/iso-week';
import { fieldErrors, type FieldErrors } from '$lib/schemas/common';
import { shareSizeSchema, type Channel, type HarvestUnit, type ShareSizeInput } from '$lib/schemas/demand';
import { markDemandChanged, type Season } from './seasons';

export { targetInput } from './demand-targets';

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
