import {
	PlanningInputError,
	requireLatitude,
	requireNonNegative,
	requireNonNegativeItem,
	requirePositive
} from './errors';
import { type HarvestCurve, cumulativeWeights, shareOfDays } from './harvest-curve';
import { type DayNumber, fromDayNumber, toDayNumber, yearOfDay } from './day-number';
import {
	type DtmContext,
	type EffectiveDtm,
	blankDtm,
	effectiveDaysInto,
	effectiveDaysToMaturity,
	maturityFrom
} from './effective-dtm';
import { isoWeekOfDay, weekStartDayItem } from './iso-week';
import { roundUpTo } from './numbers';
import { successionWarnings } from './plan-warnings';
import { type SeedNeed, type SeedNeedInput, seedNeed, validateSeedInput } from './seed';
import type { PlanningWarning, Variety, WeeklyTarget } from './types';
import { normaliseTargets } from './target-weeks';
import { inMonthDayWindow, sowingWindowOf } from './sowing-window';
import { sizeStoredHarvests } from './storage-sizing';
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
	/** Day length (hours) at which growth runs at half speed (see shortDayRate). Default 10 hours. */
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
	/**
	 * What plantings outside this plan already harvest in the target weeks (kept plantings,
	 * other seasons' plantings), in the crop's unit: the plan covers only the rest.
	 */
	supplied?: WeeklyTarget[];
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
	/** How its yield spreads over the window (absent: flat). */
	curve?: HarvestCurve;
	/** Set when the harvest ends before the window does (after the last target week): the full window. */
	windowDays?: number;
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
	/** Weeks between candidate starts: the asked-for interval, else 1. */
	stepWeeks: number;
	margin: number;
	increment: number;
	seedMargin: number;
	today?: DayNumber;
	earliestField?: DayNumber;
	dtm: DtmContext;
}

