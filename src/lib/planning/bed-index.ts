/**
 * A segment tree over beds (in bed order) that finds the first bed that might
 * hold a range of L feet at time s without visiting full beds. Each leaf keeps
 * an upper bound on the bed's widest free range (`maxGap`) and the day until
 * which that bound holds (`validUntil`); a bed qualifies when the bound has
 * lapsed (validUntil <= s) or is wide enough (maxGap >= L). Inner nodes keep
 * min(validUntil) and max(maxGap), which makes "some leaf below qualifies"
 * exact, so a query costs O(log beds) per candidate.
 */
export class BedIndex {
	private readonly size: number;
	private readonly minValid: Float64Array;
	private readonly maxGap: Float64Array;

	constructor(readonly count: number) {
		let size = 1;
		while (size < Math.max(1, count)) size *= 2;
		this.size = size;
		this.minValid = new Float64Array(2 * size).fill(Infinity);
		this.maxGap = new Float64Array(2 * size).fill(-Infinity);
		for (let i = 0; i < count; i++) {
			this.minValid[size + i] = -Infinity;
			this.maxGap[size + i] = Infinity;
		}
		for (let n = size - 1; n >= 1; n--) {
			this.minValid[n] = Math.min(this.minValid[2 * n], this.minValid[2 * n + 1]);
			this.maxGap[n] = Math.max(this.maxGap[2 * n], this.maxGap[2 * n + 1]);
		}
	}

	set(bed: number, maxGap: number, validUntil: number): void {
		let n = this.size + bed;
		this.minValid[n] = validUntil;
		this.maxGap[n] = maxGap;
		// Up the tree while the summary changes: above a node that keeps its figures, nothing does.
		for (n >>= 1; n >= 1; n >>= 1) {
			const l = 2 * n;
			const minValid = Math.min(this.minValid[l], this.minValid[l + 1]);
			const widest = Math.max(this.maxGap[l], this.maxGap[l + 1]);
			if (minValid === this.minValid[n] && widest === this.maxGap[n]) break;
			this.minValid[n] = minValid;
			this.maxGap[n] = widest;
		}
	}

	/** Forget what is known about a bed: it will be examined next time. */
	invalidate(bed: number): void {
		this.set(bed, Infinity, -Infinity);
	}

	private qualifies(n: number, s: number, need: number): boolean {
		return this.minValid[n] <= s || this.maxGap[n] >= need;
	}

	/** The leftmost leaf under node n that qualifies (n itself qualifies). */
	private descend(n: number, s: number, need: number): number {
		while (n < this.size) n = this.qualifies(2 * n, s, need) ? 2 * n : 2 * n + 1;
		const bed = n - this.size;
		return bed < this.count ? bed : -1;
	}

	/**
	 * First bed index >= from that may hold `need` feet at time s; -1 if none.
	 * From the start, down from the root; from a later bed (the next candidate after
	 * one that did not fit), up from that leaf to the first qualifying subtree on its
	 * right, which is usually near.
	 */
	findFrom(from: number, s: number, need: number): number {
		if (from >= this.count) return -1;
		if (from <= 0) return this.qualifies(1, s, need) ? this.descend(1, s, need) : -1;
		let n = this.size + from;
		if (this.qualifies(n, s, need)) return from;
		while (n > 1) {
			if ((n & 1) === 0 && this.qualifies(n + 1, s, need)) return this.descend(n + 1, s, need);
			n >>= 1;
		}
		return -1;
	}
}
