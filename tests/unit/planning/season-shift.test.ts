// Next season's dates: the same ISO week and weekday a year on, week 53 landing in week 52.
import { describe, expect, it } from 'vitest';
import {
	compareChecks,
	frostHeatChecks,
	isoWeek,
	isoWeekday,
	nextYearDate,
	nextYearWeek,
	sameDayIn,
	shiftPlantingDates
} from '../../../src/lib/planning';

describe('nextYearDate', () => {
	// Source: ISO 8601, as listed in REFERENCES.md: 2026-12-28 = 2026-W53-1, 2027-01-03 = 2026-W53-7,
	// 2027-01-04 = 2027-W01-1. 2027 has 52 weeks, so W53 lands in 2027-W52, whose Monday is
	// 2027-01-04 + 51 × 7 days = 2027-12-27.
	it('week 53 goes to week 52, same weekday', () => {
		expect(nextYearDate('2026-12-28')).toBe('2027-12-27');
		expect(nextYearDate('2026-12-29')).toBe('2027-12-28');
		expect(nextYearDate('2027-01-03')).toBe('2028-01-02'); // 2026-W53-7 → 2027-W52-7 = 2027-12-27 + 6
	});
	it('an ordinary week keeps its number and weekday', () => {
		// 2026-04-20 is 2026-W17-1; 2027-W17-1 = 2027-01-04 + 16 × 7 = 2027-04-26.
		expect(nextYearDate('2026-04-20')).toBe('2027-04-26');
		expect(isoWeek('2027-04-26')).toBe('2027-W17');
		expect(isoWeekday('2027-04-26')).toBe(1);
		// 2026-01-01 is 2026-W01-4 (REFERENCES); 2027-W01-4 = 2027-01-07.
		expect(nextYearDate('2026-01-01')).toBe('2027-01-07');
	});
	it('from a 52-week year into a 53-week one, week numbers stay', () => {
		// 2025-12-22 is 2025-W52-1 → 2026-W52-1 = 2025-12-29 + 51 × 7 = 2026-12-21.
		expect(nextYearDate('2025-12-22')).toBe('2026-12-21');
	});
	it('weeks', () => {
		expect(nextYearWeek('2026-W53')).toBe('2027-W52');
		expect(nextYearWeek('2026-W24')).toBe('2027-W24');
		expect(nextYearWeek('2025-W52')).toBe('2026-W52');
	});
});

describe('shiftPlantingDates', () => {
	it('moves by the field date and keeps the distances', () => {
		// Field 2026-12-21 (W52-1) → 2027-W52-1 = 2027-12-27: +371 days. Harvest 2027-01-18 + 371 = 2028-01-24.
		const s = shiftPlantingDates({
			traySowDate: '2026-11-23',
			fieldDate: '2026-12-21',
			firstHarvest: '2027-01-18',
			lastHarvest: '2027-01-31'
		});
		expect(s).toEqual({
			traySowDate: '2027-11-29',
			fieldDate: '2027-12-27',
			firstHarvest: '2028-01-24',
			lastHarvest: '2028-02-06',
			shiftDays: 371
		});
	});
});

describe('frost checks on the new dates', () => {
	const tender = { frostTender: true };
	// Last spring frost 10 May. 2026-05-05 (Tue W19) is before it: a warning. Next year it is
	// 2027-W19-2 = 2027-01-04 + 18 × 7 + 1 = 2027-05-11, after 10 May 2027: cleared.
	it('a planting that moves past the frost date loses its warning', () => {
		const farm = { lastSpringFrost: '2026-05-10', firstFallFrost: '2026-10-05' };
		const old = { traySowDate: null, fieldDate: '2026-05-05', firstHarvest: '2026-06-15', lastHarvest: '2026-07-12' };
		const before = frostHeatChecks(tender, old, farm);
		const after = frostHeatChecks(tender, shiftPlantingDates(old), farm);
		expect(before.map((w) => w.code)).toEqual(['frost_before_last_spring']);
		expect(after).toEqual([]);
		const change = compareChecks(before, after);
		expect(change.cleared.map((w) => w.code)).toEqual(['frost_before_last_spring']);
		expect(change.added).toEqual([]);
	});
	it('frost dates are read in the field date’s year; 29 February becomes 28', () => {
		expect(sameDayIn(2027, '2026-05-10')).toBe('2027-05-10');
		expect(sameDayIn(2027, '2028-02-29')).toBe('2027-02-28');
		expect(sameDayIn(2028, '2028-02-29')).toBe('2028-02-29');
	});
});
