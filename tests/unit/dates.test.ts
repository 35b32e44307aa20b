// The app's one date rule and one week rule (src/lib/schemas/common.ts), and week keys that
// always carry four-digit years, checked against date-fns as an outside reference.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { getISOWeek, getISOWeekYear, getISOWeeksInYear, isValid, parse } from 'date-fns';
import { dateProblem, isoDate, isoWeekKey, isoWeekProblem, seasonDateProblem } from '$lib/schemas/common';
import { isoWeek, weekStart } from '$lib/planning/iso-week';

describe('one date rule', () => {
	it('takes real calendar dates in 1900–2200 and refuses the rest, naming the field', () => {
		for (const ok of ['1900-01-01', '2027-06-01', '2028-02-29', '2000-02-29', '2200-12-31'])
			expect(dateProblem('Field date', ok), ok).toBeNull();
		// Source: ISO 8601 / Gregorian calendar: 1900 and 2100 are not leap years, 2000 is.
		for (const bad of [
			'1900-02-29',
			'2100-02-29',
			'2027-02-29',
			'2027-04-31',
			'2027-13-01',
			'2027-00-10',
			'2027-06-00'
		])
			expect(dateProblem('Field date', bad), bad).toBe('Field date is not a real calendar date.');
		for (const far of ['0999-06-01', '0000-01-01', '0001-05-01', '1899-12-31', '2201-01-01', '9999-12-31'])
			expect(dateProblem('Field date', far), far).toBe('Field date must be between 1900 and 2200.');
		expect(dateProblem('Field date', '2027-6-1')).toBe('Field date must be a date (YYYY-MM-DD).');
		expect(isoDate('Date').safeParse('9999-12-31').success).toBe(false);
	});

	it('agrees with date-fns on which strings are real dates (any year 1900–2200)', () => {
		// Source: date-fns parse() with 'yyyy-MM-dd' and isValid(), a general-purpose reference library.
		fc.assert(
			fc.property(
				fc.integer({ min: 1900, max: 2200 }),
				fc.integer({ min: 0, max: 13 }),
				fc.integer({ min: 0, max: 32 }),
				(y, m, d) => {
					const s = `${y}-${String(m).padStart(2, '0')}-${String(d).padStart(2, '0')}`;
					const ref = isValid(parse(s, 'yyyy-MM-dd', new Date(2000, 0, 1)));
					expect(dateProblem('D', s) === null, s).toBe(ref);
				}
			),
			{ numRuns: 2000 }
		);
	});

	it("holds planting dates to the season's year ± 1", () => {
		expect(seasonDateProblem('Field date', '2026-11-01', 2027)).toBeNull();
		expect(seasonDateProblem('Field date', '2028-12-31', 2027)).toBeNull();
		expect(seasonDateProblem('Field date', '2029-01-01', 2027)).toMatch(/^Field date must be within 2026–2028/);
		expect(seasonDateProblem('Actual field date', '2025-12-31', 2027)).toMatch(/^Actual field date/);
	});
});

describe('one week rule', () => {
	it('takes existing ISO weeks in 1900–2200 only', () => {
		expect(isoWeekProblem('to', '2026-W53')).toBeNull(); // Source: 2026 has 53 ISO weeks (1 Jan 2026 is a Thursday).
		expect(isoWeekProblem('to', '2027-W53')).toMatch(/2027 has no ISO week 53/);
		expect(isoWeekProblem('to', '9999-W52')).toBe('to must be a week between 1900 and 2200.');
		expect(isoWeekProblem('to', '0999-W01')).toBe('to must be a week between 1900 and 2200.');
		expect(isoWeekProblem('to', '2027-W1')).toBe('to must be an ISO week like 2027-W24.');
		expect(isoWeekKey('from').safeParse('2027-w05').data).toBe('2027-W05');
	});

	it('counts the weeks of every year as date-fns does', () => {
		// Source: date-fns getISOWeeksInYear (ISO 8601 long years).
		for (let y = 1900; y <= 2200; y++) {
			const weeks = getISOWeeksInYear(new Date(y, 5, 15));
			expect(isoWeekProblem('w', `${y}-W${weeks}`), String(y)).toBeNull();
			if (weeks === 52) expect(isoWeekProblem('w', `${y}-W53`), String(y)).not.toBeNull();
		}
	});
});

describe('week keys always have four-digit years', () => {
	it('an early date gives "0999-W22", which parses back to its Monday', () => {
		// Source: date-fns getISOWeek / getISOWeekYear for 1 June 999 (proleptic Gregorian).
		const d = new Date(2000, 5, 1);
		d.setFullYear(999);
		const key = isoWeek('0999-06-01');
		expect(key).toBe(`0999-W${String(getISOWeek(d)).padStart(2, '0')}`);
		expect(getISOWeekYear(d)).toBe(999);
		expect(weekStart(key) <= '0999-06-01').toBe(true);
	});
});
