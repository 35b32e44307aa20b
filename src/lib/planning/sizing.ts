// Net-need sizing of one variety's successions (planRuns): the core of planSuccessions and
// planSeason. See successions.ts for the entry points and storage-sizing.ts for storage crops.
import { PlanningInputError, requireNonNegativeItem } from './errors';
import { cumulativeWeights, shareOfDays } from './harvest-curve';
import { type DayNumber, toDayNumber, yearOfDay } from './day-number';
import { blankDtm, effectiveDaysInto, effectiveDaysToMaturity, maturityFrom } from './effective-dtm';
import { isoWeekOfDay, weekStartDayItem } from './iso-week';
import { roundUpTo } from './numbers';
import { type SizingWeeks, coverByLp, peakWeekOf } from './cover-lp';
import * as pw from './plan-warnings';
import { type ResolvedOptions, resolveOptions } from './resolve-options';
import type { Candidate, PlanInput, SuccessionRun } from './succession-types';
import type { PlanningWarning, Variety, WeeklyTarget } from './types';
import { normaliseTargets } from './target-weeks';
import { inMonthDayWindow, sowingWindowOf, tooColdToSow } from './sowing-window';
import { sizeStoredHarvests } from './storage-sizing';
import { validateVariety, varietyLabel } from './variety';
import type { TempLookup } from './weekly-temps';

export interface Planned<T> {
	items: T[];
	shortfall: WeeklyTarget[];
	warnings: PlanningWarning[];
	interval: number;
}

export type MakeRun<T> = (run: Readonly<SuccessionRun>, v: Variety, o: ResolvedOptions, mondays: DayNumber[]) => T;

/** The covering problem planRuns solves, for sizingLp: handed out once the plan is made. */
export interface SizingProblem extends SizingWeeks {
	candidate: (c: number) => Candidate;
	perFt: (c: number, w: number) => number;
}

/**
 * Net-need sizing (DESIGN steps 1–4): each week needs its target × (1 + margin) less what harvests
 * then from outside the plan. The covering program over the reachable starts (fewest bed-foot-days
 * meeting every need; ties to later starts) is solved exactly (cover-lp.ts), each start's bed-feet
 * rounded up to the increment; a pass over the weeks tops up any week still short from the start
 * covering the rest of the need at the least bed-foot-days per unit, and the repair trims what
 * rounding left over. A week no reachable start can supply is reported as shortfall with an
 * `unreachable_week` warning.
 */
export function planRuns<T>(
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
	const tenderAfter = pw.tenderDaysOf(farm.tenderDaysAfterFrost);
	const facts: pw.SeasonFacts = {
		...season,
		temps: o.dtm.temps,
		tenderDaysAfterFrost: tenderAfter,
		frostProbabilityPct: farm.frostProbabilityPct
	};
	const { mondays, qty } = normaliseTargets(input.targets);
	const lastFrostOfYear = pw.tenderFieldStart(season.lastSpringFrost, tenderAfter);
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
		const frostFree = v.frostTender ? lastFrostOfYear(yearOfDay(fieldDay)) : -Infinity;
		// ... and is picked until the week of the first fall frost after it, no longer.
		const lastDay = Math.min(first + H - 1, pw.plannedPickEnd(v.frostTender, fieldDay, facts));
		const ok = !(
			(window !== null && !inMonthDayWindow(fieldDay, window.from, window.to)) ||
			tooColdToSow(v, fieldDay, o.dtm.temps) !== null ||
			(o.earliestField !== undefined && fieldDay < o.earliestField) ||
			(o.today !== undefined && firstAction < o.today) ||
			fieldDay < frostFree ||
			dtm.source === 'gdd_cold' ||
			first < start ||
			first > start + 6 ||
			first > lastDay
		);
		cand = {
			ok,
			fieldDay,
			first,
			lastDay,
			coef: first > start || lastDay < first + H - 1 ? shiftedCoefficients(first - start, lastDay - first) : undefined,
			trayDay,
			// Held until the window ends, or the last target week if sooner (the harvest stops there).
			occupancy: Math.min(lastDay + 1, lastSunday + 1) - fieldDay,
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
	/** Per-foot supply by week of a harvest starting `late` days after its Monday and picked to day `lastRel` of it. */
	function shiftedCoefficients(late: number, lastRel: number): Float64Array {
		const out = new Float64Array(span);
		for (let k = 0; k < span; k++) out[k] = Y * shareOfDays(P, 7 * k - late, Math.min(7 * k + 6 - late, lastRel));
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

	// No succession shorter than one plant per row (one in-row spacing), in whole increments.
	const minFeet = roundUpTo(v.inRowSpacingIn / 12, o.increment);
	// The covering program, solved exactly; the weekly pass below tops up what float dust left short.
	const ok = (c: number): boolean => candidate(c).ok;
	const occupancy = (c: number): number => candidate(c).occupancy;
	const lp = fromStore ? null : coverByLp({ nWeeks, cMin, span, step, target, need, ok, occupancy, perFt });
	for (const [c, x] of lp ?? []) {
		const cand = candidate(c);
		cand.raw = x;
		cand.feet = Math.max(roundUpTo(x, o.increment), minFeet);
		cand.sizedOn = peakWeekOf(c, span, nWeeks, target, perFt);
		cand.sizedPerFt = perFt(c, cand.sizedOn);
		for (let u = Math.max(0, c); u < nWeeks && u <= c + span - 1; u++) planned[u] += cand.feet * perFt(c, u);
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
		const feet = Math.max(roundUpTo(cand.feet + bestX, o.increment), minFeet);
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
			const left = roundUpTo(Math.max(0, cand.feet - cut), o.increment);
			const feet = left > 0 ? Math.max(left, minFeet) : 0;
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
		const lastHarvest = Math.min(cand.lastDay, lastSunday);
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
			? withDtmWarnings(cand.dtmWarnings, pw.successionWarnings(v, cand.fieldDay, start, lastHarvest, facts))
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
			message: pw.unreachableMessage(v, o.earliestField, o.today, !!o.dtm.temps, weeks),
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

/** An empty list shared by every succession without days-to-maturity warnings; never written to. */
const NONE: PlanningWarning[] = [];

/** A succession's warnings: the days-to-maturity ones, then its own (a fresh list, shared with neither). */
export function withDtmWarnings(dtmWarnings: PlanningWarning[], own: PlanningWarning[]): PlanningWarning[] {
	return dtmWarnings.length === 0 ? own : [...dtmWarnings, ...own];
}
