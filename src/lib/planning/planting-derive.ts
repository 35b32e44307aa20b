/**
 * Derived figures of one edited planting, worked forwards from its field date: the grid
 * recalculates them in the browser on every keystroke, and the server recomputes them
 * authoritatively on save — the same function in both places.
 *
 * The succession planner works backwards from a first harvest; a grower editing the grid
 * sets the field date instead, so here the first harvest comes from the growth clock run
 * forwards from the field date (`maturityFrom`): degree days and short days before the field
 * date never count. The planner runs the same clock backwards, so both give the same dates.
 */
import { checkBedConflicts, type BedConflict } from './bed-conflicts';
import type { Bed, BedPlanting } from './bed-types';
import { fromDayNumber, toDayNumber } from './day-number';
import { maturityFrom, type EffectiveDtm } from './effective-dtm';
import { cumulativeWeights } from './harvest-curve';
import { formatWeekDate } from './iso-week';
import { successionWarnings, tenderHarvestEnd } from './plan-warnings';
import { explainSeed } from './explain';
import { seedNeed, type SeedNeed, type SeedNeedInput } from './seed';
import type { ExplainStep, PlanningWarning, SowingMethod, Variety } from './types';
import { makeTempLookup } from './weekly-temps';
import type { Farm } from './succession-types';

/** The farm as a planting's dates need it: the planner's farm, and the short-day threshold (hours, default 10). */
export interface DeriveFarm extends Farm {
	shortDayThresholdHours?: number;
}

/** The editable facts of a planting that the derived figures depend on. */
export interface DeriveInput {
	method: SowingMethod;
	fieldDate: string;
	lengthFt: number;
	rows: number;
	inRowSpacingIn: number;
	seedsPerSpot: number;
	/**
	 * Days of harvest the planting keeps when it stops before its window ends (a plan ends the last
	 * succession with the last week of demand): the stored last harvest − first harvest + 1. Absent
	 * or not under the window: the whole window.
	 */
	harvestDays?: number | null;
}

export interface DerivedPlanting {
	traySowDate: string | null;
	firstHarvest: string;
	lastHarvest: string;
	/** Harvest units over the whole window. */
	expectedYield: number;
	/** Harvest units per week of the window (flat curve). */
	weeklyYield: number;
	seed: SeedNeed;
	dtm: EffectiveDtm;
	warnings: PlanningWarning[];
	explain: ExplainStep[];
}

// Default margin when a variety gives none, as the succession planner uses (options.seedMargin).
const DEFAULT_SEED_MARGIN = 0.1;
// Cells per tray assumed for a transplant whose variety gives none (a common 128-cell tray).
const DEFAULT_CELLS_PER_TRAY = 128;

type Context = { farm: DeriveFarm; temps?: ReturnType<typeof makeTempLookup>; frost: { last: number; first: number } };
const contexts = new WeakMap<DeriveFarm, Context>();
function contextOf(farm: DeriveFarm): Context {
	let c = contexts.get(farm);
	if (!c) {
		c = {
			farm,
			temps:
				farm.weeklyMeanTempF && Object.keys(farm.weeklyMeanTempF).length > 0
					? makeTempLookup(farm.weeklyMeanTempF)
					: undefined,
			frost: {
				last: toDayNumber(farm.lastSpringFrost, 'farm.lastSpringFrost'),
				first: toDayNumber(farm.firstFallFrost, 'farm.firstFallFrost')
			}
		};
		contexts.set(farm, c);
	}
	return c;
}

/** The fields of a planting that size its seed: its own bed-feet, rows and spacing. */
export type SeededPlanting = Pick<DeriveInput, 'method' | 'lengthFt' | 'rows' | 'inRowSpacingIn' | 'seedsPerSpot'>;

/** Seed-need inputs of a planting: its own bed-feet, rows and spacing, the variety's germination, seed size and prices. */
export function seedInputOf(p: SeededPlanting, v: Variety): SeedNeedInput {
	return {
		method: p.method,
		bedFeet: p.lengthFt,
		rows: p.rows,
		inRowSpacingIn: p.inRowSpacingIn,
		seedsPerSpot: p.seedsPerSpot,
		germinationRate: v.germinationRate,
		seedsPerGram: v.seedsPerGram,
		margin: v.margin ?? DEFAULT_SEED_MARGIN,
		cellsPerTray: p.method === 'transplant' ? (v.cellsPerTray ?? DEFAULT_CELLS_PER_TRAY) : undefined,
		seedPriceCentsPerGram: v.seedPriceCentsPerGram,
		seedsPerPacket: v.seedsPerPacket
	};
}

