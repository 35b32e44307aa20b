// Successions for one variety against weekly targets: the public entry points. The sizing itself
// is in sizing.ts (net need) and storage-sizing.ts (storage crops); the data in succession-types.ts.
import { fromDayNumber, type DayNumber } from './day-number';
import { isoWeekOfDay } from './iso-week';
import type { ResolvedOptions } from './resolve-options';
import { type SeedNeedInput, seedNeed, validateSeedInput } from './seed';
import { planRuns } from './sizing';
import type { PlanInput, PlanResult, Succession, SuccessionRun } from './succession-types';
import type { PlanningWarning, Variety, WeeklyTarget } from './types';
import type { TempLookup } from './weekly-temps';

export type {
	Farm,
	PlanInput,
	PlanOptions,
	PlanResult,
	Succession,
	SuccessionBasis,
	SuccessionRun
} from './succession-types';
export { withDtmWarnings } from './sizing';
export { sizingLp } from './sizing-lp';

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
