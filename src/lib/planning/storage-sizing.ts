/**
 * Sizing a storage crop (garlic, storage onions, winter squash, potatoes): it is harvested once,
 * kept, and sold from store, so one harvest feeds the demand weeks that follow it for as long as
 * it keeps. The planner picks, for the first demand week the store cannot yet feed, the latest
 * reachable harvest on or before it (the least time in store, so the least loss), and sizes it
 * to the least whole bed-foot increment whose lot, losing `lossPerWeek` of what is left each week
 * and thrown out after `keepWeeks`, feeds every demand week it can reach at target × (1 + margin),
 * after what the store already holds from plantings outside the plan. The store is the same
 * model as the forecast's (storage.ts): lots are sold oldest first.
 *
 * Week numbers here are offsets from the first target week (negative: before it).
 */

import type { SizingWeeks } from './cover-lp';

/** `need` is target × (1 + margin) here. */
export interface StoreSizing extends SizingWeeks {
	increment: number;
	keepWeeks: number;
	lossPerWeek: number;
	/** Harvest from outside the plan going into store, by week offset (may be before 0). */
	lots: Map<number, number>;
	/** Whether a harvest starting in week c can be reached (dates, frost, today). */
	reachable: (c: number) => boolean;
	/** Harvest per bed-foot of a start in week c during week w. */
	perFt: (c: number, w: number) => number;
}

export interface StoreSized {
	/** Bed-feet by start week offset. */
	feet: Map<number, number>;
	/** The demand week each start was sized for. */
	sizedOn: Map<number, number>;
	/** What the store gives each target week once every planned harvest is in. */
	given: Float64Array;
	/** Target weeks no reachable harvest can feed. */
	unreachable: number[];
}

/** What the store gives each target week (0…nWeeks − 1) from harvests by week offset. */
export function storeGives(
	harvest: Map<number, number>,
	need: Float64Array,
	keepWeeks: number,
	lossPerWeek: number
): Float64Array {
	const given = new Float64Array(need.length);
	let first = 0;
	for (const w of harvest.keys()) if (w < first) first = w;
	const keep = Math.max(0, Math.floor(keepWeeks));
	const loss = Math.min(1, Math.max(0, lossPerWeek));
	let lots: { age: number; q: number }[] = [];
	for (let w = first; w < need.length; w++) {
		const aged: { age: number; q: number }[] = [];
		for (const lot of lots) if (lot.age + 1 <= keep) aged.push({ age: lot.age + 1, q: lot.q * (1 - loss) });
		lots = aged;
		const dug = harvest.get(w) ?? 0;
		if (dug > 0) lots.push({ age: 0, q: dug });
		if (w < 0) continue;
		let left = need[w];
		for (const lot of lots) {
			if (left <= 0) break;
			const take = Math.min(lot.q, left);
			lot.q -= take;
			left -= take;
			given[w] += take;
		}
		lots = lots.filter((l) => l.q > 1e-12);
	}
	return given;
}

export function sizeStoredHarvests(p: StoreSizing): StoreSized {
	const harvest = new Map(p.lots);
	const feet = new Map<number, number>();
	const sizedOn = new Map<number, number>();
	const unreachable: number[] = [];
	const skip = new Set<number>();
	const short = (given: Float64Array, w: number): boolean =>
		p.target[w] > 0 && !skip.has(w) && given[w] < p.need[w] * (1 - 1e-9);
	const withLot = (c: number, f: number): Map<number, number> => {
		const h = new Map(harvest);
		for (let k = 0; k < p.span; k++) {
			const q = f * p.perFt(c, c + k);
			if (q > 0) h.set(c + k, (h.get(c + k) ?? 0) + q);
		}
		return h;
	};
	let given = storeGives(harvest, p.need, p.keepWeeks, p.lossPerWeek);
	for (let guard = 0; guard < 4 * p.nWeeks + 8; guard++) {
		let u = -1;
		for (let w = 0; w < p.nWeeks; w++) {
			if (short(given, w)) {
				u = w;
				break;
			}
		}
		if (u < 0) break;
		// The latest reachable start whose harvest begins by week u and still keeps until then.
		let c = NaN;
		for (let s = u; s >= Math.max(p.cMin, u - p.keepWeeks); s--) {
			if (p.step > 1 && ((s % p.step) + p.step) % p.step !== 0) continue;
			if (p.perFt(s, s) > 0 && p.reachable(s)) {
				c = s;
				break;
			}
		}
		if (Number.isNaN(c)) {
			skip.add(u);
			unreachable.push(u);
			continue;
		}
		// The weeks this lot is to feed: from u to the last week any of it keeps (a lot lost in
		// store within a week feeds only its own week).
		let dugLast = c;
		for (let k = 0; k < p.span; k++) if (p.perFt(c, c + k) > 0) dugLast = c + k;
		let last = Math.min(p.nWeeks - 1, dugLast + (p.lossPerWeek >= 1 ? 0 : p.keepWeeks));
		const feeds = (f: number): boolean => {
			const g = storeGives(withLot(c, f), p.need, p.keepWeeks, p.lossPerWeek);
			for (let w = u; w <= last; w++) if (short(g, w)) return false;
			return true;
		};
		// Whole increments: double until the lot feeds every week it can reach, then halve the gap.
		let hi = 1;
		while (!feeds(hi * p.increment) && hi < 2 ** 30) hi *= 2;
		if (hi >= 2 ** 30) {
			last = u;
			hi = 1;
			while (!feeds(hi * p.increment) && hi < 2 ** 30) hi *= 2;
		}
		let lo = 0;
		while (hi - lo > 1) {
			const mid = Math.floor((lo + hi) / 2);
			if (feeds(mid * p.increment)) hi = mid;
			else lo = mid;
		}
		const f = hi * p.increment;
		for (const [w, q] of withLot(c, f)) harvest.set(w, q);
		feet.set(c, (feet.get(c) ?? 0) + f);
		if (!sizedOn.has(c)) sizedOn.set(c, u);
		given = storeGives(harvest, p.need, p.keepWeeks, p.lossPerWeek);
		// A week this lot cannot feed (before its harvest, or past its keeping) is the next lot's.
		if (short(given, u)) {
			skip.add(u);
			unreachable.push(u);
		}
	}
	return { feet, sizedOn, given, unreachable };
}
