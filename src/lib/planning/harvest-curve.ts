/**
 * Harvest curves: how a planting's yield spreads over the days of its harvest window.
 *
 * - `flat`: the same every day (leaf crops picked steadily: kale, chard, herbs).
 * - `ramp`: ramp, peak and tail, for fruiting crops (beans, cucumbers, squash, tomatoes): picking
 *   rises over the first `rampDays`, holds, and falls over the last `tailDays`.
 * - `single`: one cut (head lettuce, cabbage, roots pulled at once): the whole yield in the first
 *   week of the window; the rest of the window is the time it can stand in the field.
 * - `cuts`: several cuts `intervalDays` apart (salad mix, cut-and-come-again greens), each regrowth
 *   cut `regrowth` times the one before.
 *
 * A curve is a list of daily weights over the window that sum to 1, so a week's share of a
 * planting's yield is the sum of the weights of its days in that week.
 */
import { PlanningInputError, requirePositiveInteger, requireRate } from './errors';

export type HarvestCurveShape = 'flat' | 'ramp' | 'single' | 'cuts';

export interface HarvestCurve {
	shape: HarvestCurveShape;
	/** ramp: days from first pick to full picking. Default a quarter of the window. */
	rampDays?: number;
	/** ramp: days from full picking down to the last pick. Default 30 % of the window. */
	tailDays?: number;
	/** cuts: days between cuts. Default 14. */
	intervalDays?: number;
	/** cuts: each cut's yield as a fraction of the one before. Default 0.8. */
	regrowth?: number;
}

export const FLAT: HarvestCurve = { shape: 'flat' };

/** Check a curve's plain data; throws PlanningInputError naming `<field>.<part>`. */
export function validateCurve(c: HarvestCurve | undefined, field = 'variety.harvestCurve'): HarvestCurve {
	if (c === undefined || c === null) return FLAT;
	if (typeof c !== 'object') throw new PlanningInputError(field, 'must be an object');
	if (c.shape !== 'flat' && c.shape !== 'ramp' && c.shape !== 'single' && c.shape !== 'cuts') {
		throw new PlanningInputError(`${field}.shape`, `must be flat, ramp, single or cuts (got ${String(c.shape)})`);
	}
	if (c.rampDays !== undefined) requirePositiveInteger(`${field}.rampDays`, c.rampDays);
	if (c.tailDays !== undefined) requirePositiveInteger(`${field}.tailDays`, c.tailDays);
	if (c.intervalDays !== undefined) requirePositiveInteger(`${field}.intervalDays`, c.intervalDays);
	if (c.regrowth !== undefined) requireRate(`${field}.regrowth`, c.regrowth);
	return c;
}

const cache = new Map<string, Float64Array>();

/**
 * Cumulative weights of a window of `days` days: P[d] is the share of the yield picked on days
 * 0 … d − 1, so P[0] = 0 and P[days] = 1. Cached per curve and window length.
 */
export function cumulativeWeights(curve: HarvestCurve | undefined, days: number): Float64Array {
	const c = curve ?? FLAT;
	const key = `${c.shape}|${days}|${c.rampDays ?? ''}|${c.tailDays ?? ''}|${c.intervalDays ?? ''}|${c.regrowth ?? ''}`;
	let p = cache.get(key);
	if (p) return p;
	const w = dailyWeights(c, days);
	p = new Float64Array(days + 1);
	for (let d = 0; d < days; d++) p[d + 1] = p[d] + w[d];
	p[days] = 1;
	if (cache.size > 5000) cache.clear();
	cache.set(key, p);
	return p;
}

/** The daily weights of a window of `days` days (sum 1). */
export function dailyWeights(c: HarvestCurve, days: number): number[] {
	const n = Math.max(1, Math.floor(days));
	const w = new Array<number>(n).fill(0);
	if (c.shape === 'single') {
		const m = Math.min(n, 7);
		for (let d = 0; d < m; d++) w[d] = 1;
	} else if (c.shape === 'cuts') {
		const every = c.intervalDays ?? 14;
		const regrowth = c.regrowth ?? 0.8;
		let share = 1;
		for (let d = 0; d < n; d += every) {
			w[d] = share;
			share *= regrowth;
		}
	} else if (c.shape === 'ramp') {
		const ramp = Math.min(n, c.rampDays ?? Math.max(1, Math.round(n * 0.25)));
		const tail = Math.min(n, c.tailDays ?? Math.max(1, Math.round(n * 0.3)));
		for (let d = 0; d < n; d++) {
			const up = d < ramp ? (d + 0.5) / ramp : 1;
			const down = d >= n - tail ? (n - d - 0.5) / tail : 1;
			w[d] = Math.min(up, down);
		}
	} else {
		w.fill(1);
	}
	let sum = 0;
	for (const x of w) sum += x;
	if (!(sum > 0)) return new Array<number>(n).fill(1 / n);
	for (let d = 0; d < n; d++) w[d] /= sum;
	return w;
}

/**
 * The share of a window's yield picked in days [from, to] (inclusive) counted from the window's
 * first day, for a window of `days` days.
 */
export function shareOfDays(p: Float64Array, from: number, to: number): number {
	const days = p.length - 1;
	const a = Math.max(0, from);
	const b = Math.min(days - 1, to);
	return b < a ? 0 : p[b + 1] - p[a];
}
