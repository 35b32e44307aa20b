// Farm-share box matching: each distribution week's boxes against the forecast, substitutes
// for short items, and the recorded (undoable) swaps the share manager makes.
import {
	applySwaps,
	matchBoxes,
	suggestSubstitutes,
	summarizeMatching,
	type MatchedBox,
	type MatchingSummary,
	type Substitute
} from '$lib/planning';
import type { SwapInput } from '$lib/schemas/forecast';
import { db } from './db';
import { seasonForecast, type ForecastCrop } from './forecast';
import type { Season } from './seasons';

export interface BoxView extends MatchedBox {
	shareName: string;
	/** Substitutes for each short item, by crop id. */
	substitutes: Record<string, Substitute[]>;
}

export interface SwapView {
	id: number;
	shareSizeId: string;
	shareName: string;
	week: string;
	fromCrop: string;
	toCrop: string;
	quantity: number;
	/** Of a substitute in another unit: how much of it per box; null when the same quantity. */
	toQuantity: number | null;
	createdBy: string | null;
	createdAt: string;
	undoneAt: string | null;
	undoneBy: string | null;
}

export interface BoxMatching {
	currentWeek: string;
	crops: Record<string, ForecastCrop>;
	shareSizes: { id: string; name: string; members: number; firstWeek: string; lastWeek: string }[];
	boxes: BoxView[];
	summary: MatchingSummary;
	swaps: SwapView[];
	/** An item is flagged short under this fill, in percent. */
	shortFillPct: number;
}

async function shareNames(farmId: number, seasonId: number): Promise<Map<string, string>> {
	const rows = await db()('share_sizes').where({ farm_id: farmId, season_id: seasonId }).select('id', 'name');
	return new Map(rows.map((r) => [String(r.id), r.name as string]));
}

export async function listSwaps(farmId: number, seasonId: number): Promise<SwapView[]> {
	const rows = await db()('box_swaps as w')
		.join('share_sizes as s', 's.id', 'w.share_size_id')
		.leftJoin('users as u', 'u.id', 'w.created_by')
		.leftJoin('users as x', 'x.id', 'w.undone_by')
		.where({ 'w.farm_id': farmId, 'w.season_id': seasonId })
		.orderBy('w.id', 'desc')
		.select(
			'w.id',
			'w.share_size_id',
			's.name as share',
			'w.week',
			'w.from_crop_id',
			'w.to_crop_id',
			'w.quantity',
			'w.to_quantity',
			'u.name as created_by',
			'w.created_at',
			'w.undone_at',
			'x.name as undone_by'
		);
	return rows.map((r) => ({
		id: r.id,
		shareSizeId: String(r.share_size_id),
		shareName: r.share,
		week: r.week,
		fromCrop: String(r.from_crop_id),
		toCrop: String(r.to_crop_id),
		quantity: Number(r.quantity),
		toQuantity: r.to_quantity === null ? null : Number(r.to_quantity),
		createdBy: r.created_by,
		createdAt: new Date(r.created_at).toISOString(),
		undoneAt: r.undone_at ? new Date(r.undone_at).toISOString() : null,
		undoneBy: r.undone_by
	}));
}

/** The farm's box settings: the fill under which an item is short, and each crop's price per harvest unit (dollars). */
export async function boxSettings(farmId: number): Promise<{ shortFillPct: number; prices: Record<string, number> }> {
	const [farm, crops] = await Promise.all([
		db()('farms').where({ id: farmId }).first('box_short_fill_pct'),
		db()('crops').where({ farm_id: farmId }).whereNotNull('price_cents_per_unit').select('id', 'price_cents_per_unit')
	]);
	return {
		shortFillPct: Number(farm?.box_short_fill_pct ?? 95),
		prices: Object.fromEntries(
			crops.map((c: { id: number; price_cents_per_unit: number }) => [String(c.id), c.price_cents_per_unit / 100])
		)
	};
}

export async function setShortFill(farmId: number, pct: number): Promise<void> {
	await db()('farms').where({ id: farmId }).update({ box_short_fill_pct: pct });
}

export async function matching(farmId: number, season: Season): Promise<BoxMatching> {
	const [f, names, swaps, settings] = await Promise.all([
		seasonForecast(farmId, season),
		shareNames(farmId, season.id),
		listSwaps(farmId, season.id),
		boxSettings(farmId)
	]);
	const crops = Object.fromEntries(f.crops.map((c) => [c.id, c]));
	const unitOf = (id: string): string | undefined => crops[id]?.unit;
	const priceOf = (id: string): number | undefined => settings.prices[id];
	const boxes = matchBoxes(f.rows, f.demand, { shortBelow: settings.shortFillPct / 100 }).map((b) => ({
		...b,
		shareName: names.get(b.shareSizeId) ?? b.shareSizeId,
		substitutes: Object.fromEntries(
			b.items.filter((i) => i.short).map((i) => [i.crop, suggestSubstitutes(f.rows, b, i, unitOf, 3, priceOf)])
		)
	}));
	const inSeason = f.rows.filter((r) => r.week >= f.weeks[0] && r.week <= f.weeks[f.weeks.length - 1]);
	return {
		currentWeek: f.currentWeek,
		crops,
		shareSizes: f.demand.shareSizes.map((s) => ({ ...s, name: names.get(s.id) ?? s.id })),
		boxes,
		summary: summarizeMatching(boxes, inSeason),
		swaps,
		shortFillPct: settings.shortFillPct
	};
}

