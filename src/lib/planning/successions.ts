import { PlanningInputError, requireLatitude, requireNonNegative, requirePositive } from './errors';
import { type DayNumber, fromDayNumber, toDayNumber, weekdayOf } from './day-number';
import { type DtmContext, type EffectiveDtm, effectiveDaysToMaturity } from './effective-dtm';
import { isoWeekOfDay, weekStartDay } from './iso-week';
import { roundUpTo } from './numbers';
import { successionWarnings } from './plan-warnings';
import { type SeedNeed, seedNeed } from './seed';
import type { PlanningWarning, Variety, WeeklyTarget } from './types';
import { validateVariety, varietyLabel } from './variety';
import { type WeeklyMeanTempF, makeTempLookup } from './weekly-temps';

export interface Farm {
	lastSpringFrost: string;
	firstFallFrost: string;
	/** Degrees north (negative south), for day length. */
	latitude: number;
	/** Weekly normal mean °F keyed "YYYY-Www" (or "Www" for every year). */
	weeklyMeanTempF?: WeeklyMeanTempF;
}

export interface PlanOptions {
	/** Weeks between successions, 1–4. Default: the harvest window in whole weeks, at least 1. */
	intervalWeeks?: number;
	/** Bed-feet overage, fraction. Default 0.1. */
	margin?: number;
	/** Bed-feet are rounded up to a multiple of this. Default 1 ft. */
	bedFootIncrement?: number;
	/** Default 14 days (common practice). */
	shortDayAllowanceDays?: number;
	/** Default 10 hours. */
	shortDayThresholdHours?: number;
	/** Seed overage when the variety gives none. Default 0.1. */
	seedMargin?: number;
	/** No work can be done before this date: the first action (tray sowing or field date) must be on or after it. */
	today?: string;
	/** The field date must be on or after this date (e.g. when the ground can first be worked). */
	earliestFieldDate?: string;
	/** Bound on the degree-day walk. Default 365 days. */
	gddWalkLimitDays?: number;
	/** Prefix for succession keys; default the variety id, crop or name. */
	keyPrefix?: string;
}

export interface PlanInput {
	variety: Variety;
	targets: WeeklyTarget[];
	farm: Farm;
	options?: PlanOptions;
}

/** The figures a succession's size and dates were reached from, for explain*(). */
export interface SuccessionBasis {
	weeklyYieldPerFt: number;
	/** The target week that set the bed-feet, its quantity, and the per-foot supply in that week. */
	peakWeek: string;
	peakQuantity: number;
	peakSupplyPerFt: number;
	/** Days of this succession's window inside the peak week (7 unless the window is under a week). */
	peakWeekDays: number;
	margin: number;
	increment: number;
	rawFeet: number;
	seedMargin: number;
	dtm: EffectiveDtm;
}

export interface Succession {
	key: string;
	index: number;
	varietyId?: string;
	crop?: string;
	family?: string;
	method: Variety['method'];
	traySowDate?: string;
	fieldDate: string;
	firstHarvest: string;
	lastHarvest: string;
	bedFeet: number;
	/** Harvest units per full week of the window: bedFeet × weekly yield per bed-foot. */
	weeklyYield: number;
	totalYield: number;
	yieldPerBedFoot: number;
	harvestWindowDays: number;
	/** The target weeks this succession is meant to supply. */
	weeks: string[];
	seed: SeedNeed;
	warnings: PlanningWarning[];
	basis: SuccessionBasis;
}

export interface PlanResult {
	successions: Succession[];
	shortfall: WeeklyTarget[];
	warnings: PlanningWarning[];
	/** The interval actually used, in weeks. */
	intervalWeeks: number;
}

interface ResolvedOptions {
	interval: number;
	margin: number;
	increment: number;
	seedMargin: number;
	today?: DayNumber;
	earliestField?: DayNumber;
	dtm: DtmContext;
}

