// Net-need sizing and harvest curves: each succession covers what its weeks still lack after
// everything else harvesting then, and the plan stays close to the linear program's lower bound.
import fc from 'fast-check';
import highsLoader from 'highs';
import { beforeAll, describe, expect, it } from 'vitest';
import {
	addWeeks,
	dailyWeights,
	forecast,
	planSuccessions,
	sizingLp,
	weeksBetween
} from '../../../src/lib/planning/index';
import type { PlanInput } from '../../../src/lib/planning/index';
import { farm42, targetsFor, variety } from './fixtures';

type Highs = Awaited<ReturnType<typeof highsLoader>>;
let highs: Highs;
beforeAll(async () => {
	highs = await highsLoader();
});

const supplyByWeek = (plan: ReturnType<typeof planSuccessions>): Map<string, number> =>
	new Map(
		forecast(
			plan.successions.map((s) => ({ ...s, crop: 'x' })),
			[]
		).map((r) => [r.week, r.supply])
	);

describe('net-need sizing', () => {
	it('weekly sowings of a 14-day-window crop hold steady supply within one increment of target × 1.1', () => {
		// common practice (no published source): salad turnips or radish picked over two weeks, sown weekly.
		// 10 lb a week wanted for 12 weeks; 1.4 lb per bed-foot over 14 days = 0.7 lb per ft a week.
		const v = variety({ daysToMaturity: 35, harvestWindowDays: 14, yieldPerBedFoot: 1.4 });
		const weeks = weeksBetween('2026-W24', '2026-W35');
		const plan = planSuccessions({
			variety: v,
			targets: targetsFor(weeks, 10),
			farm: farm42,
			options: { intervalWeeks: 1, bedFootIncrement: 1 }
		});
		const supply = supplyByWeek(plan);
		// Needed: 10 × 1.1 = 11 lb a week → 11 ÷ 0.7 = 15.71 → 16 ft, giving 16 × 0.7 = 11.2 lb. The next week the same
		// succession still gives 11.2 lb, so the next succession starts two weeks later: never 22 lb in a week.
		for (const w of weeks) {
			expect(supply.get(w)).toBeGreaterThanOrEqual(11 - 1e-9);
			expect(supply.get(w)).toBeLessThanOrEqual(11 + 0.7 + 1e-9);
		}
		expect(plan.successions.map((s) => s.bedFeet)).toEqual([16, 16, 16, 16, 16, 16]);
	});

	it('counts what other plantings already harvest in a week (kept plantings, other seasons)', () => {
		const v = variety({ daysToMaturity: 35, harvestWindowDays: 7, yieldPerBedFoot: 1 });
		// 20 wanted in each of W30–W31; 15 already comes in W30 from a kept planting.
		// W30 needs 20 × 1.1 − 15 = 7 → 7 ft; W31 needs 22 → 22 ft (1 per ft over a 7-day window).
		const plan = planSuccessions({
			variety: v,
			targets: targetsFor(['2026-W30', '2026-W31'], 20),
			supplied: [{ week: '2026-W30', quantity: 15 }],
			farm: farm42,
			options: { bedFootIncrement: 1 }
		});
		expect(plan.successions.map((s) => [s.firstHarvest, s.bedFeet])).toEqual([
			['2026-07-20', 7],
			['2026-07-27', 22]
		]);
	});

	it('ramp, peak and tail: a worked example', () => {
		// common practice (no published source): bush beans are picked lightly the first week, heavily for
		// two, lightly in the last. A 28-day window with a 7-day ramp and a 7-day tail: day weights rise
		// (0.5 … 6.5) ÷ 7, hold at 1 for 14 days, fall (6.5 … 0.5) ÷ 7. Sum 3.5 + 14 + 3.5 = 21, so the
		// four weeks get 3.5/21 = 1/6, 1/3, 1/3, 1/6 of the yield.
		const curve = { shape: 'ramp' as const, rampDays: 7, tailDays: 7 };
		const w = dailyWeights(curve, 28);
		const week = (k: number) => w.slice(7 * k, 7 * k + 7).reduce((a, b) => a + b, 0);
		expect([0, 1, 2, 3].map(week).map((x) => Math.round(x * 1e9) / 1e9)).toEqual(
			[1 / 6, 1 / 3, 1 / 3, 1 / 6].map((x) => Math.round(x * 1e9) / 1e9)
		);
		// 60 ft × 2 lb per ft = 120 lb: 20, 40, 40, 20 lb from a first harvest on Mon 20 Jul (W30).
		const rows = forecast(
			[{ crop: 'bean', firstHarvest: '2026-07-20', lastHarvest: '2026-08-16', bedFeet: 60, yieldPerBedFoot: 2, curve }],
			[]
		);
		expect(rows.map((r) => Math.round(r.supply * 1e6) / 1e6)).toEqual([20, 40, 40, 20]);
		// Planning 40 lb in W31 and W32 (margin 0): a start in W30 puts both in the peak, 40 ÷ (2 × 1/3) = 60 ft;
		// a start in W31 would need 40 ÷ (2 × 1/6) = 120 ft. The planner takes the cheaper one.
		const bean = variety({ daysToMaturity: 50, harvestWindowDays: 28, yieldPerBedFoot: 2, harvestCurve: curve });
		const plan = planSuccessions({
			variety: bean,
			targets: targetsFor(['2026-W31', '2026-W32'], 40),
			farm: farm42,
			options: { margin: 0 }
		});
		expect(plan.successions.map((s) => [s.firstHarvest, s.bedFeet])).toEqual([['2026-07-20', 60]]);
	});

	it('cut-and-come-again: cuts two weeks apart feed alternate weeks', () => {
		// common practice (no published source): salad mix regrows for a second cut about two weeks after the first,
		// a little lighter. Cuts on days 0 and 14 of a 21-day window, the second 0.8 of the first:
		// shares 1 ÷ 1.8 = 0.5556 and 0.8 ÷ 1.8 = 0.4444.
		const curve = { shape: 'cuts' as const, intervalDays: 14, regrowth: 0.8 };
		const rows = forecast(
			[{ crop: 'mix', firstHarvest: '2026-06-01', lastHarvest: '2026-06-21', bedFeet: 18, yieldPerBedFoot: 1, curve }],
			[]
		);
		expect(rows.map((r) => [r.week, Math.round(r.supply * 1e4) / 1e4])).toEqual([
			['2026-W23', 10],
			['2026-W24', 0],
			['2026-W25', 8]
		]);
	});
});

