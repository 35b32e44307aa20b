import { forecast, type ForecastPlanting, type ForecastRow } from './forecast';
import { isoWeek, weekStart, addDays } from './iso-week';
import type { BoxItem, TargetInput } from './targets';
import type { CropWeekQuantity } from './types';

/**
 * A recorded substitution: `quantity` per box of `fromCrop` becomes `toQuantity` of `toCrop`
 * (in toCrop's own unit; the same quantity when left out, for crops of the same unit).
 */
export interface BoxSwap {
	key?: string;
	shareSizeId: string;
	week: string;
	fromCrop: string;
	toCrop: string;
	quantity: number;
	toQuantity?: number;
}

export interface MatchedItem {
	crop: string;
	/** Per box, in the crop's harvest unit. */
	perBox: number;
	/** members × perBox: what this share size's boxes take. */
	need: number;
	/** The crop's supply that week (all plantings). */
	supply: number;
	/** The crop's total demand that week (every share size and channel). */
	demand: number;
	/** Fraction of demand the supply covers, 0–1; the same for every box and channel that takes the crop. */
	fill: number;
	short: boolean;
}

export interface MatchedBox {
	shareSizeId: string;
	week: string;
	members: number;
	items: MatchedItem[];
	/** Mean of the items' fills: each item counts alike, since their units differ. */
	fill: number;
	fillable: boolean;
}

export interface Substitute {
	crop: string;
	/** Suggested quantity per box of the substitute, in its own unit, rounded to that unit's step. */
	quantity: number;
	/** How much of the short item it replaces per box (equal to `quantity` in the same unit). */
	fromQuantity: number;
	/** True when the substitute is counted in another unit and sized by value (price per unit). */
	byValue: boolean;
	/** The substitute's surplus that week before the swap. */
	surplus: number;
	/** Whether the swap alone lifts the short crop to full supply. */
	covers: boolean;
}

const EPS = 1e-9;
const key = (...parts: string[]): string => parts.join('\u0000');
const tidy = (x: number): number => Math.round(x * 1e6) / 1e6;

/** Box quantities move in quarter pounds, or in whole bunches, heads and pieces. */
export function swapStep(unit: string): number {
	return unit === 'lb' ? 0.25 : 1;
}

/**
 * Box contents after the recorded swaps, applied in the order given. A swap moves at most
 * what the box still holds of its fromCrop, so undoing an earlier swap never leaves a
 * negative quantity behind.
 */
export function applySwaps(input: TargetInput, swaps: BoxSwap[]): TargetInput {
	const items = new Map<string, BoxItem>();
	for (const b of input.boxItems) {
		const k = key(b.shareSizeId, b.week, b.crop);
		const seen = items.get(k);
		if (seen) seen.quantity += b.quantity;
		else items.set(k, { ...b });
	}
	for (const s of swaps) {
		const from = items.get(key(s.shareSizeId, s.week, s.fromCrop));
		const moved = Math.min(s.quantity, from?.quantity ?? 0);
		if (!from || moved <= 0 || s.toCrop === s.fromCrop) continue;
		from.quantity = tidy(from.quantity - moved);
		// Of another unit, the substitute comes in proportion to what was actually moved.
		const added = s.toQuantity === undefined ? moved : tidy((s.toQuantity * moved) / s.quantity);
		const kTo = key(s.shareSizeId, s.week, s.toCrop);
		const to = items.get(kTo);
		if (to) to.quantity = tidy(to.quantity + added);
		else items.set(kTo, { shareSizeId: s.shareSizeId, week: s.week, crop: s.toCrop, quantity: added });
	}
	return { ...input, boxItems: [...items.values()].filter((i) => i.quantity > 0) };
}

/**
 * Every share size's box in every distribution week with items: each item's supply, need
 * and fill. A short crop is shared out in proportion (fill = supply ÷ total demand), the
 * same fraction `checkBoxes` reports; who actually gets less is the share manager's call.
 */
