import { dayLengthHours, dayOfYearOfDay } from './day-length';
import { type DayNumber, fromDayNumber, weekdayOf } from './day-number';
import { meanDegreeDays } from './degree-days';
import type { TempLookup } from './weekly-temps';
import type { PlanningWarning, Variety } from './types';

/** gdd_cold: a frost-tender crop's degree days cannot add up between its field date and that harvest (a winter lies between). */
export type DtmSource = 'variety' | 'short_day' | 'gdd' | 'gdd_cold';

export interface EffectiveDtm {
	/** Days from the field date to first harvest. */
	days: number;
	source: DtmSource;
	varietyDays: number;
	/** Day length at the farm's latitude on the first-harvest date, hours. */
	dayLengthHours: number;
	thresholdHours: number;
	/** Days beyond the variety's figure that short days add (source 'short_day'). */
	allowanceDays: number;
	gdd?: { required: number; accumulated: number; baseF: number; days: number };
	warnings: PlanningWarning[];
}

export interface DtmContext {
	latitude: number;
	/** Day length (hours) at which a crop grows at half speed; the slowdown starts two hours above it. */
	shortDayThresholdHours: number;
	gddWalkLimitDays: number;
	temps?: TempLookup;
}

/**
 * Growth clock (DESIGN step 3). A crop matures when the "development" it has gathered since its
 * field date reaches its requirement, counting only days on or after the field date:
 *  - with weekly temperatures and a degree-day requirement: each day adds max(0, weekly mean − base)
 *    °F·days, and the requirement is the variety's degree days;
 *  - otherwise each day adds a share of a day by its day length (shortDayRate), and the requirement
 *    is the variety's days to maturity. In spring and summer every day is a whole day; in autumn the
 *    days count for less and less as they shorten, so the slowdown is gradual and a later first
 *    harvest always needs a later (or the same) field date.
 * The same clock runs forwards (the grid: field date → first harvest) and backwards (the planner:
 * first harvest → the latest field date that is ready by then), so the two always agree.
 */
export const MIN_SHORT_DAY_RATE = 0.3;

/**
 * Share of a day's growth a day of `dayLength` hours gives: 1 at threshold + 2 h and longer,
 * falling by a quarter of a day's growth per hour shorter (0.5 at the threshold), never under 0.3.
 * Common practice (no published source): growth slows markedly under about 10 h of day (the
 * "Persephone period", Coleman 2009, from memory), and crops maturing then take about two weeks
 * longer than the packet says. With the default 10 h threshold at 42.5° N, a 45-day crop first
 * harvested on 9 Nov (10.05 h) takes 11 days more, on 16 Nov (9.78 h) 15 more, on 30 Nov 23 more:
 * the slowdown grows through the autumn instead of switching on at one date.
 */
export function shortDayRate(dayLength: number, thresholdHours: number): number {
	const r = 1 - (thresholdHours + 2 - dayLength) / 4;
	return r >= 1 ? 1 : r <= MIN_SHORT_DAY_RATE ? MIN_SHORT_DAY_RATE : r;
}

// Day length by day of the year, per latitude: a plan asks for the same few hundred days over and over.
const dayLengths = new Map<number, Float64Array>();

function dayLengthAt(latitude: number, doy: number): number {
	let t = dayLengths.get(latitude);
	if (!t) {
		if (dayLengths.size > 64) dayLengths.clear();
		t = new Float64Array(367).fill(NaN);
		dayLengths.set(latitude, t);
	}
	let h = t[doy];
	if (Number.isNaN(h)) h = t[doy] = dayLengthHours(latitude, doy);
	return h;
}

// The day's growth rate by day number for one latitude and threshold (the last asked for): the
// planner's walks ask for the same days for every candidate, and working out each one's day of
// the year was most of a plan's time.
const RATE_SPAN = 1 << 14;
let rateLat = NaN;
let rateThreshold = NaN;
let rateFrom = 0;
let rateTable = new Float64Array(0);

