// The covering linear program of one variety's sizing, solved exactly in plain TypeScript (no
// solver package: the engine stays pure and runs the same in the browser, the server and the seed).
//
//   minimise Σ cost_c · x_c   subject to   Σ_c a_wc · x_c ≥ need_w (every week w),   x ≥ 0
//
// A covering program's dual is a packing program, maximise Σ need_w · y_w subject to
// Σ_w a_wc · y_w ≤ cost_c, y ≥ 0, whose origin is feasible when every cost is positive: the
// simplex method starts there with no first phase. At the dual's optimum the primal x_c are the
// objective row's entries under the slack of column c (linear-programming duality; e.g. Chvátal,
// Linear Programming, 1983, ch. 5). The most negative reduced cost enters; after a run of
// degenerate pivots Bland's rule (lowest index enters and leaves) takes over, which cannot cycle.

export interface CoverRow {
	need: number;
	/** (column index, coefficient > 0) pairs. */
	terms: readonly (readonly [number, number])[];
}

/**
 * The optimal x of the covering program (one entry per cost), or null when the program cannot be
 * solved here (a row with no terms, or the pivot limit is reached): the caller falls back.
 */
export function solveCover(
	rows: readonly CoverRow[],
	cost: ArrayLike<number>,
	maxPivots = 20_000
): Float64Array | null {
	const m = cost.length;
	const n = rows.length;
	if (m === 0) return new Float64Array(0);
	for (const r of rows) if (r.terms.length === 0 && r.need > 0) return null;
	for (let i = 0; i < m; i++) if (!(cost[i] > 0)) return null;
	// Scale each week's row so its largest coefficient is 1, and each column so its cost is 1: the
	// tableau then holds numbers of one size, whatever the units of yield and days.
	const width = n + m + 1;
	const t = new Float64Array((m + 1) * width);
	const rowScale = new Float64Array(n);
	for (let j = 0; j < n; j++) {
		let big = 0;
		for (const [, a] of rows[j].terms) big = Math.max(big, a);
		rowScale[j] = big > 0 ? 1 / big : 1;
	}
	for (let j = 0; j < n; j++) {
		for (const [c, a] of rows[j].terms) t[c * width + j] += (a * rowScale[j]) / cost[c];
		t[m * width + j] = -rows[j].need * rowScale[j];
	}
	for (let i = 0; i < m; i++) {
		t[i * width + n + i] = 1;
		t[i * width + width - 1] = 1;
	}
	const basis = new Int32Array(m);
	for (let i = 0; i < m; i++) basis[i] = n + i;
	const eps = 1e-12;
	const nz = new Int32Array(width);
	let degenerate = 0;
	for (let pivots = 0; ; pivots++) {
		if (pivots > maxPivots) return null;
		// Entering: the most negative reduced cost (Dantzig), or after a run of degenerate pivots the
		// lowest index (Bland), which cannot cycle.
		const bland = degenerate > 50;
		let enter = -1;
		let most = -1e-11;
		for (let j = 0; j < n + m; j++) {
			const r = t[m * width + j];
			if (r < most) {
				enter = j;
				if (bland) break;
				most = r;
			}
		}
		if (enter < 0) break;
		let leave = -1;
		let best = Infinity;
		for (let i = 0; i < m; i++) {
			const a = t[i * width + enter];
			if (a <= eps) continue;
			const ratio = t[i * width + width - 1] / a;
			if (ratio < best - 1e-15 || (Math.abs(ratio - best) <= 1e-15 && basis[i] < basis[leave])) {
				best = ratio;
				leave = i;
			}
		}
		// Unbounded dual: the covering program has no solution (cannot happen with every row covered).
		if (leave < 0) return null;
		degenerate = best <= 1e-15 ? degenerate + 1 : 0;
		const row = leave * width;
		const p = t[row + enter];
		let count = 0;
		for (let k = 0; k < width; k++) {
			if (t[row + k] !== 0) {
				t[row + k] /= p;
				nz[count++] = k;
			}
		}
		for (let i = 0; i <= m; i++) {
			if (i === leave) continue;
			const f = t[i * width + enter];
			if (f === 0) continue;
			const at = i * width;
			for (let q = 0; q < count; q++) t[at + nz[q]] -= f * t[row + nz[q]];
		}
		basis[leave] = enter;
	}
	// x_c: the objective row under slack c, undoing the column's scaling by its cost.
	const x = new Float64Array(m);
	for (let c = 0; c < m; c++) x[c] = Math.max(0, t[m * width + n + c]) / cost[c];
	return x;
}

/**
 * The weeks of one variety's sizing: week numbers are offsets from the first target week (a start
 * may be before it), `span` the weeks a harvest window reaches, `step` the weeks between starts.
 */
export interface SizingWeeks {
	nWeeks: number;
	/** Earliest candidate start (offset). */
	cMin: number;
	span: number;
	step: number;
	/** Target per week offset 0…nWeeks − 1, and what each week needs. */
	target: Float64Array;
	need: Float64Array;
}

/** One variety's covering program, as sizing.ts sees it. */
export interface CoverProblem extends SizingWeeks {
	ok: (c: number) => boolean;
	occupancy: (c: number) => number;
	perFt: (c: number, w: number) => number;
}

/**
 * Bed-feet per reachable start (week offset → feet, unrounded) that meet every week's need a
 * reachable start can supply, for the fewest bed-foot-days; null when the program could not be
 * solved here. Weeks no reachable start supplies are left out (the caller reports them).
 */
export function coverByLp(p: CoverProblem): Map<number, number> | null {
	const col = new Map<number, number>();
	const starts: number[] = [];
	const rows: CoverRow[] = [];
	for (let w = 0; w < p.nWeeks; w++) {
		if (!(p.target[w] > 0) || !(p.need[w] > 0)) continue;
		const terms: [number, number][] = [];
		for (let c = w; c >= Math.max(p.cMin, w - p.span + 1); c--) {
			if (p.step > 1 && ((c % p.step) + p.step) % p.step !== 0) continue;
			// ok first: it works the start out, and its per-foot supply with it.
			if (!p.ok(c)) continue;
			const a = p.perFt(c, w);
			if (!(a > 0)) continue;
			let k = col.get(c);
			if (k === undefined) {
				k = starts.length;
				col.set(c, k);
				starts.push(c);
			}
			terms.push([k, a]);
		}
		if (terms.length > 0) rows.push({ need: p.need[w], terms });
	}
	// Ties go to the later start (a later sowing risks less): a later start costs a hair less.
	const x = solveCover(
		rows,
		starts.map((c) => p.occupancy(c) * (1 + 1e-7 * (p.nWeeks - c)))
	);
	if (!x) return null;
	const out = new Map<number, number>();
	for (let k = 0; k < starts.length; k++) if (x[k] > 1e-9) out.set(starts[k], x[k]);
	return out;
}

/** The target week a start supplies most per foot (its peak), for the explanation. */
export function peakWeekOf(
	c: number,
	span: number,
	nWeeks: number,
	target: Float64Array,
	perFt: (c: number, w: number) => number
): number {
	let best = Math.max(0, c);
	for (let u = best; u < nWeeks && u <= c + span - 1; u++) if (target[u] > 0 && perFt(c, u) > perFt(c, best)) best = u;
	return best;
}