export function matchBoxes(rows: ForecastRow[], input: TargetInput, opts: { shortBelow?: number } = {}): MatchedBox[] {
	// An item is short when its fill is under this fraction (the share manager's setting; 1 = any shortfall).
	const shortBelow = opts.shortBelow ?? 1;
	const byCropWeek = new Map(rows.map((r) => [key(r.crop, r.week), r]));
	const shares = new Map(input.shareSizes.map((s) => [s.id, s]));
	const boxes = new Map<string, MatchedBox>();
	for (const item of input.boxItems) {
		const share = shares.get(item.shareSizeId);
		if (!share || item.week < share.firstWeek || item.week > share.lastWeek || item.quantity <= 0) continue;
		const k = key(item.week, item.shareSizeId);
		let box = boxes.get(k);
		if (!box)
			boxes.set(
				k,
				(box = { shareSizeId: share.id, week: item.week, members: share.members, items: [], fill: 1, fillable: true })
			);
		const row = byCropWeek.get(key(item.crop, item.week));
		const supply = row?.supply ?? 0;
		const demand = row?.demand ?? share.members * item.quantity;
		const fill = demand > 0 ? Math.min(1, supply / demand) : 1;
		box.items.push({
			crop: item.crop,
			perBox: item.quantity,
			need: share.members * item.quantity,
			supply,
			demand,
			fill,
			short: fill < shortBelow - EPS
		});
	}
	const out = [...boxes.values()];
	for (const b of out) {
		b.fill = b.items.reduce((t, i) => t + i.fill, 0) / b.items.length;
		b.fillable = b.items.every((i) => !i.short);
	}
	return out.sort((a, b) =>
		a.week < b.week
			? -1
			: a.week > b.week
				? 1
				: a.shareSizeId < b.shareSizeId
					? -1
					: a.shareSizeId > b.shareSizeId
						? 1
						: 0
	);
}

/**
 * Substitutes for a short item: crops with surplus that week. In the same harvest unit, the
 * suggested quantity per box is what would close the crop's whole shortfall through this
 * share size (rounded up to the unit's step, at most the item's quantity), cut down to what
 * the substitute's surplus can give every member. A crop of another unit is offered only when
 * both crops have a price per harvest unit (`priceOf`): the same value of it, rounded to its
 * unit's step (so "0.5 lb at $4" becomes "1 bunch at $2"); the share manager confirms the
 * quantity. Best first: those that cover, then same unit, then by surplus.
 */
export function suggestSubstitutes(
	rows: ForecastRow[],
	box: MatchedBox,
	item: MatchedItem,
	unitOf: (crop: string) => string | undefined,
	limit = 3,
	priceOf: (crop: string) => number | null | undefined = () => undefined
): Substitute[] {
	if (!item.short || box.members <= 0) return [];
	const unit = unitOf(item.crop);
	if (!unit) return [];
	const step = swapStep(unit);
	const shortfall = item.demand - item.supply;
	const want = Math.min(item.perBox, Math.ceil(shortfall / box.members / step - EPS) * step);
	const fromPrice = priceOf(item.crop);
	const out: Substitute[] = [];
	for (const r of rows) {
		if (r.week !== box.week || r.crop === item.crop || r.surplus <= EPS) continue;
		const toUnit = unitOf(r.crop);
		if (!toUnit) continue;
		const toStep = swapStep(toUnit);
		const most = Math.floor(r.surplus / box.members / toStep + EPS) * toStep;
		if (toUnit === unit) {
			const quantity = tidy(Math.min(want, most));
			if (quantity <= 0) continue;
			out.push({
				crop: r.crop,
				quantity,
				fromQuantity: quantity,
				byValue: false,
				surplus: r.surplus,
				covers: box.members * quantity >= shortfall - EPS
			});
			continue;
		}
		const toPrice = priceOf(r.crop);
		if (!fromPrice || !toPrice || fromPrice <= 0 || toPrice <= 0) continue;
		// The same value per box, to the nearest step of the substitute's unit (at least one step).
		const quantity = tidy(Math.min(most, Math.max(toStep, Math.round((want * fromPrice) / toPrice / toStep) * toStep)));
		if (quantity <= 0) continue;
		// What that quantity is worth in the short item, rounded down to its step and at most what the box holds.
		const fromQuantity = tidy(
			Math.min(item.perBox, Math.max(step, Math.floor((quantity * toPrice) / fromPrice / step + EPS) * step))
		);
		out.push({
			crop: r.crop,
			quantity,
			fromQuantity,
			byValue: true,
			surplus: r.surplus,
			covers: box.members * fromQuantity >= shortfall - EPS
		});
	}
	out.sort(
		(a, b) =>
			Number(b.covers) - Number(a.covers) ||
			Number(a.byValue) - Number(b.byValue) ||
			b.surplus - a.surplus ||
			(a.crop < b.crop ? -1 : 1)
	);
	return out.slice(0, limit);
}