/** Dates, yield, seed, frost/heat warnings and the explanation of one planting. Throws PlanningInputError on bad input. */
export function derivePlanting(
	p: DeriveInput,
	v: Variety,
	farm: DeriveFarm,
	opts: { explain?: boolean } = {}
): DerivedPlanting {
	const ctx = contextOf(farm);
	const field = toDayNumber(p.fieldDate, 'fieldDate');
	const dtmCtx = {
		latitude: farm.latitude,
		shortDayThresholdHours: farm.shortDayThresholdHours ?? 10,
		gddWalkLimitDays: 365,
		temps: ctx.temps
	};
	const dtm = maturityFrom(v, field, dtmCtx);
	const first = field + dtm.days;
	const H = v.harvestWindowDays;
	const kept =
		p.harvestDays != null && Number.isInteger(p.harvestDays) && p.harvestDays >= 1 && p.harvestDays < H
			? p.harvestDays
			: H;
	const season = {
		lastSpringFrost: ctx.frost.last,
		firstFallFrost: ctx.frost.first,
		tenderDaysAfterFrost: farm.tenderDaysAfterFrost,
		frostProbabilityPct: farm.frostProbabilityPct,
		temps: ctx.temps
	};
	// A frost-tender crop's harvest ends at the first fall frost (one ready only after it is left
	// as it is, with the frost warning: it yields nothing the grower can pick).
	const frostEnd = tenderHarvestEnd(v.frostTender, field, season);
	const last = frostEnd >= first ? Math.min(first + kept - 1, frostEnd) : first + kept - 1;
	const picked = last - first + 1;
	const tray = p.method === 'transplant' ? field - (v.daysInTray ?? 0) : null;
	// The share of the window's yield picked by the last harvest (all of it unless the harvest stops early).
	const share = picked === H ? 1 : cumulativeWeights(v.harvestCurve, H)[picked];
	const expectedYield = Math.round(p.lengthFt * v.yieldPerBedFoot * share * 100) / 100;
	const weeklyYield = Math.round((expectedYield / (v.harvestWindowDays / 7)) * 100) / 100;
	const seedInput = seedInputOf(p, v);
	const seed = seedNeed(seedInput);
	const warnings = [...dtm.warnings, ...successionWarnings(v, field, first, last, season)];
	const fieldLabel = p.method === 'direct' ? 'sowing date' : 'transplant date';
	const out: DerivedPlanting = {
		traySowDate: tray === null ? null : fromDayNumber(tray),
		firstHarvest: fromDayNumber(first),
		lastHarvest: fromDayNumber(last),
		expectedYield,
		weeklyYield,
		seed,
		dtm,
		warnings,
		explain: []
	};
	// The explanation is text for a hover panel: built only when asked, so 5,000 rows derive fast.
	if (opts.explain === false) return out;
	const explain: ExplainStep[] = [
		{ label: fieldLabel, value: formatWeekDate(p.fieldDate), formula: 'as entered' },
		{ label: 'days to maturity (variety)', value: dtm.varietyDays, unit: 'days' },
		dtm.source === 'gdd' && dtm.gdd
			? {
					label: 'effective days to maturity',
					value: dtm.days,
					unit: 'days',
					formula: `degree days: Σ max(0, weekly mean − ${dtm.gdd.baseF} °F) = ${dtm.gdd.accumulated.toFixed(1)} ≥ ${dtm.gdd.required}`
				}
			: dtm.source === 'short_day'
				? {
						label: 'effective days to maturity',
						value: dtm.days,
						unit: 'days',
						formula: `${dtm.varietyDays} days of growth; days under ${dtm.thresholdHours + 2} h of daylight count for less, adding ${dtm.allowanceDays} (day length ${dtm.dayLengthHours.toFixed(2)} h at first harvest)`
					}
				: {
						label: 'effective days to maturity',
						value: dtm.days,
						unit: 'days',
						formula: `variety figure (day length ${dtm.dayLengthHours.toFixed(2)} h at first harvest)`
					},
		{
			label: 'first harvest',
			value: formatWeekDate(fromDayNumber(first)),
			formula: `${fieldLabel} + ${dtm.days} days`
		},
		{
			label: 'last harvest',
			value: formatWeekDate(fromDayNumber(last)),
			formula:
				picked < kept
					? `the first fall frost, ${picked} days into the harvest (a frost-tender crop is picked until then)`
					: kept === H
						? `first harvest + ${H} − 1 days`
						: `first harvest + ${kept} − 1 days (the harvest stops before its ${H}-day window ends)`
		}
	];
	if (tray !== null)
		explain.push({
			label: 'tray sowing',
			value: formatWeekDate(fromDayNumber(tray)),
			formula: `transplant date − ${v.daysInTray ?? 0} days in tray`
		});
	explain.push(
		{
			label: 'expected yield',
			value: expectedYield,
			formula: `${p.lengthFt} ft × ${v.yieldPerBedFoot} per bed-foot over the window`
		},
		{ label: 'weekly yield', value: weeklyYield, formula: `${expectedYield} ÷ (${v.harvestWindowDays} days ÷ 7)` },
		...explainSeed(seedInput)
	);
	out.explain = explain;
	return out;
}

/** A planting as the bed checks see it; bedless plantings are left out (nothing to overlap). */
export interface ConflictRow {
	id: number | string;
	bedId: number | string | null;
	startFt: number;
	lengthFt: number;
	fieldDate: string;
	lastHarvest: string;
}

/** Overlap and past-the-bed-end conflicts, keyed by planting id as a string. */
export function plantingConflicts(
	rows: ConflictRow[],
	beds: { id: number | string; lengthFt: number }[],
	turnaroundDays: number
): Map<string, BedConflict[]> {
	const bp: BedPlanting[] = [];
	for (const r of rows) {
		if (r.bedId === null) continue;
		bp.push({
			key: String(r.id),
			bedId: String(r.bedId),
			startFt: r.startFt,
			lengthFt: r.lengthFt,
			fieldDate: r.fieldDate,
			lastHarvest: r.lastHarvest
		});
	}
	const bedList: Bed[] = beds.map((b) => ({ id: String(b.id), lengthFt: b.lengthFt }));
	const out = new Map<string, BedConflict[]>();
	for (const c of checkBedConflicts(bp, bedList, turnaroundDays)) {
		const list = out.get(c.plantingKey) ?? [];
		list.push(c);
		out.set(c.plantingKey, list);
	}
	return out;
}
