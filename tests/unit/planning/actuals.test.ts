// Actual against plan and the rest-of-season adjustment on a small worked example; every
// expected figure is worked by hand in the comments.
import { describe, expect, it } from 'vitest';
import { actualsAgainstPlan, PlanningInputError } from '../../../src/lib/planning';

// Two carrot plantings of 10 ft at 2 lb per bed-foot, 14-day windows (flat curve: 20 lb over
// 14 days = 10 lb a full week):
//   A: field 2026-04-02, harvest Mon 2026-06-01 (W23) – Sun 2026-06-14 (W24)
//   B: field 2026-04-16, harvest Mon 2026-06-15 (W25) – Sun 2026-06-28 (W26)
// Current week 2026-W25, so W23 and W24 are complete ("so far").
// Logged: A 6 lb on Wed 2026-06-03 (W23), 9 lb on Wed 2026-06-10 (W24); B 4 lb on 2026-06-16 (W25).
const input = {
	currentWeek: '2026-W25',
	plantings: [
		{
			key: 'A',
			crop: 'carrot',
			variety: 'nantes',
			bedFeet: 10,
			yieldPerBedFoot: 2,
			fieldDate: '2026-04-02',
			firstHarvest: '2026-06-01',
			lastHarvest: '2026-06-14',
			actualFieldDate: '2026-04-05',
			finished: true
		},
		{
			key: 'B',
			crop: 'carrot',
			variety: 'nantes',
			bedFeet: 10,
			yieldPerBedFoot: 2,
			fieldDate: '2026-04-16',
			firstHarvest: '2026-06-15',
			lastHarvest: '2026-06-28'
		}
	],
	harvests: [
		{ plantingKey: 'A', date: '2026-06-03', quantity: 6 },
		{ plantingKey: 'A', date: '2026-06-10', quantity: 9 },
		{ plantingKey: 'B', date: '2026-06-16', quantity: 4 }
	]
};

