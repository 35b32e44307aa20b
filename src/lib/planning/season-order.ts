/**
 * The order a season plan lists its plantings in: by field date, then key.
 * Placement hands pieces over already in field-date order (placed, then unplaced,
 * each in the order it placed them), so a merge and a sort of each day's few
 * plantings by key give the same order as one sort of the whole list, for much
 * less work on a season of thousands.
 */
interface Dated {
	key: string;
	fieldDate: string;
}

function byDateThenKey(a: Dated, b: Dated): number {
	return a.fieldDate < b.fieldDate ? -1 : a.fieldDate > b.fieldDate ? 1 : a.key < b.key ? -1 : 1;
}

function byKey(a: Dated, b: Dated): number {
	return a.key < b.key ? -1 : 1;
}

function inDateOrder(xs: Dated[]): boolean {
	for (let i = 1; i < xs.length; i++) if (xs[i - 1].fieldDate > xs[i].fieldDate) return false;
	return true;
}

/** `first` and `second` merged and sorted by field date, then key (keys are unique). */
export function inPlanOrder<T extends Dated>(first: T[], second: T[]): T[] {
	if (!inDateOrder(first) || !inDateOrder(second)) return [...first, ...second].sort(byDateThenKey);
	const out: T[] = [];
	let i = 0;
	let j = 0;
	while (i < first.length || j < second.length) {
		out.push(
			j >= second.length || (i < first.length && first[i].fieldDate <= second[j].fieldDate) ? first[i++] : second[j++]
		);
	}
	for (let a = 0; a < out.length;) {
		let b = a + 1;
		while (b < out.length && out[b].fieldDate === out[a].fieldDate) b++;
		if (b - a > 1) {
			const day = out.slice(a, b).sort(byKey);
			for (let k = 0; k < day.length; k++) out[a + k] = day[k];
		}
		a = b;
	}
	return out;
}

/**
 * Where each of a plan's successions falls in key order, when keys are
 * `${prefix}#${n}` with n = 1, 2, … within each prefix (records of one prefix
 * one after another, from `start` for `count`), without comparing whole keys:
 * prefixes sorted by `prefix + '#'`, then n in string order ("10" before "2").
 * That is exactly string order unless a prefix itself holds '#', when this gives
 * null and the caller sorts by key.
 */
export function keyRanks(groups: { prefix: string; start: number; count: number }[], total: number): number[] | null {
	if (groups.some((g) => g.prefix.includes('#'))) return null;
	const heads = groups.map((g) => `${g.prefix}#`);
	const byPrefix = groups.map((_, i) => i).sort((a, b) => (heads[a] < heads[b] ? -1 : heads[a] > heads[b] ? 1 : 0));
	const ranks: number[] = new Array<number>(total).fill(0);
	// n = 1..count in string order, by count (a season's shares have a few dozen successions at most).
	const lexOrder = new Map<number, number[]>();
	let next = 0;
	for (let k = 0; k < byPrefix.length; k++) {
		const g = groups[byPrefix[k]];
		let order = lexOrder.get(g.count);
		if (!order) {
			order = Array.from({ length: g.count }, (_, i) => i + 1).sort((a, b) => (String(a) < String(b) ? -1 : 1));
			lexOrder.set(g.count, order);
		}
		for (let j = 0; j < order.length; j++) ranks[g.start + order[j] - 1] = next++;
	}
	return ranks;
}

/** Rank of piece k (0: the whole key, k: key + `/${k + 1}`) among pieces 0..count-1, in string order of their suffixes. */
export function pieceRanks(count: number): number[] {
	const suffixes = Array.from({ length: count }, (_, k) => (k === 0 ? '' : `/${k + 1}`));
	const order = suffixes.map((_, k) => k).sort((a, b) => (suffixes[a] < suffixes[b] ? -1 : 1));
	const ranks: number[] = new Array<number>(count).fill(0);
	order.forEach((k, r) => (ranks[k] = r));
	return ranks;
}

/**
 * `items` sorted by day, then rank (unique per item, below rankCount), with one
 * native sort of numbers: each item becomes the number
 * ((day − first day) × rankCount + rank) × n + its index. Null when those numbers
 * would not all be exact (past 2^53), for the caller to sort another way. (One typed
 * array, for the native numeric sort.)
 */
export function byDayThenRank<T>(
	items: T[],
	day: ArrayLike<number>,
	rank: ArrayLike<number>,
	rankCount: number
): T[] | null {
	const n = items.length;
	if (n === 0) return [];
	let lo = Infinity;
	let hi = -Infinity;
	for (let i = 0; i < n; i++) {
		if (day[i] < lo) lo = day[i];
		if (day[i] > hi) hi = day[i];
	}
	if ((hi - lo + 1) * rankCount * n > Number.MAX_SAFE_INTEGER) return null;
	const keys = new Float64Array(n);
	for (let i = 0; i < n; i++) keys[i] = ((day[i] - lo) * rankCount + rank[i]) * n + i;
	keys.sort();
	const out = new Array<T>(n);
	for (let k = 0; k < n; k++) out[k] = items[keys[k] % n];
	return out;
}
