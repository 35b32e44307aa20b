// The plain data of succession planning: what planSuccessions takes and gives (see successions.ts).
import type { EffectiveDtm } from './effective-dtm';
import type { DayNumber } from './day-number';
import type { HarvestCurve } from './harvest-curve';
import type { SeedNeed } from './seed';
import type { PlanningWarning, Variety, WeeklyTarget } from './types';
import type { WeeklyMeanTempF } from './weekly-temps';

export interface Farm {
	lastSpringFrost: string;
	firstFallFrost: string;
	/** Degrees north (negative south), for day length. */
	latitude: number;
	/** Weekly normal mean °F keyed "YYYY-Www" (or "Www" for every year). */
	weeklyMeanTempF?: WeeklyMeanTempF;
	/** Days after the last spring frost that frost-tender crops go out (farm setting). Default 0. */
	tenderDaysAfterFrost?: number;
	/** The probability the frost dates stand for, percent (farm setting; shown in the warnings). */
	frostProbabilityPct?: number;
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

/** What planRuns knows of one candidate start (a Monday): its dates, or that it cannot be reached. */
export interface Candidate {
	ok: boolean;
	fieldDay: DayNumber;
	/** First harvest derived forwards from fieldDay: the candidate's Monday or a day or two after. */
	first: DayNumber;
	/** The window's last day: first + window − 1, or the first fall frost for a tender crop if sooner. */
	lastDay: DayNumber;
	/**
	 * Per-foot supply in the candidate's weeks when its harvest starts after its Monday (the window's
	 * last days, past the candidate's weeks, are left out: counting short is the safe side) or the
	 * first fall frost ends it early (a tender crop: nothing after the frost); else undefined.
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
