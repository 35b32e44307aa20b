import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { PlanningInputError, growingDegreeDays, meanDegreeDays } from '../../../src/lib/planning/index';

describe('growing degree days', () => {
	it('matches the published 86/50 °F worked examples', () => {
		// Source: Iowa State University, Agronomy 541 lesson on GDD; a 2018 newspaper worked example (Waushara Argus)
		expect(growingDegreeDays(70, 50, 50, 86)).toBe(10);
		expect(growingDegreeDays(90, 65, 50, 86)).toBe(25.5);
		expect(growingDegreeDays(72, 46, 50, 86)).toBe(11);
		expect(growingDegreeDays(63, 42, 50, 86)).toBe(6.5);
	});

	it('adds at most 36 a day under the 86/50 cutoff', () => {
		// Source: Iowa State University, Agronomy 541 lesson on GDD (at most 36 a day)
		expect(growingDegreeDays(104, 90, 50, 86)).toBe(36);
		fc.assert(
			fc.property(fc.integer({ min: -20, max: 120 }), fc.integer({ min: 0, max: 60 }), (tMin, spread) => {
				const g = growingDegreeDays(tMin + spread, tMin, 50, 86);
				return g >= 0 && g <= 36;
			})
		);
	});

	it('without a cap, uses the plain average and floors at zero', () => {
		// Source: McMaster & Wilhelm, Agricultural and Forest Meteorology 87:291–300 (1997), standard average method
		// 72/46 base 50: (72 + 46) / 2 − 50 = 9 — the two interpretations differ when only Tmin is below base (11 with the cutoff)
		expect(growingDegreeDays(72, 46, 50)).toBe(9);
		// 63/42 base 50: (63 + 42) / 2 − 50 = 2.5 (6.5 with the cutoff)
		expect(growingDegreeDays(63, 42, 50)).toBe(2.5);
		// 90/65 uncapped: 77.5 − 50 = 27.5 (25.5 capped)
		expect(growingDegreeDays(90, 65, 50)).toBe(27.5);
		// 45/30 base 50: mean 37.5 is below base → 0
		expect(growingDegreeDays(45, 30, 50)).toBe(0);
		// base 40 °F for cool-season crops — Source: Oklahoma State University GDD calculator notes
		expect(growingDegreeDays(60, 40, 40)).toBe(10);
	});

	it('daily GDD from a weekly mean alone', () => {
		expect(meanDegreeDays(65, 40)).toBe(25);
		expect(meanDegreeDays(35, 40)).toBe(0);
	});

	it('rejects a maximum below the minimum and a cap at or below base', () => {
		expect(() => growingDegreeDays(40, 50, 50)).toThrow(PlanningInputError);
		expect(() => growingDegreeDays(70, 50, 50, 50)).toThrow(/capF/);
	});
});
