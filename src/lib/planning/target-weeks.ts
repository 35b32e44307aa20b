/** A variety's weekly targets as day numbers, and the check that planned supply meets them. */
import { type DayNumber, weekdayOf } from './day-number';
import { PlanningInputError, requireNonNegativeItem } from './errors';
import { isoWeekOfDay, weekStartDayItem } from './iso-week';
import type { PlanningWarning, WeeklyTarget } from './types';

/**
 * Sum duplicate weeks; return the Mondays (day numbers) of weeks with a positive
 * target, sorted, and beside them each week's quantity. Plain arrays filled in one
 * pass, not a map: this runs for every variety of a season plan.
 */
export function normaliseTargets(targets: WeeklyTarget[]): { mondays: DayNumber[]; qty: number[] } {
	if (!Array.isArray(targets)) throw new PlanningInputError('targets', 'must be a list of { week, quantity }');
	// Sized for every target and cut to length after (a list grown by push leaves its outgrown copies behind).
	const mondays: DayNumber[] = new Array<DayNumber>(targets.length);
	const qty: number[] = new Array<number>(targets.length);
	let n = 0;
	let last = -Infinity;
	let ascending = true;
	for (let i = 0; i < targets.length; i++) {
		const t = targets[i];
		const monday = weekStartDayItem(t.week, 'targets', i, 'week');
		const q = requireNonNegativeItem('targets', i, 'quantity', t.quantity);
		if (monday <= last) ascending = false;
		last = monday;
		// The usual case: one target per week, in week order; weeks of no target are left out.
		if (ascending && q > 0) {
			mondays[n] = monday;
			qty[n++] = q;
		}
	}
	if (ascending) {
		mondays.length = n;
		qty.length = n;
		return { mondays, qty };
	}
	n = 0;
	const sums = new Map<DayNumber, number>();
	for (const t of targets) {
		const monday = weekStartDayItem(t.week, 'targets', 0, 'week');
		sums.set(monday, (sums.get(monday) ?? 0) + t.quantity);
	}
	for (const m of [...sums.keys()].sort((a, b) => a - b)) {
		const q = sums.get(m) ?? 0;
		if (q > 0) {
			mondays[n] = m;
			qty[n++] = q;
		}
	}
	mondays.length = n;
	qty.length = n;
	return { mondays, qty };
}

/**
 * Belt and braces: recount supply per target week and report any week left short.
 * `windows` holds flat triples (first harvest day, last harvest day, bed-feet);
 * `qty[k]` is the target of the week starting `mondays[k]`.
 */
export function checkSupply(
	windows: number[],
	mondays: DayNumber[],
	qty: number[],
	unreachable: DayNumber[],
	perFtPerDay: number,
	shortfall: WeeklyTarget[],
	warnings: PlanningWarning[]
): void {
	const supply: number[] = new Array<number>(mondays.length).fill(0);
	for (let w = 0; w < windows.length; w += 3) {
		const a = windows[w];
		const b = windows[w + 1];
		const feet = windows[w + 2];
		const first = a - weekdayOf(a) + 1;
		// The first target week on or after the window's first Monday (mondays is sorted).
		let lo = 0;
		let hi = mondays.length;
		while (lo < hi) {
			const mid = (lo + hi) >> 1;
			if (mondays[mid] < first) lo = mid + 1;
			else hi = mid;
		}
		for (let k = lo; k < mondays.length && mondays[k] <= b; k++) {
			const monday = mondays[k];
			if ((monday - first) % 7 !== 0) continue;
			const days = Math.min(b, monday + 6) - Math.max(a, monday) + 1;
			supply[k] += feet * perFtPerDay * days;
		}
	}
	const skip = unreachable.length > 0 ? new Set(unreachable) : undefined;
	const short: string[] = [];
	for (let k = 0; k < mondays.length; k++) {
		const m = mondays[k];
		if (skip?.has(m)) continue;
		const gap = qty[k] - supply[k];
		if (gap > 1e-9 * Math.max(1, qty[k])) {
			shortfall.push({ week: isoWeekOfDay(m), quantity: gap });
			short.push(isoWeekOfDay(m));
		}
	}
	if (short.length > 0) {
		warnings.push({
			code: 'supply_short',
			message: `Planned supply falls short of target in ${short.join(', ')}.`,
			weeks: short
		});
	}
	shortfall.sort((x, y) => (x.week < y.week ? -1 : x.week > y.week ? 1 : 0));
}
