// The beds as placement sees them while it lays plantings in: each bed's occupancies (days ×
// feet) and an index of the widest free gap per bed, so the first bed with room is found
// without looking at every bed. Used by placement.ts only.
import { BedIndex } from './bed-index';
import { type FlatOccupancies, firstGap, gap, instant, instantGap } from './bed-gaps';
import { type Bed, FT_EPSILON } from './bed-types';

interface BedState {
	bed: Bed;
	occ: FlatOccupancies;
}

export class Placer {
	readonly states: BedState[];
	readonly index: BedIndex;
	/** Families each bed held last season, by bed index. */
	readonly held: (string[] | undefined)[];

	constructor(beds: Bed[], prev: Record<string, string[]>) {
		this.states = beds.map((bed) => ({ bed, occ: [] }));
		this.index = new BedIndex(beds.length);
		this.held = beds.map((bed) => prev[bed.id]);
	}

	heldFamily(b: number, family: string | undefined): boolean {
		return family !== undefined && (this.held[b]?.includes(family) ?? false);
	}

	/** Occupy feet [startFt, startFt + lengthFt) of bed b over days [s, e). */
	put(b: number, s: number, e: number, startFt: number, lengthFt: number): void {
		this.states[b].occ.push(s, e, startFt, startFt + lengthFt);
		this.refresh(b, s);
	}

	/** Drop occupancies that ended before s: jobs come in field-date order, so none can matter again. */
	private prune(st: BedState, s: number): void {
		const occ = st.occ;
		let w = 0;
		for (let i = 0; i < occ.length; i += 4) {
			if (occ[i + 1] > s) {
				if (w !== i) {
					occ[w] = occ[i];
					occ[w + 1] = occ[i + 1];
					occ[w + 2] = occ[i + 2];
					occ[w + 3] = occ[i + 3];
				}
				w += 4;
			}
		}
		occ.length = w;
	}

	private refresh(b: number, s: number): void {
		const st = this.states[b];
		instantGap(st.occ, st.bed.lengthFt, s);
		this.index.set(b, instant.maxGap, instant.validUntil);
	}

	/** The last hit of find (one record, refilled: find runs for every planting and piece). */
	readonly hit = { b: 0, startFt: 0, gapFt: 0 };

	/** First bed (by order, optionally skipping some) with a gap of at least `need` ft over [s, e): written into `hit`. */
	find(s: number, e: number, need: number, skipFamily?: string): boolean {
		let from = 0;
		for (;;) {
			const b = this.index.findFrom(from, s, need - FT_EPSILON);
			if (b < 0) return false;
			from = b + 1;
			if (skipFamily !== undefined && this.held[b]?.includes(skipFamily)) continue;
			const st = this.states[b];
			if (st.bed.lengthFt < need - FT_EPSILON) {
				this.index.set(b, st.bed.lengthFt, Infinity);
				continue;
			}
			this.prune(st, s);
			if (firstGap(st.occ, st.bed.lengthFt, s, e, need)) {
				this.hit.b = b;
				this.hit.startFt = gap.startFt;
				this.hit.gapFt = gap.lengthFt;
				return true;
			}
			this.refresh(b, s);
		}
	}

	/** Take back the occupancy put as (s, e, a, b) in bed `bed` (the last one that matches: it was put last). */
	remove(bed: number, s: number, e: number, a: number, b: number): void {
		const occ = this.states[bed].occ;
		for (let i = occ.length - 4; i >= 0; i -= 4) {
			if (occ[i] === s && occ[i + 1] === e && occ[i + 2] === a && occ[i + 3] === b) {
				occ.splice(i, 4);
				break;
			}
		}
		this.index.invalidate(bed);
	}
}