function resolveOptions(v: Variety, farm: Farm, o: PlanOptions, warnings: PlanningWarning[]): ResolvedOptions {
	const fullWeeks = Math.floor(v.harvestWindowDays / 7);
	const maxInterval = Math.max(1, fullWeeks);
	let interval = maxInterval;
	if (o.intervalWeeks !== undefined) {
		if (!Number.isInteger(o.intervalWeeks) || o.intervalWeeks < 1 || o.intervalWeeks > 4) {
			throw new PlanningInputError('options.intervalWeeks', `must be a whole number of weeks from 1 to 4 (got ${o.intervalWeeks})`);
		}
		interval = o.intervalWeeks;
		if (interval > maxInterval) {
			// A window of fewer whole weeks than the interval cannot supply every week it is meant to:
			// split into more successions rather than leave weeks bare.
			warnings.push({
				code: 'interval_shortened',
				message: `Asked for successions every ${interval} weeks, but each harvest window (${v.harvestWindowDays} days) covers only ${maxInterval} whole week${maxInterval > 1 ? 's' : ''}; planned every ${maxInterval} week${maxInterval > 1 ? 's' : ''} so no target week goes bare.`
			});
			interval = maxInterval;
		}
	}
	const margin = o.margin === undefined ? 0.1 : requireNonNegative('options.margin', o.margin);
	const increment = o.bedFootIncrement === undefined ? 1 : requirePositive('options.bedFootIncrement', o.bedFootIncrement);
	const seedMargin = v.margin ?? (o.seedMargin === undefined ? 0.1 : requireNonNegative('options.seedMargin', o.seedMargin));
	return {
		interval,
		margin,
		increment,
		seedMargin,
		today: o.today === undefined ? undefined : toDayNumber(o.today, 'options.today'),
		earliestField: o.earliestFieldDate === undefined ? undefined : toDayNumber(o.earliestFieldDate, 'options.earliestFieldDate'),
		dtm: {
			latitude: requireLatitude('farm.latitude', farm.latitude),
			shortDayAllowanceDays:
				o.shortDayAllowanceDays === undefined ? 14 : requireNonNegative('options.shortDayAllowanceDays', o.shortDayAllowanceDays),
			shortDayThresholdHours:
				o.shortDayThresholdHours === undefined ? 10 : requireNonNegative('options.shortDayThresholdHours', o.shortDayThresholdHours),
			gddWalkLimitDays: o.gddWalkLimitDays === undefined ? 365 : requirePositive('options.gddWalkLimitDays', o.gddWalkLimitDays),
			temps: farm.weeklyMeanTempF ? makeTempLookup(farm.weeklyMeanTempF) : undefined
		}
	};
}

/** Sum duplicate weeks; return Mondays (day numbers) of weeks with a positive target, sorted. */
function normaliseTargets(targets: WeeklyTarget[]): { mondays: DayNumber[]; qty: Map<DayNumber, number> } {
	if (!Array.isArray(targets)) throw new PlanningInputError('targets', 'must be a list of { week, quantity }');
	const qty = new Map<DayNumber, number>();
	targets.forEach((t, i) => {
		const monday = weekStartDay(t.week, `targets[${i}].week`);
		const q = requireNonNegative(`targets[${i}].quantity`, t.quantity);
		qty.set(monday, (qty.get(monday) ?? 0) + q);
	});
	const mondays = [...qty.keys()].filter((m) => (qty.get(m) ?? 0) > 0).sort((a, b) => a - b);
	return { mondays, qty };
}

/**
 * Successions for one variety against weekly targets (DESIGN steps 1–4).
 * Target weeks are grouped into runs of `intervalWeeks` calendar weeks starting
 * at the first week with a positive target; each run gets one succession whose
 * harvest starts on the Monday of the run's first week. Its bed-feet are sized
 * on the most demanding week of the run, so every week the plan can reach gets
 * at least its target. A week that cannot be reached in time (field date before
 * `earliestFieldDate`, or first action before `today`) is reported in
 * `shortfall` with an `unreachable_week` warning, and the next week is tried.
 */
