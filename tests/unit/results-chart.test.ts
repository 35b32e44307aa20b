// The Actual vs plan chart's step lines: a run of weeks with a value is one step line ending at
// its last week's right edge; a week without a forecast breaks the line instead of being bridged.
import { describe, expect, it } from 'vitest';
import type { CropWeekActual } from '$lib/planning';
import { chartWeeks, stepRuns } from '../../src/routes/(app)/seasons/[id]/results/chart-data';

describe('step lines of the Actual vs plan chart', () => {
	it('breaks the adjusted line over weeks without a forecast', () => {
		const row = (week: string, forecast: number, logged: number, adjusted: number | null) =>
			({ crop: '1', week, forecast, logged, pctOfForecast: null, past: false, adjusted }) satisfies CropWeekActual;
		const weeks = chartWeeks([row('2027-W30', 10, 8, 8), row('2027-W31', 10, 0, 8), row('2027-W34', 12, 0, 9.6)]);
		// Source: ISO 8601 weeks run on without a gap: W32 and W33 lie between W31 and W34.
		expect(weeks.map((w) => w.week)).toEqual(['2027-W30', '2027-W31', '2027-W32', '2027-W33', '2027-W34']);
		const runs = stepRuns(weeks.map((w) => ({ week: w.week, v: w.adjusted })));
		expect(runs).toEqual([
			[
				{ week: '2027-W30', v: 8, edge: 'start' },
				{ week: '2027-W31', v: 8, edge: 'start' },
				{ week: '2027-W31', v: 8, edge: 'end' }
			],
			[
				{ week: '2027-W34', v: 9.6, edge: 'start' },
				{ week: '2027-W34', v: 9.6, edge: 'end' }
			]
		]);
	});
	it('a line with a value every week is one run, and one with none draws nothing', () => {
		const pts = ['2027-W01', '2027-W02'].map((week, i) => ({ week, v: i }));
		expect(stepRuns(pts)).toHaveLength(1);
		expect(stepRuns(pts.map((p) => ({ ...p, v: null })))).toEqual([]);
	});
});
