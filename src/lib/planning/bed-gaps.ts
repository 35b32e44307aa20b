import { FT_EPSILON, type Occupancy } from './bed-types';

/**
 * Placement keeps each bed's occupancies as one flat list of numbers, four to an
 * occupancy (s, e, a, b: days [s, e), feet [a, b)), in the order they were added:
 * no object per occupancy, and a bed's figures side by side in memory, which at
 * thousands of plantings over thousands of beds is most of placement's speed.
 */
export type FlatOccupancies = number[];

/**
 * Scratch foot ranges reused across calls (placement calls these thousands of times
 * per plan): only the first `n` entries count. Never emptied with `length = 0`, which
 * would drop the backing store and make every call allocate a new one.
 */
const starts: number[] = [];
const ends: number[] = [];
const order: number[] = [];

/**
 * Sort the ranges starts/ends[0..n) by start foot, stably. The lists are a bed's few
 * overlapping plantings, sorted by insertion (no allocation); long lists (many fixed
 * plantings in one bed) by the built-in sort of their indices.
 */
function sortByStartFt(n: number): void {
	if (n > 32) {
		for (let i = 0; i < n; i++) order[i] = i;
		const idx = order.slice(0, n).sort((x, y) => starts[x] - starts[y] || x - y);
		const a = idx.map((i) => starts[i]);
		const b = idx.map((i) => ends[i]);
		for (let i = 0; i < n; i++) {
			starts[i] = a[i];
			ends[i] = b[i];
		}
		return;
	}
	for (let i = 1; i < n; i++) {
		const a = starts[i];
		const b = ends[i];
		let j = i - 1;
		while (j >= 0 && starts[j] > a) {
			starts[j + 1] = starts[j];
			ends[j + 1] = ends[j];
			j--;
		}
		starts[j + 1] = a;
		ends[j + 1] = b;
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
export function firstGap(occ: FlatOccupancies, bedLength: number, s: number, e: number, need: number): boolean {
	let n = 0;
	for (let i = 0; i < occ.length; i += 4) {
		if (occ[i] < e && occ[i + 1] > s) {
			starts[n] = occ[i + 2];
			ends[n++] = occ[i + 3];
		}
	}
	sortByStartFt(n);
	let cursor = 0;
	for (let i = 0; i < n; i++) {
		if (starts[i] - cursor >= need - FT_EPSILON) {
			gap.startFt = cursor;
			gap.lengthFt = starts[i] - cursor;
			return true;
		}
		if (ends[i] > cursor) cursor = ends[i];
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
export function instantGap(occ: FlatOccupancies, bedLength: number, s: number): void {
	let n = 0;
	let validUntil = Infinity;
	for (let i = 0; i < occ.length; i += 4) {
		if (occ[i] <= s && occ[i + 1] > s) {
			starts[n] = occ[i + 2];
			ends[n++] = occ[i + 3];
			if (occ[i + 1] < validUntil) validUntil = occ[i + 1];
		}
	}
	sortByStartFt(n);
	let cursor = 0;
	let maxGap = 0;
	for (let i = 0; i < n; i++) {
		if (starts[i] - cursor > maxGap) maxGap = starts[i] - cursor;
		if (ends[i] > cursor) cursor = ends[i];
	}
	if (bedLength - cursor > maxGap) maxGap = bedLength - cursor;
	instant.maxGap = maxGap;
	instant.validUntil = validUntil;
}
