import { PlanningInputError, itemField } from './errors';

/**
 * Calendar dates are plain `YYYY-MM-DD` strings. Internally a date is its day
 * number: days since 1970-01-01 in the proleptic Gregorian calendar. The
 * arithmetic is pure integers (after H. Hinnant's civil-from-days algorithms),
 * so no Date object and no time zone can shift a date by one.
 */
export type DayNumber = number;

export function daysFromCivil(year: number, month: number, day: number): DayNumber {
	const y = month <= 2 ? year - 1 : year;
	const era = Math.floor(y / 400);
	const yoe = y - era * 400;
	const mp = month > 2 ? month - 3 : month + 9;
	const doy = Math.floor((153 * mp + 2) / 5) + day - 1;
	const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
	return era * 146097 + doe - 719468;
}

export function civilFromDays(z: DayNumber): { year: number; month: number; day: number } {
	const zz = z + 719468;
	const era = Math.floor(zz / 146097);
	const doe = zz - era * 146097;
	const yoe = Math.floor((doe - Math.floor(doe / 1460) + Math.floor(doe / 36524) - Math.floor(doe / 146096)) / 365);
	const doy = doe - (365 * yoe + Math.floor(yoe / 4) - Math.floor(yoe / 100));
	const mp = Math.floor((5 * doy + 2) / 153);
	const day = doy - Math.floor((153 * mp + 2) / 5) + 1;
	const month = mp < 10 ? mp + 3 : mp - 9;
	return { year: yoe + era * 400 + (month <= 2 ? 1 : 0), month, day };
}

/** The year of a day number. */
export function yearOfDay(z: DayNumber): number {
	return civilFromDays(z).year;
}

function pad(n: number, width: number): string {
	return String(n).padStart(width, '0');
}

function digit(s: string, i: number): number {
	const c = s.charCodeAt(i) - 48;
	return c >= 0 && c <= 9 ? c : -1;
}

const MONTH_DAYS = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

function isLeap(y: number): boolean {
	return (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;
}

/** Parse `YYYY-MM-DD` (or a Date, read in UTC) to a day number; throws on a non-date like 2026-02-30. */
export function toDayNumber(date: string | Date, field = 'date'): DayNumber {
	if (date instanceof Date) {
		const t = date.getTime();
		if (Number.isNaN(t)) throw new PlanningInputError(field, 'is an invalid Date');
		return daysFromCivil(date.getUTCFullYear(), date.getUTCMonth() + 1, date.getUTCDate());
	}
	// Hand-rolled parse: this runs for every date of every planting, so no regex on the hot path.
	if (typeof date !== 'string' || date.length !== 10 || date.charCodeAt(4) !== 45 || date.charCodeAt(7) !== 45) {
		throw new PlanningInputError(field, `must be a YYYY-MM-DD date (got ${String(date)})`);
	}
	const y0 = digit(date, 0);
	const y1 = digit(date, 1);
	const y2 = digit(date, 2);
	const y3 = digit(date, 3);
	const m0 = digit(date, 5);
	const m1 = digit(date, 6);
	const d0 = digit(date, 8);
	const d1 = digit(date, 9);
	if ((y0 | y1 | y2 | y3 | m0 | m1 | d0 | d1) < 0)
		throw new PlanningInputError(field, `must be a YYYY-MM-DD date (got ${date})`);
	const year = y0 * 1000 + y1 * 100 + y2 * 10 + y3;
	const month = m0 * 10 + m1;
	const day = d0 * 10 + d1;
	const maxDay = month === 2 && isLeap(year) ? 29 : MONTH_DAYS[month - 1];
	if (month < 1 || month > 12 || day < 1 || day > maxDay) {
		throw new PlanningInputError(field, `is not a calendar date (got ${date})`);
	}
	return daysFromCivil(year, month, day);
}

/** toDayNumber for a field of a list item, naming the field only when the date is bad (see errors.ts). */
export function toDayNumberItem(date: string | Date, list: string, index: number, name: string): DayNumber {
	try {
		return toDayNumber(date);
	} catch {
		return toDayNumber(date, itemField(list, index, name));
	}
}

// Memo of formatted dates: a plan names the same few hundred days thousands of times,
// and sharing one string per day keeps both garbage and the plan's live size down.
// Derived strings only (no state); cleared if it ever grows large.
const MEMO_LIMIT = 20_000;
const dateByDay = new Map<DayNumber, string>();

export function fromDayNumber(n: DayNumber): string {
	let date = dateByDay.get(n);
	if (date === undefined) {
		const { year, month, day } = civilFromDays(n);
		date = `${pad(year, 4)}-${pad(month, 2)}-${pad(day, 2)}`;
		if (dateByDay.size >= MEMO_LIMIT) dateByDay.clear();
		dateByDay.set(n, date);
	}
	return date;
}

/** ISO weekday, Monday = 1 … Sunday = 7. Day 0 (1970-01-01) was a Thursday. */
export function weekdayOf(n: DayNumber): number {
	return ((((n + 3) % 7) + 7) % 7) + 1;
}