function rateOn(day: DayNumber, ctx: DtmContext): number {
	if (
		ctx.latitude !== rateLat ||
		ctx.shortDayThresholdHours !== rateThreshold ||
		day < rateFrom ||
		day >= rateFrom + RATE_SPAN
	) {
		rateLat = ctx.latitude;
		rateThreshold = ctx.shortDayThresholdHours;
		rateFrom = day - (RATE_SPAN >> 1);
		rateTable = new Float64Array(RATE_SPAN).fill(NaN);
	}
	const i = day - rateFrom;
	let r = rateTable[i];
	if (r !== r) r = rateTable[i] = shortDayRate(dayLengthAt(rateLat, dayOfYearOfDay(day)), rateThreshold);
	return r;
}

/** An empty record for effectiveDaysInto to fill. */
export function blankDtm(): EffectiveDtm {
	return {
		days: 0,
		source: 'variety',
		varietyDays: 0,
		dayLengthHours: 0,
		thresholdHours: 0,
		allowanceDays: 0,
		warnings: []
	};
}

const EPS = 1e-9;
/** Days in a row without heat that make a winter a frost-tender crop does not live through. */
const COLD_SPELL_DAYS = 28;

/**
 * Effective days to maturity for a first harvest on `firstHarvest`, worked backwards (the
 * planner): the days from the latest field date whose growth, counted from that date on, is
 * complete by `firstHarvest`. A forward derivation from that field date (maturityFrom) gives
 * `firstHarvest` or, where a shortening day makes the clock skip, a day or two before it.
 */
export function effectiveDaysToMaturity(variety: Variety, firstHarvest: DayNumber, ctx: DtmContext): EffectiveDtm {
	return effectiveDaysInto(blankDtm(), variety, firstHarvest, ctx);
}

function reset(out: EffectiveDtm, variety: Variety, ctx: DtmContext): PlanningWarning[] {
	if (out.warnings.length > 0) out.warnings = [];
	out.days = variety.daysToMaturity;
	out.source = 'variety';
	out.varietyDays = variety.daysToMaturity;
	out.thresholdHours = ctx.shortDayThresholdHours;
	out.allowanceDays = 0;
	if (out.gdd !== undefined) out.gdd = undefined;
	return out.warnings;
}

function usesGdd(variety: Variety, ctx: DtmContext): boolean {
	return ctx.temps !== undefined && variety.gddToMaturity !== undefined && variety.baseTempF !== undefined;
}

function gddWarning(kind: 'missing' | 'limit' | 'cold', v: Variety, acc: number, ctx: DtmContext, day?: DayNumber) {
	const req = `${acc.toFixed(0)} of ${v.gddToMaturity} degree days (base ${v.baseTempF} °F)`;
	if (kind === 'missing')
		return {
			code: 'gdd_data_missing' as const,
			message: `No weekly mean temperature for the week of ${fromDayNumber(day ?? 0)}; used the calendar days to maturity instead of degree days.`
		};
	if (kind === 'cold')
		return {
			code: 'gdd_not_met' as const,
			message: `Only ${req} accumulate before a cold spell of ${COLD_SPELL_DAYS} days or more: a frost-tender crop does not grow through winter, so it cannot be ready then.`
		};
	return {
		code: 'gdd_not_met' as const,
		message: `Only ${req} accumulate within ${ctx.gddWalkLimitDays} days; used the calendar days to maturity instead.`
	};
}

type ClockEnd = 'met' | 'cold' | 'calendar';

/**
 * The degree-day clock from `start` a day at a time in the walk's direction: backwards (-1, the
 * days before a first harvest) or forwards (1, the days from a field date). Within an ISO week every
 * day adds the same max(0, mean − base), so the walk goes a week at a time and the day that meets
 * the requirement is found by division, not by stepping. 'met' fills in the days and the degree
 * days; 'cold' is a frost-tender crop stopped by a cold spell first (source gdd_cold); 'calendar'
 * is a week without temperatures or the walk's limit reached (warned either way).
 */