export function planSuccessions(input: PlanInput): PlanResult {
	const v = validateVariety(input.variety);
	const farm = input.farm;
	if (!farm || typeof farm !== 'object') throw new PlanningInputError('farm', 'is required');
	const season = {
		lastSpringFrost: toDayNumber(farm.lastSpringFrost, 'farm.lastSpringFrost'),
		firstFallFrost: toDayNumber(farm.firstFallFrost, 'farm.firstFallFrost')
	};
	const warnings: PlanningWarning[] = [];
	const o = resolveOptions(v, farm, input.options ?? {}, warnings);
	const { mondays, qty } = normaliseTargets(input.targets);
	const H = v.harvestWindowDays;
	const perFtPerDay = v.yieldPerBedFoot / H;
	const weeklyYieldPerFt = perFtPerDay * 7;
	const prefix = input.options?.keyPrefix ?? v.id ?? varietyLabel(v);
	const successions: Succession[] = [];
	const windows: [DayNumber, DayNumber, number][] = [];
	const unreachable: DayNumber[] = [];
	let i = 0;
	while (i < mondays.length) {
		const start = mondays[i];
		const dtm = effectiveDaysToMaturity(v, start, o.dtm);
		const fieldDay = start - dtm.days;
		const trayDay = v.method === 'transplant' ? fieldDay - (v.daysInTray ?? 0) : undefined;
		const firstAction = trayDay ?? fieldDay;
		if ((o.earliestField !== undefined && fieldDay < o.earliestField) || (o.today !== undefined && firstAction < o.today)) {
			unreachable.push(start);
			i++;
			continue;
		}
		const groupEnd = start + 7 * o.interval;
		let j = i;
		let peak = { need: -1, monday: start, q: 0, perFt: 0, days: 0 };
		const weeks: string[] = [];
		while (j < mondays.length && mondays[j] < groupEnd) {
			const monday = mondays[j];
			const offsetDays = monday - start;
			// Days of this window inside that week: 7, except when the whole window is under a week.
			const days = Math.min(7, H - offsetDays);
			const perFt = perFtPerDay * days;
			const q = qty.get(monday) ?? 0;
			const need = q / perFt;
			if (need > peak.need) peak = { need, monday, q, perFt, days };
			weeks.push(isoWeekOfDay(monday));
			j++;
		}
		const rawFeet = peak.need * (1 + o.margin);
		const bedFeet = roundUpTo(rawFeet, o.increment);
		const lastHarvest = start + H - 1;
		const seed = seedNeed({
			method: v.method,
			bedFeet,
			rows: v.rows,
			inRowSpacingIn: v.inRowSpacingIn,
			seedsPerSpot: v.seedsPerSpot,
			germinationRate: v.germinationRate,
			seedsPerGram: v.seedsPerGram,
			margin: o.seedMargin,
			cellsPerTray: v.cellsPerTray,
			seedPriceCentsPerGram: v.seedPriceCentsPerGram,
			seedsPerPacket: v.seedsPerPacket
		});
		const index = successions.length;
		const s: Succession = {
			key: `${prefix}#${index + 1}`,
			index,
			method: v.method,
			fieldDate: fromDayNumber(fieldDay),
			firstHarvest: fromDayNumber(start),
			lastHarvest: fromDayNumber(lastHarvest),
			bedFeet,
			weeklyYield: bedFeet * weeklyYieldPerFt,
			totalYield: bedFeet * v.yieldPerBedFoot,
			yieldPerBedFoot: v.yieldPerBedFoot,
			harvestWindowDays: H,
			weeks,
			seed,
			warnings: [...dtm.warnings, ...successionWarnings(v, fieldDay, start, lastHarvest, { ...season, temps: o.dtm.temps })],
			basis: {
				weeklyYieldPerFt,
				peakWeek: isoWeekOfDay(peak.monday),
				peakQuantity: peak.q,
				peakSupplyPerFt: peak.perFt,
				peakWeekDays: peak.days,
				margin: o.margin,
				increment: o.increment,
				rawFeet,
				seedMargin: o.seedMargin,
				dtm
			}
		};
		if (trayDay !== undefined) s.traySowDate = fromDayNumber(trayDay);
		if (v.id !== undefined) s.varietyId = v.id;
		const crop = v.crop ?? v.cropId;
		if (crop !== undefined) s.crop = crop;
		if (v.family !== undefined) s.family = v.family;
		successions.push(s);
		windows.push([start, lastHarvest, bedFeet]);
		i = j;
	}
	const shortfall: WeeklyTarget[] = unreachable.map((m) => ({ week: isoWeekOfDay(m), quantity: qty.get(m) ?? 0 }));
	if (unreachable.length > 0) {
		const weeks = unreachable.map((m) => isoWeekOfDay(m));
		warnings.push({
			code: 'unreachable_week',
			message: `No succession of ${varietyLabel(v)} can be ready in ${weeks.join(', ')}: it would have to be sown before ${o.earliestField !== undefined ? `the earliest field date ${fromDayNumber(o.earliestField)}` : ''}${o.earliestField !== undefined && o.today !== undefined ? ' or ' : ''}${o.today !== undefined ? `today (${fromDayNumber(o.today)})` : ''}.`,
			weeks
		});
	}
	checkSupply(windows, mondays, qty, unreachable, perFtPerDay, shortfall, warnings);
	return { successions, shortfall, warnings, intervalWeeks: o.interval };
}

/** Belt and braces: recount supply per target week and report any week left short. */
function checkSupply(
	windows: [DayNumber, DayNumber, number][],
	mondays: DayNumber[],
	qty: Map<DayNumber, number>,
	unreachable: DayNumber[],
	perFtPerDay: number,
	shortfall: WeeklyTarget[],
	warnings: PlanningWarning[]
): void {
	const supply = new Map<DayNumber, number>();
	for (const [a, b, feet] of windows) {
		for (let monday = a - weekdayOf(a) + 1; monday <= b; monday += 7) {
			const days = Math.min(b, monday + 6) - Math.max(a, monday) + 1;
			supply.set(monday, (supply.get(monday) ?? 0) + feet * perFtPerDay * days);
		}
	}
	const skip = new Set(unreachable);
	const short: string[] = [];
	for (const m of mondays) {
		if (skip.has(m)) continue;
		const gap = (qty.get(m) ?? 0) - (supply.get(m) ?? 0);
		if (gap > 1e-9 * Math.max(1, qty.get(m) ?? 0)) {
			shortfall.push({ week: isoWeekOfDay(m), quantity: gap });
			short.push(isoWeekOfDay(m));
		}
	}
	if (short.length > 0) {
		warnings.push({ code: 'supply_short', message: `Planned supply falls short of target in ${short.join(', ')}.`, weeks: short });
	}
	shortfall.sort((x, y) => (x.week < y.week ? -1 : x.week > y.week ? 1 : 0));
}
