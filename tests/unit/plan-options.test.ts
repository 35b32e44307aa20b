// The options the owner's plan and the demo seed both plan with (src/lib/plan-options.ts).
import { describe, expect, it } from 'vitest';
import { earliestFieldDate, previousFamiliesByBed, seasonPlanOptions } from '../../src/lib/plan-options';

describe('season plan options', () => {
	it('the ground is workable 6 weeks before the last spring frost, in the season’s own year', () => {
		// common practice (no published source): hardy crops go out 4–6 weeks before the last spring frost.
		// 10 May 2027 − 42 days: 31 days back to 9 April, 11 more to 29 March.
		expect(earliestFieldDate('2027-05-10', 2027)).toBe('2027-03-29');
		// The farm's frost date is a month and day: a 2028 season uses 10 May 2028 (2028 is a leap year:
		// 42 days before is 29 March as well, since no 29 February falls in between).
		expect(earliestFieldDate('2027-05-10', 2028)).toBe('2028-03-29');
	});

	it('carries the farm’s increment and turnaround and the request’s interval and margin, nothing else', () => {
		const farm = { bedFootIncrement: 5, turnaroundDays: 7, lastSpringFrost: '2027-05-10' };
		expect(seasonPlanOptions(farm, {}, '2026-12-02', 2027)).toEqual({
			bedFootIncrement: 5,
			turnaroundDays: 7,
			today: '2026-12-02',
			earliestFieldDate: '2027-03-29'
		});
		expect(seasonPlanOptions(farm, { intervalWeeks: 2, margin: 0.2 }, '2026-12-02', 2027)).toMatchObject({
			intervalWeeks: 2,
			margin: 0.2
		});
	});

	it('rotation looks back three years before the season, and not into it', () => {
		const families = previousFamiliesByBed(
			[
				{ bedId: 'A', family: 'Amaryllidaceae', fieldDate: '2026-10-26' },
				{ bedId: 'A', family: 'Solanaceae', fieldDate: '2024-05-20' },
				{ bedId: 'A', family: 'Fabaceae', fieldDate: '2023-12-31' },
				{ bedId: 'B', family: 'Brassicaceae', fieldDate: '2027-04-01' },
				{ bedId: null, family: 'Apiaceae', fieldDate: '2026-06-01' }
			],
			'2027-01-01'
		);
		expect(families).toEqual({ A: ['Amaryllidaceae', 'Solanaceae'] });
	});
});
