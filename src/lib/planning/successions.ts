import { PlanningInputError, requireLatitude, requireNonNegative, requirePositive } from './errors';
import { type DayNumber, fromDayNumber, toDayNumber } from './day-number';
import { type DtmContext, type EffectiveDtm, blankDtm, effectiveDaysInto, effectiveDaysToMaturity } from './effective-dtm';
import { isoWeekOfDay } from './iso-week';
import { roundUpTo } from './numbers';
import { successionWarnings } from './plan-warnings';
import { type SeedNeed, type SeedNeedInput, seedNeed, validateSeedInput } from './seed';
import type { PlanningWarning, Variety, WeeklyTarget } from './types';
import { checkSupply, normaliseTargets } from './target-weeks';
import { validateVariety, varietyLabel } from './variety';
import { type TempLookup, type WeeklyMeanTempF, makeTempLookup } from './weekly-temps';

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

function resolveOptions(v: Variety, farm: Farm, o: PlanOptions, warnings: PlanningWarning[], temps?: TempLookup): ResolvedOptions {
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
			temps: farm.weeklyMeanTempF ? (temps ?? makeTempLookup(farm.weeklyMeanTempF)) : undefined
		}
	};
}

/**
 * One succession as the planning loop settles it, in day numbers. planRuns keeps one
 * of these per call and refills it for each succession, so a maker copies what it
 * keeps: planSeason keeps a few dates, planSuccessions dresses the rest into a
 * Succession. (At thousands of successions a fresh object each, with its own
 * days-to-maturity record, was garbage the collector kept copying.)
 */
export interface SuccessionRun {
	/** The succession's key is `${prefix}#${index + 1}`. */
	prefix: string;
	index: number;
	/** First harvest. */
	start: DayNumber;
	fieldDay: DayNumber;
	trayDay: DayNumber | undefined;
	lastHarvest: DayNumber;
	bedFeet: number;
	rawFeet: number;
	/** The target weeks it is meant to supply: mondays[firstWeek..endWeek) of the variety's targets. */
	firstWeek: number;
	endWeek: number;
	/**
	 * This succession's own list (a maker may keep it). For planSuccessionRuns, only the
	 * days-to-maturity warnings: the frost and heat ones are the caller's (see there).
	 */
	warnings: PlanningWarning[];
	/** Refilled per succession unless the maker asked for detail (then a fresh record each). */
	dtm: EffectiveDtm;
	/** The target week that set the bed-feet: its Monday, quantity, per-foot supply and days. */
	peakMonday: DayNumber;
	peakQ: number;
	peakPerFt: number;
	peakDays: number;
}

interface Planned<T> {
	items: T[];
	shortfall: WeeklyTarget[];
	warnings: PlanningWarning[];
	interval: number;
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
	const p = planRuns(input, undefined, true, toSuccession);
	return { successions: p.items, shortfall: p.shortfall, warnings: p.warnings, intervalWeeks: p.interval };
}

/**
 * planSuccessions for planSeason: the same successions, shortfall and warnings, but
 * each handed to `make` as bare facts (refilled per succession, see SuccessionRun),
 * without the seed and basis a season plan does not use (it works out seed per
 * placed piece), and without each succession's frost and heat warnings, which the
 * caller makes with successionWarnings when it makes the planting (a season plan
 * would otherwise carry thousands of them through placement). `temps` is a lookup
 * already made for the farm's weekly temperatures, shared by every variety.
 */
export function planSuccessionRuns<T>(
	input: PlanInput,
	temps: TempLookup | undefined,
	make: (run: Readonly<SuccessionRun>) => T
): { runs: T[]; shortfall: WeeklyTarget[]; warnings: PlanningWarning[] } {
	const p = planRuns(input, temps, false, (run, v, o) => {
		// planSuccessions would reject bad seed figures at the first succession; so does this.
		if (run.index === 0) validateSeedInput(seedInput(v, o, run.bedFeet));
		return make(run);
	});
	return { runs: p.items, shortfall: p.shortfall, warnings: p.warnings };
}

type MakeRun<T> = (run: Readonly<SuccessionRun>, v: Variety, o: ResolvedOptions, mondays: DayNumber[]) => T;

