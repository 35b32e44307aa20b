// The weeks one crop's chart draws: every ISO week from its first to its last row, so gaps
// show as gaps rather than closing up.
import { weeksBetween, type CropWeekActual } from '$lib/planning';

export interface ChartWeek {
	week: string;
	forecast: number;
	logged: number;
	adjusted: number | null;
}

export function chartWeeks(rows: CropWeekActual[]): ChartWeek[] {
	if (rows.length === 0) return [];
	const by = new Map(rows.map((r) => [r.week, r]));
	return weeksBetween(rows[0].week, rows.at(-1)!.week).map((week) => {
		const r = by.get(week);
		return { week, forecast: r?.forecast ?? 0, logged: r?.logged ?? 0, adjusted: r ? r.adjusted : null };
	});
}