describe('net-need sizing: properties', () => {
	const cropArb = fc.record({
		harvestWindowDays: fc.integer({ min: 1, max: 63 }),
		yieldPerBedFoot: fc.double({ min: 0.05, max: 10, noNaN: true }),
		daysToMaturity: fc.integer({ min: 20, max: 140 }),
		shape: fc.constantFrom('flat' as const, 'ramp' as const, 'single' as const, 'cuts' as const)
	});
	type Crop = {
		harvestWindowDays: number;
		yieldPerBedFoot: number;
		daysToMaturity: number;
		shape: 'flat' | 'ramp' | 'single' | 'cuts';
	};
	const inputOf = (c: Crop, startWeek: number, quantities: number[], increment: number, margin: number): PlanInput => ({
		variety: variety({ ...c, harvestCurve: { shape: c.shape } }),
		targets: quantities.map((quantity, i) => ({
			week: addWeeks(`2026-W${String(startWeek).padStart(2, '0')}`, i),
			quantity
		})),
		farm: farm42,
		options: { bedFootIncrement: increment, margin }
	});
	const args = [
		cropArb,
		fc.integer({ min: 10, max: 40 }),
		fc.array(fc.oneof(fc.constant(0), fc.double({ min: 0.1, max: 500, noNaN: true })), { minLength: 1, maxLength: 20 }),
		fc.constantFrom(1, 2.5, 5),
		fc.double({ min: 0, max: 0.5, noNaN: true })
	] as const;

	it('every reachable week gets its target × (1 + margin); no harvest before the field date', () => {
		fc.assert(
			fc.property(...args, (c, startWeek, quantities, increment, margin) => {
				const input = inputOf(c, startWeek, quantities, increment, margin);
				const plan = planSuccessions(input);
				const unreachable = new Set(
					plan.warnings.filter((w) => w.code === 'unreachable_week').flatMap((w) => w.weeks ?? [])
				);
				const supply = supplyByWeek(plan);
				for (const t of input.targets) {
					if (t.quantity > 0 && !unreachable.has(t.week))
						expect(supply.get(t.week) ?? 0).toBeGreaterThanOrEqual(t.quantity * (1 + margin) * (1 - 1e-9));
				}
				for (const s of plan.successions) {
					expect(s.fieldDate < s.firstHarvest).toBe(true);
					if (s.traySowDate) expect(s.traySowDate <= s.fieldDate).toBe(true);
				}
			}),
			{ numRuns: 200 }
		);
	});

	// Every curve, ramp-peak-tail included: the plan solves the covering program exactly and rounds
	// each succession up to the increment, so it stays within one increment per succession of the bound.
	it('bed-foot-days stay within 5 % (plus one increment per succession) of the linear-program bound', () => {
		fc.assert(
			fc.property(...args, (c, startWeek, quantities, increment, margin) => {
				const input = inputOf(c, startWeek, quantities, increment, margin);
				const { lp, planBedFootDays } = sizingLp(input);
				if (!lp) return;
				const result = highs.solve(lp);
				expect(result.Status).toBe('Optimal');
				const plan = planSuccessions(input);
				// One increment for each succession, held for its whole stay in the bed.
				const slack = plan.successions.reduce(
					(a, s) =>
						a +
						(increment * (Date.parse(s.firstHarvest) - Date.parse(s.fieldDate))) / 864e5 +
						increment * c.harvestWindowDays,
					0
				);
				expect(planBedFootDays).toBeLessThanOrEqual(result.ObjectiveValue * 1.05 + slack + 1e-6);
			}),
			{ numRuns: Number(process.env.FC_PROPERTY_RUNS ?? 60) }
		);
	}, 60_000);
});
