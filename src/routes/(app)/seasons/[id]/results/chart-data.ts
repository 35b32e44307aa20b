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

export interface StepPoint {
	week: string;
	v: number;
	/** The week's left edge, or (last of a run) its right edge. */
	edge: 'start' | 'end';
}

/**
 * A step line's points in runs of consecutive weeks that have a value; a week without one breaks
 * the line, so it never bridges weeks without a forecast. Each run ends at its last week's right edge.
 */
export function stepRuns(pts: { week: string; v: number | null }[]): StepPoint[][] {
	const runs: StepPoint[][] = [];
	let run: StepPoint[] | null = null;
	for (const p of pts) {
		if (p.v === null) {
			run = null;
			continue;
		}
		if (!run) runs.push((run = []));
		run.push({ week: p.week, v: p.v, edge: 'start' });
	}
	for (const r of runs) r.push({ ...r.at(-1)!, edge: 'end' });
	return runs;
}
