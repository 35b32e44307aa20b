import { FT_EPSILON, type Occupancy } from './bed-types';

/**
 * Scratch list reused across calls: placement calls these thousands of times per plan.
 * Only the first `n` entries count. It is never emptied with `length = 0`, which
 * would drop its backing store and make every call allocate a new one.
 */
const scratch: Occupancy[] = [];

/**
 * Stable sort of xs[0..n) by start foot. The lists are a bed's few overlapping
 * plantings, and Array.prototype.sort allocates work space on every call, which at
 * thousands of calls per plan was a large share of all garbage; insertion sort
 * allocates none. Long lists (many fixed plantings in one bed) use the built-in sort.
 */
function sortByStartFt(xs: Occupancy[], n: number): void {
	if (n > 32) {
		const sorted = xs.slice(0, n).sort((x, y) => x.a - y.a);
		for (let i = 0; i < n; i++) xs[i] = sorted[i];
		return;
	}
	for (let i = 1; i < n; i++) {
		const o = xs[i];
		let j = i - 1;
		while (j >= 0 && xs[j].a > o.a) {
			xs[j + 1] = xs[j];
			j--;
		}
		xs[j + 1] = o;
	}
}

export interface Gap {
	startFt: number;
	lengthFt: number;
}

/** Reused result of firstGap: placement calls it thousands of times per plan. */
export const gap: Gap = { startFt: 0, lengthFt: 0 };

/**
 * First free foot range of at least `need` feet in a bed of `bedLength` feet
 * over the time [s, e), given the bed's occupancies. Writes it into `gap` and
 * returns true; false when there is none.
 */
export function firstGap(occ: Occupancy[], bedLength: number, s: number, e: number, need: number): boolean {
	const hits = scratch;
	let n = 0;
	for (const o of occ) if (o.s < e && o.e > s) hits[n++] = o;
	sortByStartFt(hits, n);
	let cursor = 0;
	for (let i = 0; i < n; i++) {
		const o = hits[i];
		if (o.a - cursor >= need - FT_EPSILON) {
			gap.startFt = cursor;
			gap.lengthFt = o.a - cursor;
			return true;
		}
		if (o.b > cursor) cursor = o.b;
	}
	if (bedLength - cursor >= need - FT_EPSILON) {
		gap.startFt = cursor;
		gap.lengthFt = bedLength - cursor;
		return true;
	}
	return false;
}

/** All free foot ranges of a bed over the time [s, e), in foot order. */
export function freeRanges(occ: Occupancy[], bedLength: number, s: number, e: number): Gap[] {
	const hits = occ.filter((o) => o.s < e && o.e > s).sort((x, y) => x.a - y.a);
	const out: Gap[] = [];
	let cursor = 0;
	for (const o of hits) {
		if (o.a - cursor > FT_EPSILON) out.push({ startFt: cursor, lengthFt: o.a - cursor });
		if (o.b > cursor) cursor = o.b;
	}
	if (bedLength - cursor > FT_EPSILON) out.push({ startFt: cursor, lengthFt: bedLength - cursor });
	return out;
}

/** Reused result of instantGap (see below): placement calls it thousands of times per plan. */
export const instant = { maxGap: 0, validUntil: Infinity };

/**
 * Widest free range at the instant s, and until when that figure stays an
 * upper bound: every occupancy present at s lasts until at least the earliest
 * of their ends, and new ones only take feet away. Writes into `instant`.
 */
export function instantGap(occ: Occupancy[], bedLength: number, s: number): void {
	const hits = scratch;
	let n = 0;
	let validUntil = Infinity;
	for (const o of occ) {
		if (o.s <= s && o.e > s) {
			hits[n++] = o;
			if (o.e < validUntil) validUntil = o.e;
		}
	}
	sortByStartFt(hits, n);
	let cursor = 0;
	let maxGap = 0;
	for (let i = 0; i < n; i++) {
		const o = hits[i];
		if (o.a - cursor > maxGap) maxGap = o.a - cursor;
		if (o.b > cursor) cursor = o.b;
	}
	if (bedLength - cursor > maxGap) maxGap = bedLength - cursor;
	instant.maxGap = maxGap;
	instant.validUntil = validUntil;
}
