import { type Bed, type BedPlanting, DEFAULT_TURNAROUND_DAYS, type Occupancy } from './bed-types';
import { freeRanges } from './bed-gaps';
import { PlanningInputError, requireNonNegativeInteger } from './errors';
import { toDayNumber } from './day-number';

export interface FreeRange {
	startFt: number;
	endFt: number;
	lengthFt: number;
}

export interface BedFreeSpace {
	bedId: string;
	ranges: FreeRange[];
	freeFt: number;
	longestFt: number;
}

/**
 * Per bed, the foot ranges free for the whole of [fromDate, toDate] (both
 * inclusive), counting each planting's turnaround days: answers "which beds
 * are free from week X, and for how many feet".
 */
export function freeSpace(
	plantings: BedPlanting[],
	beds: Bed[],
	fromDate: string,
	toDate: string,
	turnaroundDays = DEFAULT_TURNAROUND_DAYS
): BedFreeSpace[] {
	requireNonNegativeInteger('turnaroundDays', turnaroundDays);
	const s = toDayNumber(fromDate, 'fromDate');
	const e = toDayNumber(toDate, 'toDate') + 1;
	if (e <= s) throw new PlanningInputError('toDate', 'is before fromDate');
	const byBed = new Map<string, Occupancy[]>();
	for (const p of plantings) {
		const list = byBed.get(p.bedId) ?? [];
		list.push({
			s: toDayNumber(p.fieldDate),
			e: toDayNumber(p.lastHarvest) + turnaroundDays + 1,
			a: p.startFt,
			b: p.startFt + p.lengthFt,
			key: p.key
		});
		byBed.set(p.bedId, list);
	}
	return beds.map((bed) => {
		const ranges = freeRanges(byBed.get(bed.id) ?? [], bed.lengthFt, s, e).map((g) => ({
			startFt: g.startFt,
			endFt: g.startFt + g.lengthFt,
			lengthFt: g.lengthFt
		}));
		return {
			bedId: bed.id,
			ranges,
			freeFt: ranges.reduce((t, r) => t + r.lengthFt, 0),
			longestFt: ranges.reduce((m, r) => Math.max(m, r.lengthFt), 0)
		};
	});
}