describe('actualsAgainstPlan, worked example', () => {
	const out = actualsAgainstPlan(input);

	it('per planting: logged against forecast so far, days to maturity, yield per bed-foot', () => {
		const a = out.plantings.find((p) => p.key === 'A')!;
		// Forecast so far = W23 10 + W24 10 = 20 lb; logged 6 + 9 = 15 lb; 15 ÷ 20 = 75 %.
		expect(a.forecastSoFar).toBeCloseTo(20, 9);
		expect(a.logged).toBe(15);
		expect(a.pctOfForecast).toBeCloseTo(75, 9);
		// Planned: 2026-04-02 → 2026-06-01 = 28 (rest of April) + 31 (May) + 1 = 60 days.
		expect(a.plannedDtm).toBe(60);
		// Actual: from the actual field date 2026-04-05 to the first logged harvest 2026-06-03
		// = 25 (Apr 5→30) + 31 (May) + 3 = 59 days.
		expect(a.actualDtm).toBe(59);
		// 15 lb ÷ 10 ft = 1.5 lb per bed-foot (planned 2).
		expect(a.actualYieldPerBedFoot).toBeCloseTo(1.5, 9);

		const b = out.plantings.find((p) => p.key === 'B')!;
		// B harvests from W25, the current week: nothing forecast so far, so no percentage.
		expect(b.forecastSoFar).toBe(0);
		expect(b.pctOfForecast).toBeNull();
		// No recorded actual field date: the planned one, 2026-04-16 → first logged 2026-06-16
		// = 14 (Apr 16→30) + 31 + 16 = 61 days.
		expect(b.actualDtm).toBe(61);
	});

	it('per week: logged and percent of forecast', () => {
		const w = Object.fromEntries(out.weeks.map((r) => [r.week, r]));
		// W23: 6 of 10 = 60 %; W24: 9 of 10 = 90 %; W25: 4 of 10 = 40 % (shown, not yet counted).
		expect(w['2026-W23']).toMatchObject({ logged: 6, past: true, adjusted: null });
		expect(w['2026-W23'].pctOfForecast).toBeCloseTo(60, 9);
		expect(w['2026-W24'].pctOfForecast).toBeCloseTo(90, 9);
		expect(w['2026-W25'].pctOfForecast).toBeCloseTo(40, 9);
		expect(w['2026-W25'].past).toBe(false);
	});

	it('per crop: the ratio so far scales the rest of the season', () => {
		const c = out.crops[0];
		// Ratio = 15 ÷ 20 = 0.75. Rest of season: W25 10 + W26 10 = 20 lb forecast; adjusted 20 × 0.75 = 15 lb.
		expect(c.ratio).toBeCloseTo(0.75, 9);
		expect(c.forecastRest).toBeCloseTo(20, 9);
		expect(c.adjustedRest).toBeCloseTo(15, 9);
		const w = Object.fromEntries(out.weeks.map((r) => [r.week, r]));
		// Each of W25 and W26: 10 × 0.75 = 7.5 lb.
		expect(w['2026-W25'].adjusted).toBeCloseTo(7.5, 9);
		expect(w['2026-W26'].adjusted).toBeCloseTo(7.5, 9);
	});

	it('per variety: yield only from finished plantings, days to maturity from every first harvest', () => {
		const v = out.varieties[0];
		// Only A is finished: 15 lb ÷ 10 ft = 1.5 lb/ft from 1 planting.
		expect(v).toMatchObject({ variety: 'nantes', yieldPlantings: 1, dtmPlantings: 2 });
		expect(v.observedYieldPerBedFoot).toBeCloseTo(1.5, 9);
		// Mean of 59 and 61 = 60 days.
		expect(v.observedDtm).toBe(60);
	});

	it('a week split by the window gets its share of days', () => {
		// One planting, 7 ft × 2 lb = 14 lb over Wed 2026-06-03 … Tue 2026-06-16 (14 days, 1 lb a day):
		// W23 gets Wed–Sun = 5 days = 5 lb, W24 7 lb, W25 Mon–Tue 2 lb. Current week W25;
		// logged 4 lb in W23 and 7 lb in W24: ratio (4 + 7) ÷ (5 + 7) = 11/12; W25 adjusted 2 × 11/12 = 1.8333.
		const r = actualsAgainstPlan({
			currentWeek: '2026-W25',
			plantings: [
				{
					key: 'x',
					crop: 'c',
					variety: 'v',
					bedFeet: 7,
					yieldPerBedFoot: 2,
					fieldDate: '2026-04-01',
					firstHarvest: '2026-06-03',
					lastHarvest: '2026-06-16'
				}
			],
			harvests: [
				{ plantingKey: 'x', date: '2026-06-05', quantity: 4 },
				{ plantingKey: 'x', date: '2026-06-09', quantity: 7 }
			]
		});
		expect(r.crops[0].ratio).toBeCloseTo(11 / 12, 9);
		expect(r.weeks.find((w) => w.week === '2026-W25')!.adjusted).toBeCloseTo(1.8333333, 6);
	});

	it('no forecast so far: no ratio, the rest stays as forecast', () => {
		const r = actualsAgainstPlan({ ...input, currentWeek: '2026-W20', harvests: [] });
		expect(r.crops[0].ratio).toBeNull();
		// 40 lb over W23–W26, all still ahead.
		expect(r.crops[0].adjustedRest).toBeCloseTo(40, 9);
	});

	it('a harvest of an unknown planting names the field', () => {
		expect(() =>
			actualsAgainstPlan({ ...input, harvests: [{ plantingKey: 'Z', date: '2026-06-03', quantity: 1 }] })
		).toThrow(PlanningInputError);
		try {
			actualsAgainstPlan({ ...input, harvests: [{ plantingKey: 'Z', date: '2026-06-03', quantity: 1 }] });
		} catch (e) {
			expect((e as PlanningInputError).field).toBe('harvests[0].plantingKey');
		}
	});
});
