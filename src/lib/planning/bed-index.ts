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
		for (let n = size - 1; n >= 1; n--) this.pull(n);
	}

	private pull(n: number): void {
		this.minValid[n] = Math.min(this.minValid[2 * n], this.minValid[2 * n + 1]);
		this.maxGap[n] = Math.max(this.maxGap[2 * n], this.maxGap[2 * n + 1]);
	}

	set(bed: number, maxGap: number, validUntil: number): void {
		let n = this.size + bed;
		this.minValid[n] = validUntil;
		this.maxGap[n] = maxGap;
		for (n >>= 1; n >= 1; n >>= 1) this.pull(n);
	}

	/** Forget what is known about a bed: it will be examined next time. */
	invalidate(bed: number): void {
		this.set(bed, Infinity, -Infinity);
	}

	/** First bed index >= from that may hold `need` feet at time s; -1 if none. */
	findFrom(from: number, s: number, need: number): number {
		return this.find(1, 0, this.size - 1, from, s, need);
	}

	private find(n: number, lo: number, hi: number, from: number, s: number, need: number): number {
		if (hi < from || !(this.minValid[n] <= s || this.maxGap[n] >= need)) return -1;
		if (lo === hi) return lo < this.count ? lo : -1;
		const mid = (lo + hi) >> 1;
		const left = this.find(2 * n, lo, mid, from, s, need);
		return left >= 0 ? left : this.find(2 * n + 1, mid + 1, hi, from, s, need);
	}
}
