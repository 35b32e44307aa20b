// Who covers a crop's weekly need: per crop and ISO week, the target and each planting's share of
// the supply, so a succession can be explained as "this week needs 40 lb; this planting gives 22,
// bed N3's earlier sowing 15, last autumn's planting 5; 2 lb over". The shares are the engine's
// forecast split by planting: for a crop sold fresh, what each planting picks that week (its harvest
// curve followed); for a storage crop, what its lots give from store, oldest first, as storeSupply
// does (planning/storage.ts). The shares of a week add up to that week's forecast supply.
// Pure: no I/O.
import { weekdayOf, type DayNumber } from './day-number';
import { harvestWindow, windowAmount, type ForecastPlanting } from './forecast';
import { addWeeks, isoWeekOfDay } from './iso-week';
import type { CropStore } from './storage';
import type { CropWeekQuantity } from './types';

/** A planting as the cover sees it: the forecast's planting, with a key to name it by. */
export type CoverPlanting = ForecastPlanting & { key: string };

export interface CropCover {
	crop: string;
	/** Every week with a target or a share, in order. */
	weeks: string[];
	/** The target of weeks[i] (0 where none). */
	target: number[];
	/** Each planting's share of weeks[i]; plantings that give nothing are left out. */
	plantings: { key: string; share: number[] }[];
}

/** One week of one succession's cover. */
export interface CoverWeek {
	week: string;
	target: number;
	/** What this succession gives that week. */
	own: number;
	/** What the other plantings give that week, largest first. */
	others: { key: string; quantity: number }[];
	/** own + Σ others: the week's supply. */
	supply: number;
	/** max(0, target − supply) and max(0, supply − target). */
	gap: number;
	surplus: number;
}

type Shares = Map<string, Map<string, number>>;

/** A share below this is the float residue of a curve's weights, not a harvest. */
const EPS = 1e-9;

const bump = (m: Map<string, number>, week: string, q: number): void => {
	if (q > 0) m.set(week, (m.get(week) ?? 0) + q);
};

/** Each planting's harvest per ISO week (as forecast() spreads it). */
function fieldShares(plantings: CoverPlanting[]): Shares {
	const out: Shares = new Map();
	plantings.forEach((p, i) => {
		const w = harvestWindow(p, `plantings[${i}]`);
		const m = out.get(p.key) ?? out.set(p.key, new Map()).get(p.key)!;
		for (let monday: DayNumber = w.a - weekdayOf(w.a) + 1; monday <= w.b; monday += 7)
			bump(m, isoWeekOfDay(monday), windowAmount(w, monday, monday + 6));
	});
	return out;
}

interface Lot {
	week: string;
	age: number;
	/** Quantity left per planting. */
	parts: Map<string, number>;
}

const lotSize = (l: Lot): number => [...l.parts.values()].reduce((s, q) => s + q, 0);

/**
 * storeSupply (planning/storage.ts) with each lot split by the plantings it came from: a week's
 * demand takes from the oldest lot first, from each of its plantings in proportion, so every
 * planting's share of the store's supply is known. The totals are storeSupply's.
 */
function storeShares(harvest: Shares, demand: Map<string, number>, store: CropStore): Shares {
	const out: Shares = new Map([...harvest.keys()].map((k) => [k, new Map()]));
	const weeks = [...[...harvest.values()].flatMap((m) => [...m.keys()]), ...demand.keys()].sort();
	if (!weeks.length) return out;
	const keep = Math.max(0, Math.floor(store.keepWeeks));
	const loss = Math.min(1, Math.max(0, store.lossPerWeek));
	let lots: Lot[] = [];
	for (let week = weeks[0]; week <= weeks.at(-1)!; week = addWeeks(week, 1)) {
		lots = lots
			.filter((l) => l.age + 1 <= keep)
			.map((l) => ({ ...l, age: l.age + 1, parts: new Map([...l.parts].map(([k, q]) => [k, q * (1 - loss)])) }));
		const dug = new Map<string, number>();
		for (const [k, m] of harvest) if ((m.get(week) ?? 0) > 0) dug.set(k, m.get(week)!);
		if (dug.size) lots.push({ week, age: 0, parts: dug });
		let need = demand.get(week) ?? 0;
		for (const lot of lots) {
			if (need <= 0) break;
			const size = lotSize(lot);
			const take = Math.min(size, need);
			for (const [k, q] of lot.parts) {
				const part = size > 0 ? (take * q) / size : 0;
				lot.parts.set(k, q - part);
				bump(out.get(k)!, week, part);
			}
			need -= take;
		}
		lots = lots.filter((l) => lotSize(l) > 1e-9);
	}
	// What no demand took stays the surplus of the week it was harvested, as in storeSupply.
	for (const lot of lots) for (const [k, q] of lot.parts) bump(out.get(k)!, lot.week, q);
	return out;
}

/**
 * Per crop, the weekly targets and each planting's share of every week. `stores` names the crops
 * sold from store. Plantings and targets of a crop are taken together whatever their season: the
 * caller passes every planting harvesting in the weeks it asks about.
 */
export function cropCover(
	plantings: CoverPlanting[],
	targets: CropWeekQuantity[],
	stores: CropStore[] = []
): CropCover[] {
	const crops = [...new Set([...plantings.map((p) => p.crop), ...targets.map((t) => t.crop)])].sort();
	const kept = new Map(stores.filter((s) => s.keepWeeks > 0).map((s) => [s.crop, s]));
	return crops.map((crop): CropCover => {
		const demand = new Map<string, number>();
		for (const t of targets) if (t.crop === crop) bump(demand, t.week, t.quantity);
		let shares = fieldShares(plantings.filter((p) => p.crop === crop));
		const store = kept.get(crop);
		if (store) shares = storeShares(shares, demand, store);
		const weeks = [...new Set([...demand.keys(), ...[...shares.values()].flatMap((m) => [...m.keys()])])].sort();
		return {
			crop,
			weeks,
			target: weeks.map((w) => demand.get(w) ?? 0),
			plantings: [...shares]
				.filter(([, m]) => m.size > 0)
				.map(([key, m]) => ({ key, share: weeks.map((w) => m.get(w) ?? 0) }))
		};
	});
}

/**
 * One succession's cover: each week it gives something, the week's target, its own share, the
 * other plantings' shares (largest first) and what is left short or over. Empty for an unknown key.
 */
export function successionCover(c: CropCover, key: string): CoverWeek[] {
	const mine = c.plantings.find((p) => p.key === key);
	if (!mine) return [];
	const out: CoverWeek[] = [];
	c.weeks.forEach((week, i) => {
		const own = mine.share[i];
		if (!(own > EPS)) return;
		const others = c.plantings
			.filter((p) => p.key !== key && p.share[i] > EPS)
			.map((p) => ({ key: p.key, quantity: p.share[i] }))
			.sort((a, b) => b.quantity - a.quantity);
		const supply = own + others.reduce((s, o) => s + o.quantity, 0);
		const target = c.target[i];
		out.push({
			week,
			target,
			own,
			others,
			supply,
			gap: Math.max(0, target - supply),
			surplus: Math.max(0, supply - target)
		});
	});
	return out;
}