export type SwapResult = { ok: true; id: number } | { ok: false; errors: Record<string, string> };

/**
 * Records a swap after checking it against the box as it stands (with earlier swaps applied):
 * the share size is this season's, the week one of its distribution weeks, the box holds at
 * least `quantity` of fromCrop, and both crops are the farm's with the same harvest unit.
 */
export async function createSwap(
	farmId: number,
	seasonId: number,
	userId: string,
	input: SwapInput
): Promise<SwapResult> {
	return db().transaction(async (trx): Promise<SwapResult> => {
		const share = await trx('share_sizes')
			.where({ id: input.shareSizeId, farm_id: farmId, season_id: seasonId })
			.first('id', 'first_week', 'last_week');
		if (!share) return { ok: false, errors: { shareSizeId: 'no such share size in this season.' } };
		if (input.week < share.first_week || input.week > share.last_week)
			return { ok: false, errors: { week: `the share is handed out ${share.first_week}–${share.last_week}.` } };
		const crops = await trx('crops')
			.where({ farm_id: farmId })
			.whereIn('id', [input.fromCropId, input.toCropId])
			.select('id', 'harvest_unit');
		const from = crops.find((c) => c.id === input.fromCropId);
		const to = crops.find((c) => c.id === input.toCropId);
		if (!from) return { ok: false, errors: { fromCropId: 'no such crop on this farm.' } };
		if (!to) return { ok: false, errors: { toCropId: 'no such crop on this farm.' } };
		// A crop of another unit goes in by the quantity the share manager confirmed (sized by value).
		if (from.harvest_unit !== to.harvest_unit && input.toQuantity === undefined) {
			return {
				ok: false,
				errors: {
					toQuantity: `is needed: the substitute is counted in ${to.harvest_unit}, the box item in ${from.harvest_unit}.`
				}
			};
		}
		// Lock this box's items and swaps so two swaps at once cannot both take the same quantity.
		const items = await trx('box_items')
			.where({ share_size_id: share.id, week: input.week })
			.forUpdate()
			.select('crop_id', 'quantity');
		const swaps = await trx('box_swaps')
			.where({ share_size_id: share.id, week: input.week })
			.whereNull('undone_at')
			.orderBy('id')
			.forUpdate()
			.select('from_crop_id', 'to_crop_id', 'quantity', 'to_quantity');
		const box = applySwaps(
			{
				shareSizes: [],
				channelDemand: [],
				boxItems: items.map((i) => ({
					shareSizeId: 's',
					week: input.week,
					crop: String(i.crop_id),
					quantity: Number(i.quantity)
				}))
			},
			swaps.map((s) => ({
				shareSizeId: 's',
				week: input.week,
				fromCrop: String(s.from_crop_id),
				toCrop: String(s.to_crop_id),
				quantity: Number(s.quantity),
				...(s.to_quantity === null ? {} : { toQuantity: Number(s.to_quantity) })
			}))
		);
		const held = box.boxItems.find((i) => i.crop === String(input.fromCropId))?.quantity ?? 0;
		if (held <= 0) return { ok: false, errors: { fromCropId: `is not in this box in ${input.week}.` } };
		if (input.quantity > held + 1e-9)
			return { ok: false, errors: { quantity: `the box holds ${held} ${from.harvest_unit} of it.` } };
		const [id] = await trx('box_swaps').insert({
			farm_id: farmId,
			season_id: seasonId,
			share_size_id: share.id,
			week: input.week,
			from_crop_id: input.fromCropId,
			to_crop_id: input.toCropId,
			quantity: input.quantity,
			to_quantity:
				from.harvest_unit !== to.harvest_unit || (input.toQuantity !== undefined && input.toQuantity !== input.quantity)
					? input.toQuantity
					: null,
			created_by: userId
		});
		return { ok: true, id };
	});
}

export type UndoResult = 'undone' | 'missing' | 'already_undone';

/** Marks a swap undone (it stays on record). */
export async function undoSwap(farmId: number, seasonId: number, swapId: number, userId: string): Promise<UndoResult> {
	const swap = await db()('box_swaps')
		.where({ id: swapId, farm_id: farmId, season_id: seasonId })
		.first('id', 'undone_at');
	if (!swap) return 'missing';
	if (swap.undone_at) return 'already_undone';
	const n = await db()('box_swaps')
		.where({ id: swapId })
		.whereNull('undone_at')
		.update({ undone_at: db().fn.now(), undone_by: userId });
	return n ? 'undone' : 'already_undone';
}
