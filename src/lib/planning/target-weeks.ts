/** A variety's weekly targets as day numbers, and the check that planned supply meets them. */
import { type DayNumber, weekdayOf } from './day-number';
import { PlanningInputError, requireNonNegativeItem } from './errors';
import { isoWeekOfDay, weekStartDayItem } from './iso-week';
import type { PlanningWarning, WeeklyTarget } from './types';

/** Sum duplicate weeks; return Mondays (day numbers) of weeks with a positive target, sorted. */
export function normaliseTargets(targets: WeeklyTarget[]): { mondays: DayNumber[]; qty: Map<DayNumber, number> } {
	if (!Array.isArray(targets)) throw new PlanningInputError('targets', 'must be a list of { week, quantity }');
	const qty = new Map<DayNumber, number>();
	targets.forEach((t, i) => {
		const monday = weekStartDayItem(t.week, 'targets', i, 'week');
		const q = requireNonNegativeItem('targets', i, 'quantity', t.quantity);
		qty.set(monday, (qty.get(monday) ?? 0) + q);
	});
	const mondays = [...qty.keys()].filter((m) => (qty.get(m) ?? 0) > 0).sort((a, b) => a - b);
	return { mondays, qty };
}

/** Belt and braces: recount supply per target week and report any week left short. */
export function checkSupply(
	windows: [DayNumber, DayNumber, number][],
	mondays: DayNumber[],
	qty: Map<DayNumber, number>,
	unreachable: DayNumber[],
	perFtPerDay: number,
	shortfall: WeeklyTarget[],
	warnings: PlanningWarning[]
): void {
	const supply = new Map<DayNumber, number>();
	for (const [a, b, feet] of windows) {
		for (let monday = a - weekdayOf(a) + 1; monday <= b; monday += 7) {
			const days = Math.min(b, monday + 6) - Math.max(a, monday) + 1;
			supply.set(monday, (supply.get(monday) ?? 0) + feet * perFtPerDay * days);
		}
	}
	const skip = new Set(unreachable);
	const short: string[] = [];
	for (const m of mondays) {
		if (skip.has(m)) continue;
		const gap = (qty.get(m) ?? 0) - (supply.get(m) ?? 0);
		if (gap > 1e-9 * Math.max(1, qty.get(m) ?? 0)) {
			shortfall.push({ week: isoWeekOfDay(m), quantity: gap });
			short.push(isoWeekOfDay(m));
		}
	}
	if (short.length > 0) {
		warnings.push({ code: 'supply_short', message: `Planned supply falls short of target in ${short.join(', ')}.`, weeks: short });
	}
	shortfall.sort((x, y) => (x.week < y.week ? -1 : x.week > y.week ? 1 : 0));
}