function planRuns<T>(input: PlanInput, temps: TempLookup | undefined, detail: boolean, make: MakeRun<T>): Planned<T> {
	const v = validateVariety(input.variety);
	const farm = input.farm;
	if (!farm || typeof farm !== 'object') throw new PlanningInputError('farm', 'is required');
	const season = {
		lastSpringFrost: toDayNumber(farm.lastSpringFrost, 'farm.lastSpringFrost'),
		firstFallFrost: toDayNumber(farm.firstFallFrost, 'farm.firstFallFrost')
	};
	const warnings: PlanningWarning[] = [];
	const o = resolveOptions(v, farm, input.options ?? {}, warnings, temps);
	const facts = { ...season, temps: o.dtm.temps };
	const { mondays, qty } = normaliseTargets(input.targets);
	const H = v.harvestWindowDays;
	const perFtPerDay = v.yieldPerBedFoot / H;
	const prefix = input.options?.keyPrefix ?? v.id ?? varietyLabel(v);
	const items: T[] = [];
	// Harvest windows as flat triples: first day, last day, bed-feet.
	const windows: number[] = [];
	const unreachable: DayNumber[] = [];
	const scratchDtm = detail ? undefined : blankDtm();
	const run: SuccessionRun = {
		prefix, index: 0, start: 0, fieldDay: 0, trayDay: undefined, lastHarvest: 0, bedFeet: 0, rawFeet: 0, firstWeek: 0, endWeek: 0,
		warnings: [], dtm: scratchDtm ?? blankDtm(), peakMonday: 0, peakQ: 0, peakPerFt: 0, peakDays: 0
	};
	let i = 0;
	while (i < mondays.length) {
		const start = mondays[i];
		const dtm = scratchDtm ? effectiveDaysInto(scratchDtm, v, start, o.dtm) : effectiveDaysToMaturity(v, start, o.dtm);
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
		// The most demanding week of the run (kept as plain numbers: this loop runs per target week).
		let peakNeed = -1;
		let peakMonday = start;
		let peakQ = 0;
		let peakPerFt = 0;
		let peakDays = 0;
		while (j < mondays.length && mondays[j] < groupEnd) {
			const monday = mondays[j];
			const offsetDays = monday - start;
			// Days of this window inside that week: 7, except when the whole window is under a week.
			const days = Math.min(7, H - offsetDays);
			const perFt = perFtPerDay * days;
			const q = qty[j];
			const need = q / perFt;
			if (need > peakNeed) {
				peakNeed = need;
				peakMonday = monday;
				peakQ = q;
				peakPerFt = perFt;
				peakDays = days;
			}
			j++;
		}
		const rawFeet = peakNeed * (1 + o.margin);
		const bedFeet = roundUpTo(rawFeet, o.increment);
		const lastHarvest = start + H - 1;
		run.index = items.length;
		run.start = start;
		run.fieldDay = fieldDay;
		run.trayDay = trayDay;
		run.lastHarvest = lastHarvest;
		run.bedFeet = bedFeet;
		run.rawFeet = rawFeet;
		run.firstWeek = i;
		run.endWeek = j;
		// The days-to-maturity warnings (a fresh list: the record is refilled) and, with detail, the succession's own.
		run.warnings = detail ? withDtmWarnings(dtm.warnings, successionWarnings(v, fieldDay, start, lastHarvest, facts)) : dtm.warnings.length === 0 ? NONE : [...dtm.warnings];
		run.dtm = dtm;
		run.peakMonday = peakMonday;
		run.peakQ = peakQ;
		run.peakPerFt = peakPerFt;
		run.peakDays = peakDays;
		items.push(make(run, v, o, mondays));
		windows.push(start, lastHarvest, bedFeet);
		i = j;
	}
	const qtyOf = (m: DayNumber): number => qty[mondays.indexOf(m)] ?? 0;
	const shortfall: WeeklyTarget[] = unreachable.map((m) => ({ week: isoWeekOfDay(m), quantity: qtyOf(m) }));
	if (unreachable.length > 0) {
		const weeks = unreachable.map((m) => isoWeekOfDay(m));
		warnings.push({
			code: 'unreachable_week',
			message: `No succession of ${varietyLabel(v)} can be ready in ${weeks.join(', ')}: it would have to be sown before ${o.earliestField !== undefined ? `the earliest field date ${fromDayNumber(o.earliestField)}` : ''}${o.earliestField !== undefined && o.today !== undefined ? ' or ' : ''}${o.today !== undefined ? `today (${fromDayNumber(o.today)})` : ''}.`,
			weeks
		});
	}
	checkSupply(windows, mondays, qty, unreachable, perFtPerDay, shortfall, warnings);
	return { items, shortfall, warnings, interval: o.interval };
}

function seedInput(v: Variety, o: ResolvedOptions, bedFeet: number): SeedNeedInput {
	return {
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
	};
}

/** A run dressed as planSuccessions returns it: dates as strings, seed, and the basis for explain*(). */
function toSuccession(run: Readonly<SuccessionRun>, v: Variety, o: ResolvedOptions, mondays: DayNumber[]): Succession {
	const { bedFeet } = run;
	const weeks: string[] = [];
	for (let k = run.firstWeek; k < run.endWeek; k++) weeks.push(isoWeekOfDay(mondays[k]));
	const seed = seedNeed(seedInput(v, o, bedFeet));
	const weeklyYieldPerFt = (v.yieldPerBedFoot / v.harvestWindowDays) * 7;
	const s: Succession = {
		key: `${run.prefix}#${run.index + 1}`,
		index: run.index,
		method: v.method,
		fieldDate: fromDayNumber(run.fieldDay),
		firstHarvest: fromDayNumber(run.start),
		lastHarvest: fromDayNumber(run.lastHarvest),
		bedFeet,
		weeklyYield: bedFeet * weeklyYieldPerFt,
		totalYield: bedFeet * v.yieldPerBedFoot,
		yieldPerBedFoot: v.yieldPerBedFoot,
		harvestWindowDays: v.harvestWindowDays,
		weeks,
		seed,
		warnings: run.warnings,
		basis: {
			weeklyYieldPerFt,
			peakWeek: isoWeekOfDay(run.peakMonday),
			peakQuantity: run.peakQ,
			peakSupplyPerFt: run.peakPerFt,
			peakWeekDays: run.peakDays,
			margin: o.margin,
			increment: o.increment,
			rawFeet: run.rawFeet,
			seedMargin: o.seedMargin,
			dtm: run.dtm
		}
	};
	if (run.trayDay !== undefined) s.traySowDate = fromDayNumber(run.trayDay);
	if (v.id !== undefined) s.varietyId = v.id;
	const crop = v.crop ?? v.cropId;
	if (crop !== undefined) s.crop = crop;
	if (v.family !== undefined) s.family = v.family;
	return s;
}

/** An empty list shared by every succession without days-to-maturity warnings; never written to. */
const NONE: PlanningWarning[] = [];

/** A succession's warnings: the days-to-maturity ones, then its own (a fresh list, shared with neither). */
export function withDtmWarnings(dtmWarnings: PlanningWarning[], own: PlanningWarning[]): PlanningWarning[] {
	return dtmWarnings.length === 0 ? own : [...dtmWarnings, ...own];
}
