// Storage crops are sized as one harvest that feeds the demand weeks after it from store.
import { describe, expect, it } from 'vitest';
import { planSuccessions, weeksBetween } from '../../../src/lib/planning/index';
import { storeGives } from '../../../src/lib/planning/storage-sizing';
import { farm42, targetsFor, variety } from './fixtures';

// Invented demo-style figures: hardneck garlic, 240 days from autumn planting to the July dig, dug
// at once (single cut), 7 heads per bed-foot; cured heads keep about six months with a little
// shrinkage each week (common practice, no published source; from memory).
const garlic = variety({
	crop: 'garlic',
	daysToMaturity: 240,
	harvestWindowDays: 14,
	yieldPerBedFoot: 7,
	harvestCurve: { shape: 'single' },
	storage: { keepWeeks: 24, lossPerWeek: 0.01 }
});
const weeks = weeksBetween('2026-W30', '2026-W44');

describe('storage crops', () => {
	it('worked example: one autumn planting sized to feed 15 weeks from store at 1 % loss a week', () => {
		// 20 heads a week in W30–W44, margin 10 %: 22 a week. A lot dug in W30 loses 1 % of what is
		// left each week, so the heads for week W30 + k must be 22 ÷ 0.99^k at the dig:
		// Σ_{k=0}^{14} 22 ÷ 0.99^k = 22 × (0.99^−15 − 1) ÷ (0.99^−1 − 1) = 22 × 16.108 = 354.4 heads
		// → 354.4 ÷ 7 heads per ft = 50.6 → 51 ft (1-ft increments); 50 ft (350 heads) is too few.
		const plan = planSuccessions({
			variety: garlic,
			targets: targetsFor(weeks, 20),
			farm: farm42,
			options: { bedFootIncrement: 1 }
		});
		expect(plan.successions.map((s) => s.bedFeet)).toEqual([51]);
		const [s] = plan.successions;
		// Dug the first demand week, Mon 20 Jul 2026; planted 240 days of growth before, the autumn before.
		// (Days under 12 h of daylight count for less — see growth-clock.test.ts — so more than 240
		// calendar days: late summer 2025 at 42° N, not the 22 Nov that 240 calendar days would give.)
		expect(s.firstHarvest).toBe('2026-07-20');
		expect(s.fieldDate > '2025-08-01' && s.fieldDate < '2025-11-22').toBe(true);
		expect(plan.shortfall).toEqual([]);
		let sum = 0;
		for (let k = 0; k <= 14; k++) sum += 22 / 0.99 ** k;
		expect(sum).toBeCloseTo(354.4, 1);
		// The store fed by 51 ft (357 heads) meets every week; 50 ft (350 heads) runs out in the last.
		const need = new Float64Array(15).fill(22);
		expect(Math.min(...storeGives(new Map([[0, 357]]), need, 24, 0.01))).toBeCloseTo(22, 9);
		expect(storeGives(new Map([[0, 350]]), need, 24, 0.01)[14]).toBeLessThan(22);
	});

	it('counts what is already in store: a kept planting dug two weeks before the demand starts', () => {
		// 300 heads dug in W28 (outside the plan). Through W29 they lose 1 % twice before W30:
		// 300 × 0.99² = 294.03 at W30, worth Σ 22 ÷ 0.99^k for as many weeks as it lasts; the plan adds
		// only the rest, again as one harvest (never a run of successions).
		const plan = planSuccessions({
			variety: garlic,
			targets: targetsFor(weeks, 20),
			supplied: [{ week: '2026-W28', quantity: 300 }],
			farm: farm42,
			options: { bedFootIncrement: 1 }
		});
		expect(plan.successions).toHaveLength(1);
		const total = plan.successions[0].bedFeet * 7;
		// Without the kept heads 357 would be needed; with them far fewer.
		expect(total).toBeLessThan(357 - 250);
		expect(plan.shortfall).toEqual([]);
	});

	it('a harvest that cannot be reached (planting before today) leaves the weeks short, with a warning', () => {
		const plan = planSuccessions({
			variety: garlic,
			targets: targetsFor(weeks, 20),
			farm: farm42,
			options: { today: '2026-03-01' }
		});
		expect(plan.successions).toEqual([]);
		expect(plan.warnings.find((w) => w.code === 'unreachable_week')?.weeks).toEqual(weeks);
	});
});
