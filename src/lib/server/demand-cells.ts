// The demand screen's weekly cells written: one share size's box contents or a channel's demand,
// cell by cell, a pasted block or a week copied onward. One transaction per call; the whole call is
// refused when any cell is wrong, each bad cell named by crop and week.
import type { Knex } from 'knex';
import { db } from './db';
import { weeksBetween } from '$lib/planning/iso-week';
import { fieldErrors, type FieldErrors } from '$lib/schemas/common';
import {
	cellSchema,
	cellsSchema,
	copyWeekSchema,
	gridSchema,
	type Channel,
	type GridKey,
	type HarvestUnit
} from '$lib/schemas/demand';
import { markDemandChanged, type Season } from './seasons';
import { DemandInputError, getDemand, listCrops, listShareSizes, seasonWeekSpan, type ShareSizeView } from './demand';

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
