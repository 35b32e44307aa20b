import { PlanningInputError, itemField } from './errors';
import {
	type DayNumber,
	civilFromDays,
	daysFromCivil,
	fromDayNumber,
	toDayNumber,
	weekdayOf,
	yearOfDay
} from './day-number';

/**
 * ISO 8601 weeks: weeks start on Monday and week 1 is the week holding the
 * year's first Thursday (equivalently, 4 January). A week belongs to the year
 * of its Thursday, so 2027-01-03 is in 2026-W53.
 */
export type IsoWeek = string; // "YYYY-Www"

const WEEK_RE = /^(\d{4})-W(\d{2})$/;
const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
const WEEKDAYS = ['Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun'];

function pad2(n: number): string {
	return n < 10 ? `0${n}` : String(n);
}

/**
 * The year of a week key, always four digits ("0999", never "999"), so every key the engine
 * makes parses again and sorts as text. A year outside 0–9999 has no such key: refused.
 */
export function yearKey(year: number): string {
	if (!Number.isInteger(year) || year < 0 || year > 9999)
		throw new PlanningInputError('week', `year ${year} cannot be written as a four-digit ISO week key`);
	return String(year).padStart(4, '0');
}

/** Monday (day number) of ISO week 1 of isoYear. */
function week1Monday(isoYear: number): DayNumber {
	const jan4 = daysFromCivil(isoYear, 1, 4);
	return jan4 - (weekdayOf(jan4) - 1);
}

export function isoWeekPartsOfDay(n: DayNumber): { year: number; week: number } {
	const thursday = n - weekdayOf(n) + 4;
	const year = yearOfDay(thursday);
	const week = Math.floor((thursday - daysFromCivil(year, 1, 1)) / 7) + 1;
	return { year, week };
}

// Small memo tables: planning names the same few hundred weeks over and over. They hold
// derived strings only (no state), and are cleared if they ever grow large.
const MEMO_LIMIT = 20_000;
const weekNameByMonday = new Map<DayNumber, IsoWeek>();
const mondayByWeekName = new Map<string, DayNumber>();

export function isoWeekOfDay(n: DayNumber): IsoWeek {
	const monday = n - weekdayOf(n) + 1;
	let name = weekNameByMonday.get(monday);
	if (name === undefined) {
		const { year, week } = isoWeekPartsOfDay(monday);
		name = `${yearKey(year)}-W${pad2(week)}`;
		if (weekNameByMonday.size >= MEMO_LIMIT) weekNameByMonday.clear();
		weekNameByMonday.set(monday, name);
	}
	return name;
}

/** ISO week of a calendar date: `isoWeek('2027-01-03')` is `'2026-W53'`. */
export function isoWeek(date: string | Date): IsoWeek {
	return isoWeekOfDay(toDayNumber(date));
}

/** ISO weekday of a calendar date, Monday = 1 … Sunday = 7. */
export function isoWeekday(date: string | Date): number {
	return weekdayOf(toDayNumber(date));
}

/** Number of ISO weeks in an ISO year: 53 when 28 December falls in week 53. */
export function weeksInIsoYear(isoYear: number): number {
	return isoWeekPartsOfDay(daysFromCivil(isoYear, 12, 28)).week;
}

export function parseIsoWeek(week: string, field = 'week'): { year: number; week: number } {
	const m = typeof week === 'string' ? WEEK_RE.exec(week) : null;
	if (!m) throw new PlanningInputError(field, `must be an ISO week like 2026-W19 (got ${String(week)})`);
	const year = Number(m[1]);
	const w = Number(m[2]);
	if (w < 1 || w > weeksInIsoYear(year)) {
		throw new PlanningInputError(field, `${year} has no ISO week ${w} (it has ${weeksInIsoYear(year)})`);
	}
	return { year, week: w };
}

/** Day number of the Monday that starts an ISO week. */
export function weekStartDay(week: IsoWeek, field = 'week'): DayNumber {
	const known = mondayByWeekName.get(week);
	if (known !== undefined) return known;
	const p = parseIsoWeek(week, field);
	const monday = week1Monday(p.year) + (p.week - 1) * 7;
	if (mondayByWeekName.size >= MEMO_LIMIT) mondayByWeekName.clear();
	mondayByWeekName.set(week, monday);
	return monday;
}

/** weekStartDay for a field of a list item, naming the field only when the week is bad (see errors.ts). */
export function weekStartDayItem(week: IsoWeek, list: string, index: number, name: string): DayNumber {
	try {
		return weekStartDay(week);
	} catch {
		return weekStartDay(week, itemField(list, index, name));
	}
}

/** The Monday `YYYY-MM-DD` that starts an ISO week: `weekStart('2026-W01')` is `'2025-12-29'`. */
export function weekStart(week: IsoWeek): string {
	return fromDayNumber(weekStartDay(week));
}

/** The ISO week n weeks after (or before, n < 0) a week. */
export function addWeeks(week: IsoWeek, n: number): IsoWeek {
	return isoWeekOfDay(weekStartDay(week) + 7 * n);
}

/** Calendar date n days after dateStr (n may be negative). */
export function addDays(dateStr: string, n: number): string {
	return fromDayNumber(toDayNumber(dateStr) + n);
}

/** Whole days from a to b (b − a). */
export function daysBetween(a: string, b: string): number {
	return toDayNumber(b) - toDayNumber(a);
}

function toWeekDay(x: string, field: string): DayNumber {
	return WEEK_RE.test(x) ? weekStartDay(x, field) : toDayNumber(x, field);
}

/**
 * All ISO weeks from a to b inclusive. Each end may be an ISO week or a date
 * (the week holding it). Empty when b is before a.
 */
export function weeksBetween(a: string, b: string): IsoWeek[] {
	const start = toWeekDay(a, 'from');
	const end = toWeekDay(b, 'to');
	const out: IsoWeek[] = [];
	for (let d = start - (weekdayOf(start) - 1); d <= end; d += 7) out.push(isoWeekOfDay(d));
	return out;
}

/** "W19 · Mon 10 May": the ISO week beside the date, as every date in the UI shows it. */
export function formatWeekDate(dateStr: string): string {
	return weekDateOfDay(toDayNumber(dateStr));
}

const weekDateByDay = new Map<DayNumber, string>();

/** formatWeekDate of a day number (memoised, as the plan's warnings name the same days over and over). */
export function weekDateOfDay(n: DayNumber): string {
	let text = weekDateByDay.get(n);
	if (text === undefined) {
		const { week } = isoWeekPartsOfDay(n);
		const { month, day } = civilFromDays(n);
		text = `W${pad2(week)} · ${WEEKDAYS[weekdayOf(n) - 1]} ${day} ${MONTHS[month - 1]}`;
		if (weekDateByDay.size >= MEMO_LIMIT) weekDateByDay.clear();
		weekDateByDay.set(n, text);
	}
	return text;
}