function degreeDayClock(
	out: EffectiveDtm,
	variety: Variety,
	start: DayNumber,
	dir: 1 | -1,
	ctx: DtmContext,
	warnings: PlanningWarning[]
): ClockEnd {
	const required = variety.gddToMaturity!;
	const baseF = variety.baseTempF!;
	let acc = 0;
	let walked = 0;
	let cold = 0;
	let day = start;
	for (;;) {
		if (walked >= ctx.gddWalkLimitDays) {
			warnings.push(gddWarning('limit', variety, acc, ctx));
			return 'calendar';
		}
		// The rest of the day's week in the walk's direction: back to its Monday, or on to its Sunday.
		const weekDays = dir < 0 ? weekdayOf(day) : 8 - weekdayOf(day);
		const chunk = Math.min(weekDays, ctx.gddWalkLimitDays - walked);
		const mean = ctx.temps!(day);
		if (mean === undefined) {
			warnings.push(gddWarning('missing', variety, acc, ctx, day));
			return 'calendar';
		}
		const perDay = meanDegreeDays(mean, baseF);
		if (perDay > 0 && acc + perDay * chunk >= required - EPS) {
			// The fewest days of this chunk that meet the requirement.
			const k = Math.max(1, Math.ceil((required - acc) / perDay - EPS));
			acc += perDay * k;
			out.days = walked + k;
			out.source = 'gdd';
			out.gdd = { required, accumulated: acc, baseF, days: out.days };
			return 'met';
		}
		acc += perDay * chunk;
		walked += chunk;
		day += dir * weekDays;
		cold = perDay > 0 ? 0 : cold + chunk;
		if (variety.frostTender && cold >= COLD_SPELL_DAYS) {
			out.source = 'gdd_cold';
			warnings.push(gddWarning('cold', variety, acc, ctx));
			return 'cold';
		}
	}
}

/** The calendar clock from `start` in the walk's direction: the days whose day-length-weighted growth reaches the figure. */
function calendarDays(variety: Variety, start: DayNumber, dir: 1 | -1, ctx: DtmContext): number {
	const need = variety.daysToMaturity;
	let acc = 0;
	let days = 0;
	while (acc < need - EPS) {
		acc += rateOn(start + dir * days, ctx);
		days++;
	}
	return days;
}

/**
 * effectiveDaysToMaturity written into `out` (a record from blankDtm, possibly filled
 * before): season planning reuses one record per variety instead of making one per
 * succession. A caller that keeps `out.warnings` must take it before the next call.
 */
export function effectiveDaysInto(
	out: EffectiveDtm,
	variety: Variety,
	firstHarvest: DayNumber,
	ctx: DtmContext
): EffectiveDtm {
	const warnings = reset(out, variety, ctx);
	out.dayLengthHours = dayLengthAt(ctx.latitude, dayOfYearOfDay(firstHarvest));
	// Walking back from the day before the first harvest; a crop stopped by the cold keeps its figure.
	if (usesGdd(variety, ctx) && degreeDayClock(out, variety, firstHarvest - 1, -1, ctx, warnings) !== 'calendar')
		return out;
	// Calendar clock, backwards: the latest field day whose day-length-weighted days reach the figure.
	setCalendar(out, calendarDays(variety, firstHarvest - 1, -1, ctx), variety);
	return out;
}

function setCalendar(out: EffectiveDtm, days: number, variety: Variety): void {
	out.days = days;
	if (days > variety.daysToMaturity) {
		out.source = 'short_day';
		out.allowanceDays = days - variety.daysToMaturity;
	}
}

/**
 * The first harvest of a planting whose field date is `fieldDay`, worked forwards over the same
 * clock (the grid and the server on save): heat or day length before the field date never counts.
 * For a frost-tender degree-day crop that meets a cold spell before its degree days add up, the
 * result is the calendar figure with a `gdd_not_met` warning (source 'gdd_cold').
 */
export function maturityFrom(variety: Variety, fieldDay: DayNumber, ctx: DtmContext): EffectiveDtm {
	const out = blankDtm();
	const warnings = reset(out, variety, ctx);
	const clock = usesGdd(variety, ctx) ? degreeDayClock(out, variety, fieldDay, 1, ctx, warnings) : 'calendar';
	if (clock !== 'met') {
		setCalendar(out, calendarDays(variety, fieldDay, 1, ctx), variety);
		// A tender crop caught by winter keeps saying so, whatever the calendar figure is.
		if (clock === 'cold') out.source = 'gdd_cold';
	}
	out.dayLengthHours = dayLengthAt(ctx.latitude, dayOfYearOfDay(fieldDay + out.days));
	return out;
}
