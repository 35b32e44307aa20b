// A season plan's proposals in plan order, from what planSeason knows of each (see season-order.ts).
import { daysFromCivil } from './day-number';
import { byDayThenRank, keyRanks, pieceRanks } from './season-order';
import type { ProposedPlanting } from './season-types';

// The days whose dates are four-digit years: there, date strings sort as the days do.
const FIRST_DAY = daysFromCivil(0, 1, 1);
const LAST_DAY = daysFromCivil(9999, 12, 31);

/**
 * A season plan's proposals in plan order (field date, then key: see season-order.ts)
 * from what planSeason knows of each, the day and rank of its record and piece, so
 * no keys are compared; null in the cases that rule does not cover.
 */
export function planOrder(
	all: ProposedPlanting[],
	fromOf: number[],
	pieceOf: number[],
	pieceSlots: number,
	fieldDays: number[],
	groups: { prefix: string; start: number; count: number }[]
): ProposedPlanting[] | null {
	const ranks = keyRanks(groups, fieldDays.length);
	if (!ranks) return null;
	const pieces = pieceRanks(pieceSlots);
	const day: number[] = filled(all.length, 0);
	const rank: number[] = filled(all.length, 0);
	for (let i = 0; i < all.length; i++) {
		const fieldDay = fieldDays[fromOf[i]];
		if (fieldDay < FIRST_DAY || fieldDay > LAST_DAY) return null;
		day[i] = fieldDay;
		rank[i] = ranks[fromOf[i]] * pieceSlots + pieces[pieceOf[i]];
	}
	return byDayThenRank(all, day, rank, fieldDays.length * pieceSlots);
}

function filled<T>(n: number, fill: T): T[] {
	return new Array<T>(n).fill(fill);
}
