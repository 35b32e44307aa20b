import { format, getISODay, getISOWeek, getISOWeekYear, addDays as dfAddDays } from 'date-fns';
import { describe, expect, it } from 'vitest';
import {
	PlanningInputError,
	addDays,
	addWeeks,
	daysBetween,
	formatWeekDate,
	isoWeek,
	isoWeekday,
	weekStart,
	weeksBetween,
	weeksInIsoYear
} from '../../../src/lib/planning/index';
import { yearOfDay } from '../../../src/lib/planning/day-number';

/** Every calendar day from start to end inclusive, as [YYYY-MM-DD, local Date for date-fns]. */
function* days(startYear: number, endYear: number): Generator<[string, Date]> {
	for (let d = new Date(startYear, 0, 1); d.getFullYear() <= endYear; d = dfAddDays(d, 1)) {
		yield [format(d, 'yyyy-MM-dd'), d];
	}
}

describe('ISO 8601 weeks', () => {
	it('matches the 2026/27 edge values', () => {
		// Source: ISO 8601 (computed from the standard's rule), as listed in REFERENCES.md
		const cases: [string, string, number][] = [
			['2026-01-01', '2026-W01', 4],
			['2026-12-28', '2026-W53', 1],
			['2027-01-03', '2026-W53', 7],
			['2027-01-04', '2027-W01', 1],
			['2027-12-31', '2027-W52', 5]
		];
		for (const [date, week, weekday] of cases) {
			expect(`${isoWeek(date)}-${isoWeekday(date)}`).toBe(`${week}-${weekday}`);
		}
	});

	it('gives 2005-01-02 week 53 of 2004, as the date-fns docs example does', () => {
		// Source: date-fns getISOWeek docs (getISOWeek(new Date(2005, 0, 2)) is 53)
		expect(isoWeek('2005-01-02')).toBe('2004-W53');
		expect(getISOWeek(new Date(2005, 0, 2))).toBe(53);
	});

	it('finds 53-week years exactly in 2015, 2020, 2026, 2032, 2037 (2014–2038)', () => {
		// Source: ISO 8601 (computed), years with week 53 as listed in REFERENCES.md
		const long: number[] = [];
		for (let y = 2014; y <= 2038; y++) if (weeksInIsoYear(y) === 53) long.push(y);
		expect(long).toEqual([2015, 2020, 2026, 2032, 2037]);
	});

	it('agrees with date-fns getISOWeek / getISOWeekYear / getISODay on every day 2014–2038', () => {
		// Source: date-fns 4 ISO week helpers, an independent implementation of ISO 8601
		let checked = 0;
		let mismatches = 0;
		for (const [date, d] of days(2014, 2038)) {
			const expected = `${getISOWeekYear(d)}-W${String(getISOWeek(d)).padStart(2, '0')}`;
			if (isoWeek(date) !== expected || isoWeekday(date) !== getISODay(d)) mismatches++;
			checked++;
		}
		expect(checked).toBe(9131); // 25 years, 6 of them leap (2016, 2020, 2024, 2028, 2032, 2036): 25 × 365 + 6
		expect(mismatches).toBe(0);
	});

	it('follows the standard: 4 January is always in week 1, 28 December always in the last week', () => {
		// Source: ISO 8601 (week 1 holds the year's first Thursday, equivalently 4 January)
		for (let y = 2014; y <= 2038; y++) {
			expect(isoWeek(`${y}-01-04`)).toBe(`${y}-W01`);
			expect(isoWeek(`${y}-12-28`)).toBe(`${y}-W${weeksInIsoYear(y)}`);
		}
	});

	it('weekStart returns the Monday and round-trips through isoWeek for every week 2014–2038', () => {
		// Source: ISO 8601 (weeks start on Monday)
		let weeks = 0;
		for (let y = 2014; y <= 2038; y++) {
			for (let w = 1; w <= weeksInIsoYear(y); w++) {
				const week = `${y}-W${String(w).padStart(2, '0')}`;
				const monday = weekStart(week);
				expect(isoWeekday(monday)).toBe(1);
				expect(isoWeek(monday)).toBe(week);
				expect(isoWeek(addDays(monday, 6))).toBe(week);
				expect(isoWeek(addDays(monday, 7))).not.toBe(week);
				weeks++;
			}
		}
		// 25 years × 52 weeks + the five 53-week years
		expect(weeks).toBe(25 * 52 + 5);
		expect(weekStart('2026-W01')).toBe('2025-12-29');
		expect(weekStart('2027-W01')).toBe('2027-01-04');
	});

	it('reads Date objects in UTC, never shifting by the local zone', () => {
		expect(isoWeek(new Date(Date.UTC(2027, 0, 3, 23, 30)))).toBe('2026-W53');
		expect(isoWeek(new Date(Date.UTC(2027, 0, 4, 0, 30)))).toBe('2027-W01');
	});

	it('adds days across month, leap day and year ends like date-fns does', () => {
		// Source: date-fns addDays as an independent check
		const starts = ['2028-02-27', '2026-12-30', '2024-02-28', '2100-02-27'];
		for (const s of starts) {
			const [y, m, d] = s.split('-').map(Number);
			for (const n of [-400, -1, 1, 2, 3, 365, 366]) {
				expect(addDays(s, n)).toBe(format(dfAddDays(new Date(y, m - 1, d), n), 'yyyy-MM-dd'));
			}
		}
		expect(daysBetween('2026-01-01', '2027-01-01')).toBe(365);
		expect(daysBetween('2028-01-01', '2029-01-01')).toBe(366);
	});

	it('lists weeks across the 53-week year end, from weeks or dates', () => {
		expect(weeksBetween('2026-W52', '2027-W02')).toEqual(['2026-W52', '2026-W53', '2027-W01', '2027-W02']);
		expect(weeksBetween('2026-12-31', '2027-01-04')).toEqual(['2026-W53', '2027-W01']);
		expect(weeksBetween('2027-W02', '2026-W52')).toEqual([]);
		expect(addWeeks('2026-W52', 2)).toBe('2027-W01');
		expect(addWeeks('2027-W01', -1)).toBe('2026-W53');
	});

	it('formats dates with their ISO week beside them, as date-fns formats the same tokens', () => {
		expect(formatWeekDate('2021-05-10')).toBe('W19 · Mon 10 May');
		for (const s of ['2026-01-01', '2027-01-03', '2026-07-20']) {
			const [y, m, d] = s.split('-').map(Number);
			expect(formatWeekDate(s)).toBe(format(new Date(y, m - 1, d), "'W'II · EEE d MMM"));
		}
	});

	it('rejects dates and weeks that do not exist, naming the field', () => {
		expect(() => isoWeek('2026-02-29')).toThrow(PlanningInputError);
		expect(() => isoWeek('2026-2-1')).toThrow(/YYYY-MM-DD/);
		// 2025 has 52 ISO weeks
		expect(() => weekStart('2025-W53')).toThrow(/2025 has no ISO week 53/);
		expect(() => weekStart('2026-W00')).toThrow(PlanningInputError);
	});
});

describe('yearOfDay', () => {
	it('names the same year as the ECMAScript Date, across leap and century years', () => {
		// Source: ECMA-262 Date (proleptic Gregorian calendar, UTC), days since 1970-01-01.
		for (let day = -800_000; day <= 800_000; day += 37) {
			expect(yearOfDay(day)).toBe(new Date(day * 86_400_000).getUTCFullYear());
		}
		// The last and first days of years either side of a leap day and a century.
		for (const date of ['1899-12-31', '1900-01-01', '2000-02-29', '2000-12-31', '2001-01-01', '2100-03-01']) {
			expect(yearOfDay(Date.parse(`${date}T00:00:00Z`) / 86_400_000)).toBe(Number(date.slice(0, 4)));
		}
	});
});