export interface MatchingSummary {
	boxes: number;
	boxesFilled: number;
	/** Distribution weeks with at least one box, and those where every box fills. */
	weeks: number;
	weeksFilled: number;
	/** Mean of the boxes' fills, 0–1 (1 when there are no boxes). */
	averageFill: number;
	/** Σ weekly surplus per crop over the rows given: what the stand or restaurants could take. */
	surplusByCrop: { crop: string; surplus: number }[];
}

export function summarizeMatching(boxes: MatchedBox[], rows: ForecastRow[]): MatchingSummary {
	const weekOk = new Map<string, boolean>();
	for (const b of boxes) weekOk.set(b.week, (weekOk.get(b.week) ?? true) && b.fillable);
	const surplus = new Map<string, number>();
	for (const r of rows) if (r.surplus > 0) surplus.set(r.crop, (surplus.get(r.crop) ?? 0) + r.surplus);
	return {
		boxes: boxes.length,
		boxesFilled: boxes.filter((b) => b.fillable).length,
		weeks: weekOk.size,
		weeksFilled: [...weekOk.values()].filter(Boolean).length,
		averageFill: boxes.length ? boxes.reduce((t, b) => t + b.fill, 0) / boxes.length : 1,
		surplusByCrop: [...surplus]
			.map(([crop, s]) => ({ crop, surplus: s }))
			.sort((a, b) => b.surplus - a.surplus || (a.crop < b.crop ? -1 : 1))
	};
}

/** A logged harvest, by the planting's key. */
export interface ActualHarvest {
	key: string;
	crop: string;
	date: string;
	quantity: number;
}

/**
 * Weekly supply per crop where logged harvests replace the forecast: in a week before
 * `beforeWeek`, a planting with harvests logged in that week counts what was logged instead
 * of its forecast share. Plantings with nothing logged keep their forecast. Returns the supply
 * and which crop-weeks hold actual figures.
 */
export function supplyWithActuals(
	plantings: ForecastPlanting[],
	actuals: ActualHarvest[],
	beforeWeek: string
): { supply: CropWeekQuantity[]; actual: Set<string> } {
	const logged = new Map<string, { crop: string; week: string; quantity: number }>();
	for (const a of actuals) {
		const week = isoWeek(a.date);
		if (week >= beforeWeek) continue;
		// A harvest of a planting outside the forecast (marked failed later) still happened.
		const k = key(a.key, week);
		const seen = logged.get(k);
		if (seen) seen.quantity += a.quantity;
		else logged.set(k, { crop: a.crop, week, quantity: a.quantity });
	}
	const totals = new Map<string, CropWeekQuantity>();
	const add = (crop: string, week: string, q: number): void => {
		const k = key(crop, week);
		const t = totals.get(k);
		if (t) t.quantity += q;
		else totals.set(k, { crop, week, quantity: q });
	};
	for (const r of forecast(plantings, [])) add(r.crop, r.week, r.supply);
	// Each logged planting's own forecast, keyed by planting, so it can be taken back out.
	const loggedKeys = new Set([...logged.keys()].map((k) => k.split('\u0000')[0]));
	const own = forecast(
		plantings.filter((p) => p.key !== undefined && loggedKeys.has(p.key)).map((p) => ({ ...p, crop: p.key! })),
		[]
	);
	const ownByKeyWeek = new Map(own.map((r) => [key(r.crop, r.week), r.supply]));
	const actual = new Set<string>();
	for (const [k, l] of logged) {
		add(l.crop, l.week, l.quantity - (ownByKeyWeek.get(k) ?? 0));
		actual.add(key(l.crop, l.week));
	}
	for (const t of totals.values()) t.quantity = Math.max(0, tidy(t.quantity));
	return { supply: [...totals.values()], actual };
}

/** Supply per crop-week and targets as forecast rows, through the engine's forecast(). */
export function forecastFromSupply(supply: CropWeekQuantity[], targets: CropWeekQuantity[]): ForecastRow[] {
	// A week's supply is a planting yielding exactly that quantity over that Monday–Sunday.
	const pseudo = supply
		.filter((s) => s.quantity > 0)
		.map((s) => {
			const monday = weekStart(s.week);
			return { crop: s.crop, firstHarvest: monday, lastHarvest: addDays(monday, 6), weeklyYield: s.quantity };
		});
	return forecast(pseudo, targets);
}

/** The key matching.ts uses for crop-week sets (e.g. `supplyWithActuals().actual`). */
export function cropWeekKey(crop: string, week: string): string {
	return key(crop, week);
}