function resolveOptions(
	v: Variety,
	farm: Farm,
	o: PlanOptions,
	warnings: PlanningWarning[],
	temps?: TempLookup
): ResolvedOptions {
	const fullWeeks = Math.floor(v.harvestWindowDays / 7);
	const maxInterval = Math.max(1, fullWeeks);
	let interval = 1;
	if (o.intervalWeeks !== undefined) {
		if (!Number.isInteger(o.intervalWeeks) || o.intervalWeeks < 1 || o.intervalWeeks > 4) {
			throw new PlanningInputError(
				'options.intervalWeeks',
				`must be a whole number of weeks from 1 to 4 (got ${o.intervalWeeks})`
			);
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
	const increment =
		o.bedFootIncrement === undefined ? 1 : requirePositive('options.bedFootIncrement', o.bedFootIncrement);
	const seedMargin =
		v.margin ?? (o.seedMargin === undefined ? 0.1 : requireNonNegative('options.seedMargin', o.seedMargin));
	return {
		interval,
		stepWeeks: interval,
		margin,
		increment,
		seedMargin,
		today: o.today === undefined ? undefined : toDayNumber(o.today, 'options.today'),
		earliestField:
			o.earliestFieldDate === undefined ? undefined : toDayNumber(o.earliestFieldDate, 'options.earliestFieldDate'),
		dtm: {
			latitude: requireLatitude('farm.latitude', farm.latitude),
			shortDayThresholdHours:
				o.shortDayThresholdHours === undefined
					? 10
					: requireNonNegative('options.shortDayThresholdHours', o.shortDayThresholdHours),
			gddWalkLimitDays:
				o.gddWalkLimitDays === undefined ? 365 : requirePositive('options.gddWalkLimitDays', o.gddWalkLimitDays),
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
	/**
	 * First harvest, as the field date's forward derivation gives it (what the grid shows): the
	 * Monday of its first target week, or a day or two after it where short days make the clock skip.
	 */
	start: DayNumber;
	/** Share of the window's yield picked by lastHarvest: under 1 when the harvest ends early. */
	yieldShare: number;
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

/** What planRuns knows of one candidate start (a Monday): its dates, or that it cannot be reached. */
interface Candidate {
	ok: boolean;
	fieldDay: DayNumber;
	/** First harvest derived forwards from fieldDay: the candidate's Monday or a day or two after. */
	first: DayNumber;
	/**
	 * Per-foot supply in the candidate's weeks when its harvest starts after its Monday (the window's
	 * last days, past the candidate's weeks, are left out: counting short is the safe side); else undefined.
	 */
	coef: Float64Array | undefined;
	trayDay: DayNumber | undefined;
	/** Days the succession holds its bed: field date to last harvest. */
	occupancy: number;
	dtmWarnings: PlanningWarning[];
	dtm: EffectiveDtm | undefined;
	/** Bed-feet chosen here so far (0: no succession starts here), unrounded and rounded. */
	raw: number;
	feet: number;
	/** The week whose need first called for this succession, its target and per-foot supply. */
	sizedOn: number;
	sizedPerFt: number;
}

/**
 * Net-need sizing (DESIGN steps 1–4). Weeks are taken in order; a week whose target × (1 + margin)
 * is not yet met by what already harvests then (supply from outside the plan, and the successions
 * planned so far) gets more bed-feet from the one candidate start, among those whose harvest
 * reaches it, that covers the rest of the weeks' need at the least bed-foot-days per unit of need
 * met; ties go to the later start. With a flat curve that is the latest start (the start that
 * reaches furthest into later weeks), the classic optimal rule for covering weekly needs with
 * windows of one length; with a ramp curve it is a start whose peak falls on the week. The
 * bed-feet are rounded up to the increment at once, so the extra they bring counts toward the
 * next weeks (the repair that keeps rounding from adding up). A week no reachable start can
 * supply (field date before `earliestFieldDate`, first action before `today`) is reported as
 * shortfall with an `unreachable_week` warning.
 */
/** The covering problem planRuns solves, for sizingLp: handed out once the plan is made. */
interface SizingProblem {
	nWeeks: number;
	cMin: number;
	span: number;
	step: number;
	target: Float64Array;
	need: Float64Array;
	candidate: (c: number) => Candidate;
	perFt: (c: number, w: number) => number;
}

function planRuns<T>(
	input: PlanInput,
	temps: TempLookup | undefined,
	detail: boolean,
	make: MakeRun<T>,
	problemOut?: (p: SizingProblem) => void
): Planned<T> {
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
	const frostMonthDay = v.frostTender ? fromDayNumber(season.lastSpringFrost).slice(4) : '';
	let frostYear = NaN;
	let frostDay = 0;
	const lastFrostOfYear = (year: number): DayNumber => {
		if (year !== frostYear) {
			frostYear = year;
			frostDay = toDayNumber(
				`${String(year).padStart(4, '0')}${frostMonthDay === '-02-29' ? '-02-28' : frostMonthDay}`
			);
		}
		return frostDay;
	};
	const window = sowingWindowOf(v);
	const H = v.harvestWindowDays;
	const P = cumulativeWeights(v.harvestCurve, H);
	const Y = v.yieldPerBedFoot;
	const prefix = input.options?.keyPrefix ?? v.id ?? varietyLabel(v);
	const items: T[] = [];
	const unreachable: DayNumber[] = [];
	if (mondays.length === 0) return { items, shortfall: [], warnings, interval: o.interval };

	// Weeks from the first target week to the last, by offset from the first Monday.
	const base = mondays[0];
	const lastSunday = mondays[mondays.length - 1] + 6;
	const nWeeks = (mondays[mondays.length - 1] - base) / 7 + 1;
	const target = new Float64Array(nWeeks);
	const need = new Float64Array(nWeeks);
	const outside = new Float64Array(nWeeks);
	const planned = new Float64Array(nWeeks);
	for (let k = 0; k < mondays.length; k++) target[(mondays[k] - base) / 7] = qty[k];
	const supplied = input.supplied;
	if (supplied !== undefined) {
		if (!Array.isArray(supplied)) throw new PlanningInputError('supplied', 'must be a list of { week, quantity }');
		for (let i = 0; i < supplied.length; i++) {
			const m = weekStartDayItem(supplied[i].week, 'supplied', i, 'week');
			const q = requireNonNegativeItem('supplied', i, 'quantity', supplied[i].quantity);
			const w = (m - base) / 7;
			if (w >= 0 && w < nWeeks) outside[w] += q;
		}
	}
	for (let w = 0; w < nWeeks; w++) need[w] = target[w] > 0 ? target[w] * (1 + o.margin) - outside[w] : 0;

	// Candidate starts: every `interval`-th Monday (every Monday unless the grower asked for an
	// interval), from as early as a window that reaches the first target week can start.
	const span = Math.ceil(H / 7);
	const step = o.stepWeeks;
	// A storage crop's harvest may come before the first target week: it feeds it from store.
	const store = v.storage !== undefined && v.storage.keepWeeks > 0 ? v.storage : undefined;
	const cMin = -(span - 1) - (store?.keepWeeks ?? 0);
	const cands: (Candidate | undefined)[] = new Array<Candidate | undefined>(nWeeks - cMin).fill(undefined);
	const scratchDtm = detail ? undefined : blankDtm();
	const candidate = (c: number): Candidate => {
		let cand = cands[c - cMin];
		if (cand) return cand;
		const start = base + 7 * c;
		const dtm = scratchDtm ? effectiveDaysInto(scratchDtm, v, start, o.dtm) : effectiveDaysToMaturity(v, start, o.dtm);
		// The grid derives the first harvest forwards from the field date with the same clock. Walked
		// back, the clock gives the latest field date ready by this Monday; where shortening days make
		// it skip, that one is ready a day or two early, and the next day's is ready a day or two late.
		// The later one is taken: its harvest (a single cut, say) stays in this Monday's week.
		let fieldDay = start - dtm.days;
		let first = start;
		if (dtm.source !== 'gdd_cold') {
			first = fieldDay + maturityFrom(v, fieldDay, o.dtm).days;
			if (first < start) {
				fieldDay++;
				first = fieldDay + maturityFrom(v, fieldDay, o.dtm).days;
			}
		}
		const trayDay = v.method === 'transplant' ? fieldDay - (v.daysInTray ?? 0) : undefined;
		const firstAction = trayDay ?? fieldDay;
		// A tender crop goes out only after the last spring frost of its own year; a degree-day crop
		// whose heat cannot add up since the last cold spell cannot be ready that week at all.
		const frostFree = v.frostTender ? lastFrostOfYear(yearOfDay(start)) : -Infinity;
		const ok = !(
			(window !== null && !inMonthDayWindow(fieldDay, window.from, window.to)) ||
			(o.earliestField !== undefined && fieldDay < o.earliestField) ||
			(o.today !== undefined && firstAction < o.today) ||
			fieldDay < frostFree ||
			dtm.source === 'gdd_cold' ||
			first < start ||
			first > start + 6
		);
		cand = {
			ok,
			fieldDay,
			first,
			coef: first > start ? shiftedCoefficients(first - start) : undefined,
			trayDay,
			// Held until the window ends, or the last target week if sooner (the harvest stops there).
			occupancy: Math.min(first + H, lastSunday + 1) - fieldDay,
			dtmWarnings: dtm.warnings.length === 0 ? NONE : [...dtm.warnings],
			dtm: detail ? dtm : undefined,
			raw: 0,
			feet: 0,
			sizedOn: -1,
			sizedPerFt: 0
		};
		cands[c - cMin] = cand;
		return cand;
	};
	// Per-foot supply of a succession starting at week c in week w (Monday to Sunday).
	// (It depends only on w − c: worked out once per variety.)
	const byOffset = new Float64Array(span);
	for (let k = 0; k < span; k++) byOffset[k] = Y * shareOfDays(P, 7 * k, 7 * k + 6);
	function shiftedCoefficients(late: number): Float64Array {
		const out = new Float64Array(span);
		for (let k = 0; k < span; k++) out[k] = Y * shareOfDays(P, 7 * k - late, 7 * k + 6 - late);
		return out;
	}
	const coefOf = (c: number): Float64Array => (c >= cMin && c < nWeeks ? cands[c - cMin]?.coef : undefined) ?? byOffset;
	const perFt = (c: number, w: number): number => (w - c >= 0 && w - c < span ? coefOf(c)[w - c] : 0);

	// A storage crop: one harvest sized for the weeks its store feeds, not the weekly greedy below.
	const fromStore = store ? sizeStore(store) : undefined;
	function sizeStore(s: { keepWeeks: number; lossPerWeek: number }): Float64Array {
		const lots = new Map<number, number>();
		for (let i = 0; i < (supplied?.length ?? 0); i++) {
			const m = weekStartDayItem(supplied![i].week, 'supplied', i, 'week');
			const q = requireNonNegativeItem('supplied', i, 'quantity', supplied![i].quantity);
			lots.set((m - base) / 7, (lots.get((m - base) / 7) ?? 0) + q);
		}
		const sized = sizeStoredHarvests({
			nWeeks,
			cMin,
			span,
			step,
			target,
			need: Float64Array.from(target, (t) => (t > 0 ? t * (1 + o.margin) : 0)),
			increment: o.increment,
			keepWeeks: s.keepWeeks,
			lossPerWeek: s.lossPerWeek,
			lots,
			reachable: (c) => candidate(c).ok,
			perFt
		});
		for (const [c, feet] of sized.feet) {
			const cand = candidate(c);
			cand.feet = feet;
			cand.raw = feet;
			cand.sizedOn = sized.sizedOn.get(c) ?? 0;
			cand.sizedPerFt = perFt(c, c);
		}
		for (const u of sized.unreachable) unreachable.push(base + 7 * u);
		return sized.given;
	}

	for (let w = 0; w < (fromStore ? 0 : nWeeks); w++) {
		if (!(target[w] > 0)) continue;
		const net = need[w] - planned[w];
		if (net <= 1e-9 * Math.max(1, need[w])) continue;
		let best = NaN;
		let bestX = 0;
		let bestScore = Infinity;
		for (let c = w; c >= Math.max(cMin, w - span + 1); c--) {
			if (step > 1 && ((c % step) + step) % step !== 0) continue;
			if (!(byOffset[w - c] > 0)) continue;
			const cand = cands[c - cMin] ?? candidate(c);
			if (!cand.ok) continue;
			const co = cand.coef ?? byOffset;
			const cf = co[w - c];
			if (!(cf > 0)) continue;
			const x = net / cf;
			let useful = 0;
			const end = Math.min(nWeeks - 1, c + span - 1);
			for (let u = w; u <= end; u++) {
				const left = need[u] - planned[u];
				if (left > 0 && target[u] > 0) useful += Math.min(co[u - c] * x, left);
			}
			const score = (x * cand.occupancy) / useful;
			if (score < bestScore * (1 - 1e-9)) {
				bestScore = score;
				best = c;
				bestX = x;
			}
		}
		if (Number.isNaN(best)) {
			unreachable.push(base + 7 * w);
			continue;
		}
		const cand = candidate(best);
		const feet = roundUpTo(cand.feet + bestX, o.increment);
		const added = feet - cand.feet;
		if (cand.sizedOn < 0) {
			cand.sizedOn = w;
			cand.sizedPerFt = perFt(best, w);
		}
		cand.raw += bestX;
		cand.feet = feet;
		for (let u = Math.max(0, best); u < nWeeks && u <= best + span - 1; u++) planned[u] += added * perFt(best, u);
	}

	// Repair: greedy choices made for early weeks may leave later successions (or themselves)
	// larger than what is still needed once everything is placed. Shrink each succession, latest
	// first, to the least whole increment that keeps every week it supplies covered.
	for (let pass = 0; pass < (fromStore ? 0 : 2); pass++) {
		for (let c = nWeeks - 1; c >= cMin; c--) {
			const cand = cands[c - cMin];
			if (!cand || cand.feet <= 0) continue;
			let cut = cand.feet;
			for (let u = Math.max(0, c); u < nWeeks && u <= c + span - 1; u++) {
				const cf = perFt(c, u);
				if (!(target[u] > 0) || !(cf > 0) || !(need[u] > 0)) continue;
				cut = Math.min(cut, (planned[u] - need[u]) / cf);
			}
			const feet = roundUpTo(Math.max(0, cand.feet - cut), o.increment);
			if (feet >= cand.feet) continue;
			for (let u = Math.max(0, c); u < nWeeks && u <= c + span - 1; u++) planned[u] -= (cand.feet - feet) * perFt(c, u);
			cand.feet = feet;
		}
	}

	const run: SuccessionRun = {
		prefix,
		index: 0,
		start: 0,
		yieldShare: 1,
		fieldDay: 0,
		trayDay: undefined,
		lastHarvest: 0,
		bedFeet: 0,
		rawFeet: 0,
		firstWeek: 0,
		endWeek: 0,
		warnings: [],
		dtm: scratchDtm ?? blankDtm(),
		peakMonday: 0,
		peakQ: 0,
		peakPerFt: 0,
		peakDays: 0
	};
	// The target weeks (indices into mondays) each succession's harvest reaches. A harvest that
	// would run past the last target week ends with that week: the bed is free sooner, and the
	// yield is what the curve gives up to then. (The stored planting keeps that shorter harvest:
	// the grid derives its last harvest from its first and its stored days of harvest.)
	let firstWeek = 0;
	for (let c = cMin; c < nWeeks; c++) {
		const cand = cands[c - cMin];
		if (!cand || cand.feet <= 0) continue;
		const start = cand.first;
		const lastHarvest = Math.min(start + H - 1, lastSunday);
		run.yieldShare = lastHarvest === start + H - 1 ? 1 : P[lastHarvest - start + 1];
		while (firstWeek < mondays.length && mondays[firstWeek] < base + 7 * c) firstWeek++;
		let endWeek = firstWeek;
		while (endWeek < mondays.length && mondays[endWeek] <= lastHarvest) endWeek++;
		run.index = items.length;
		run.start = start;
		run.fieldDay = cand.fieldDay;
		run.trayDay = cand.trayDay;
		run.lastHarvest = lastHarvest;
		run.bedFeet = cand.feet;
		run.rawFeet = cand.raw;
		run.firstWeek = firstWeek;
		run.endWeek = endWeek;
		run.warnings = detail
			? withDtmWarnings(cand.dtmWarnings, successionWarnings(v, cand.fieldDay, start, lastHarvest, facts))
			: cand.dtmWarnings;
		if (cand.dtm) run.dtm = cand.dtm;
		run.peakMonday = base + 7 * cand.sizedOn;
		run.peakQ = target[cand.sizedOn];
		run.peakPerFt = cand.sizedPerFt;
		run.peakDays = Math.min(7, H - 7 * (cand.sizedOn - c));
		items.push(make(run, v, o, mondays));
	}

	problemOut?.({ nWeeks, cMin, span, step, target, need, candidate, perFt });
	const shortfall: WeeklyTarget[] = [];
	const short: string[] = [];
	const skip = new Set(unreachable);
	for (let w = 0; w < nWeeks; w++) {
		if (!(target[w] > 0)) continue;
		const gap = fromStore ? target[w] - fromStore[w] : target[w] - outside[w] - planned[w];
		if (gap <= 1e-9 * Math.max(1, target[w])) continue;
		const week = isoWeekOfDay(base + 7 * w);
		shortfall.push({ week, quantity: gap });
		if (!skip.has(base + 7 * w)) short.push(week);
	}
	if (unreachable.length > 0) {
		const weeks = unreachable.map((m) => isoWeekOfDay(m));
		warnings.push({
			code: 'unreachable_week',
			message: `No succession of ${varietyLabel(v)} can be ready in ${weeks.join(', ')}: it would have to be sown too early (before ${o.earliestField !== undefined ? `the earliest field date ${fromDayNumber(o.earliestField)}` : ''}${o.earliestField !== undefined && o.today !== undefined ? ' or ' : ''}${o.today !== undefined ? `today (${fromDayNumber(o.today)})` : ''}${o.earliestField !== undefined || o.today !== undefined ? ', ' : ''}the last spring frost for a tender crop, or before the last cold spell for a degree-day crop)${window ? `, or outside the crop's field dates (${v.sowFrom} to ${v.sowTo})` : ''}.`,
			weeks
		});
	}
	if (short.length > 0) {
		warnings.push({
			code: 'supply_short',
			message: `Planned supply falls short of target in ${short.join(', ')}.`,
			weeks: short
		});
	}
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
		totalYield: bedFeet * v.yieldPerBedFoot * run.yieldShare,
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
	if (v.harvestCurve !== undefined && v.harvestCurve.shape !== 'flat') s.curve = v.harvestCurve;
	if (run.yieldShare < 1) s.windowDays = v.harvestWindowDays;
	return s;
}

/** An empty list shared by every succession without days-to-maturity warnings; never written to. */
const NONE: PlanningWarning[] = [];

/** A succession's warnings: the days-to-maturity ones, then its own (a fresh list, shared with neither). */
export function withDtmWarnings(dtmWarnings: PlanningWarning[], own: PlanningWarning[]): PlanningWarning[] {
	return dtmWarnings.length === 0 ? own : [...dtmWarnings, ...own];
}

/**
 * The plan's sizing as a linear program, for comparing the plan with its lower bound: one
 * variable per reachable candidate start (bed-feet, continuous), minimising bed-foot-days
 * (bed-feet × days from field date to the end of the window), with every week a reachable
 * start can supply getting at least its target × (1 + margin), less what is supplied from
 * outside the plan. Returned as CPLEX LP text for any LP solver (the bench and tests use the
 * `highs` package), beside the plan's own bed-foot-days on the same measure. `lpWhole` is the
 * same program with bed-feet in whole bed-foot increments (an integer program): a plan must
 * round to increments, so its optimum is the tightest bound such a plan can meet.
 */
export function sizingLp(input: PlanInput): {
	lp: string;
	lpWhole: string;
	planBedFootDays: number;
	variables: number;
} {
	let problem: SizingProblem | undefined;
	const plan = planRuns(
		input,
		undefined,
		false,
		(run) => ({ last: run.lastHarvest, feet: run.bedFeet, field: run.fieldDay }),
		(p) => (problem = p)
	);
	let planBedFootDays = 0;
	// The same measure as each candidate's occupancy: field date to the end of its (possibly shortened) harvest.
	for (const r of plan.items) planBedFootDays += r.feet * (r.last + 1 - r.field);
	const p = problem;
	if (!p) return { lp: '', lpWhole: '', planBedFootDays, variables: 0 };
	const inc = input.options?.bedFootIncrement ?? 1;
	const program = (scale: number): { rows: string[]; obj: string[]; names: string[] } => {
		const obj: string[] = [];
		const rows: string[] = [];
		const used = new Set<number>();
		for (let w = 0; w < p.nWeeks; w++) {
			if (!(p.target[w] > 0) || !(p.need[w] > 0)) continue;
			const terms: string[] = [];
			for (let c = w; c >= Math.max(p.cMin, w - p.span + 1); c--) {
				if (p.step > 1 && ((c % p.step) + p.step) % p.step !== 0) continue;
				const cf = p.perFt(c, w);
				if (!(cf > 0) || !p.candidate(c).ok) continue;
				terms.push(`${cf * scale} x${c - p.cMin}`);
				used.add(c);
			}
			if (terms.length > 0) rows.push(` w${w}: ${terms.join(' + ')} >= ${p.need[w]}`);
		}
		const names: string[] = [];
		for (const c of [...used].sort((a, b) => a - b)) {
			obj.push(`${p.candidate(c).occupancy * scale} x${c - p.cMin}`);
			names.push(`x${c - p.cMin}`);
		}
		return { rows, obj, names };
	};
	const text = (q: ReturnType<typeof program>, general: boolean): string =>
		`Minimize\n obj: ${q.obj.join(' + ')}\nSubject To\n${q.rows.join('\n')}\n` +
		(general ? `General\n ${q.names.join(' ')}\n` : '') +
		'End\n';
	const feet = program(1);
	if (feet.rows.length === 0) return { lp: '', lpWhole: '', planBedFootDays, variables: 0 };
	return { lp: text(feet, false), lpWhole: text(program(inc), true), planBedFootDays, variables: feet.names.length };
}
