/**
 * A whole season in one call: weekly targets per crop, less what kept plantings already
 * supply, become successions per variety, placed into beds around the kept plantings.
 * The server's plan preview and the demo seed both plan through here.
 */
import type { Bed, BedPlanting } from './bed-types';
import { forecast } from './forecast';
import { placeIndexed, type PlacementRequest } from './placement';
import { inPlanOrder } from './season-order';
import { seedNeed, type SeedNeed } from './seed';
import { fromDayNumber } from './day-number';
import { planSuccessionRuns, type Farm, type PlanOptions } from './successions';
import type { CropWeekQuantity, PlanningWarning, SowingMethod, Variety } from './types';
import { makeTempLookup } from './weekly-temps';

export interface SeasonVariety extends Variety {
	id: string;
	cropId: string;
}

/** A share of a crop's targets given to one variety: weeks of the year from..to, a fraction of each. */
export interface VarietyShare {
	varietyId: string;
	fromWeek?: number;
	toWeek?: number;
	fraction?: number;
}

/** A planting the plan keeps as it is (sown, growing, or planned elsewhere): it supplies and occupies. */
export interface KeptPlanting {
	key: string;
	cropId: string;
	family?: string;
	bedId: string | null;
	startFt: number;
	lengthFt: number;
	fieldDate: string;
	firstHarvest: string;
	lastHarvest: string;
	yieldPerBedFoot: number;
}

export interface SeasonPlanInput {
	farm: Farm;
	varieties: SeasonVariety[];
	beds: Bed[];
	/** Weekly targets, `crop` being the crop id. */
	targets: CropWeekQuantity[];
	kept?: KeptPlanting[];
	/** Which varieties carry each crop's targets (by crop id); default: the crop's first variety. */
	varietyPlan?: Record<string, VarietyShare[]>;
	previousFamilyByBed?: Record<string, string[]>;
	options?: PlanOptions & { turnaroundDays?: number };
}

export interface ProposedPlanting {
	key: string;
	cropId: string;
	varietyId: string;
	bedId: string | null;
	startFt: number;
	lengthFt: number;
	rows: number;
	inRowSpacingIn: number;
	seedsPerSpot: number;
	method: SowingMethod;
	traySowDate: string | null;
	fieldDate: string;
	firstHarvest: string;
	lastHarvest: string;
	/** Harvest units over the whole window for this range. */
	expectedYield: number;
	seed: SeedNeed;
	warnings: PlanningWarning[];
	/** Why it has no bed, when it has none. */
	unplacedReason: string | null;
}

export interface SeasonPlan {
	plantings: ProposedPlanting[];
	/** Target left unmet per crop id and week after planning. */
	shortfall: CropWeekQuantity[];
	warnings: (PlanningWarning & { key?: string; cropId?: string })[];
}

function weekNumber(week: string): number {
	return Number(week.slice(6));
}

/** Targets still to plan for: the targets less what the kept plantings supply each week. */
function remainingTargets(targets: CropWeekQuantity[], kept: KeptPlanting[]): CropWeekQuantity[] {
	if (kept.length === 0) return targets;
	const rows = forecast(
		kept.map((k) => ({ crop: k.cropId, firstHarvest: k.firstHarvest, lastHarvest: k.lastHarvest, bedFeet: k.lengthFt, yieldPerBedFoot: k.yieldPerBedFoot })),
		targets
	);
	return rows.filter((r) => r.shortfall > 1e-9).map((r) => ({ crop: r.crop, week: r.week, quantity: r.shortfall }));
}

/**
 * What the season keeps of a succession: its placement request and what the proposal
 * needs, no more, as everything else kept alive through placement is copied by the
 * garbage collector, which at thousands of plantings made planning superlinear.
 */
interface PlannedSuccession {
	variety: SeasonVariety;
	req: PlacementRequest;
	firstHarvest: string;
	traySowDate: string | null;
	warnings: PlanningWarning[];
}

export function planSeason(input: SeasonPlanInput): SeasonPlan {
	const kept = input.kept ?? [];
	const varietyById = new Map(input.varieties.map((v) => [v.id, v]));
	const byCrop = new Map<string, SeasonVariety[]>();
	for (const v of input.varieties) (byCrop.get(v.cropId) ?? byCrop.set(v.cropId, []).get(v.cropId)!).push(v);

	const targets = remainingTargets(input.targets, kept);
	const targetsByCrop = new Map<string, CropWeekQuantity[]>();
	for (const t of targets) (targetsByCrop.get(t.crop) ?? targetsByCrop.set(t.crop, []).get(t.crop)!).push(t);

	const warnings: SeasonPlan['warnings'] = [];
	const shortfall: CropWeekQuantity[] = [];
	const planned = new Map<string, PlannedSuccession>();
	// One temperature lookup for the farm, shared by every variety's planning.
	const temps = input.farm?.weeklyMeanTempF ? makeTempLookup(input.farm.weeklyMeanTempF) : undefined;

	for (const [cropId, cropTargets] of targetsByCrop) {
		const planShares = input.varietyPlan?.[cropId];
		const shares: VarietyShare[] = planShares ?? byCrop.get(cropId)?.slice(0, 1).map((v) => ({ varietyId: v.id })) ?? [];
		if (shares.length === 0) {
			const message = planShares ? 'The variety plan gives this crop no variety, so its targets cannot be planned.' : 'No variety of this crop is in the library, so its targets cannot be planned.';
			warnings.push({ code: 'no_variety', cropId, message, weeks: cropTargets.map((t) => t.week) });
			shortfall.push(...cropTargets);
			continue;
		}
		// How much of each week's target the valid shares carry; what no share carries is shortfall.
		const carried = new Map<string, number>();
		const prefixes = new Set<string>();
		shares.forEach((share, i) => {
			const variety = varietyById.get(share.varietyId);
			if (!variety || variety.cropId !== cropId) {
				warnings.push({ code: 'no_variety', cropId, message: `Variety ${share.varietyId} is not a variety of this crop; its share of the targets is left unplanned.` });
				return;
			}
			const fraction = share.fraction ?? 1;
			const weekly: { week: string; quantity: number }[] = [];
			for (const t of cropTargets) {
				const n = weekNumber(t.week);
				if (n < (share.fromWeek ?? 1) || n > (share.toWeek ?? 53)) continue;
				weekly.push({ week: t.week, quantity: t.quantity * fraction });
				carried.set(t.week, (carried.get(t.week) ?? 0) + fraction);
			}
			if (weekly.length === 0) return;
			// Two shares of one variety from the same week would otherwise plan under the same keys.
			let keyPrefix = `${variety.id}@w${share.fromWeek ?? 1}`;
			if (prefixes.has(keyPrefix)) keyPrefix += `.${i + 1}`;
			prefixes.add(keyPrefix);
			const result = planSuccessionRuns({ variety, targets: weekly, farm: input.farm, options: { ...input.options, keyPrefix } }, temps);
			for (const r of result.runs) {
				const req = { key: r.key, bedFeet: r.bedFeet, fieldDate: fromDayNumber(r.fieldDay), lastHarvest: fromDayNumber(r.lastHarvest), family: variety.family };
				const traySowDate = r.trayDay === undefined ? null : fromDayNumber(r.trayDay);
				planned.set(r.key, { variety, req, firstHarvest: fromDayNumber(r.start), traySowDate, warnings: r.warnings });
			}
			for (const w of result.warnings) warnings.push({ ...w, cropId });
			shortfall.push(...result.shortfall.map((q) => ({ crop: cropId, week: q.week, quantity: q.quantity })));
		});
		const uncarried = cropTargets
			.map((t) => ({ crop: cropId, week: t.week, quantity: t.quantity * Math.max(0, 1 - (carried.get(t.week) ?? 0)) }))
			.filter((t) => t.quantity > 1e-9);
		if (uncarried.length) {
			warnings.push({ code: 'no_variety', cropId, message: `The variety plan leaves part of the target in ${uncarried.map((t) => t.week).join(', ')} to no variety.`, weeks: uncarried.map((t) => t.week) });
			shortfall.push(...uncarried);
		}
	}

	const fixed: BedPlanting[] = kept
		.filter((k): k is KeptPlanting & { bedId: string } => k.bedId !== null)
		.map((k) => ({ key: k.key, bedId: k.bedId, startFt: k.startFt, lengthFt: k.lengthFt, fieldDate: k.fieldDate, lastHarvest: k.lastHarvest, family: k.family }));
	const records = [...planned.values()];
	const { result: placement, placedFrom, unplacedFrom } = placeIndexed(
		records.map((p) => p.req),
		input.beds,
		{ turnaroundDays: input.options?.turnaroundDays, fixed, previousFamilyByBed: input.previousFamilyByBed }
	);
	const notesByKey = new Map<string, PlanningWarning[]>();
	for (const n of placement.warnings) {
		// Notes about kept plantings (e.g. one naming an unknown bed) belong to the season's warnings.
		if (!planned.has(n.plantingKey)) warnings.push({ code: n.code, key: n.plantingKey, message: n.message });
		else (notesByKey.get(n.plantingKey) ?? notesByKey.set(n.plantingKey, []).get(n.plantingKey)!).push({ code: n.code, message: n.message });
	}

	const proposal = (from: number, bedId: string | null, startFt: number, lengthFt: number, unplacedReason: string | null, piece: number): ProposedPlanting => {
		const { req, variety: v, firstHarvest, traySowDate, warnings: own } = records[from];
		const key = req.key;
		return {
			key: piece === 0 ? key : `${key}/${piece + 1}`,
			cropId: v.cropId,
			varietyId: v.id,
			bedId,
			startFt,
			lengthFt,
			rows: v.rows,
			inRowSpacingIn: v.inRowSpacingIn,
			seedsPerSpot: v.seedsPerSpot,
			method: v.method,
			traySowDate,
			fieldDate: req.fieldDate,
			firstHarvest,
			lastHarvest: req.lastHarvest,
			expectedYield: Math.round(lengthFt * v.yieldPerBedFoot * 100) / 100,
			// Seed for this piece of bed: a planting split over two beds needs seed for each.
			seed: seedNeed({
				method: v.method, bedFeet: lengthFt, rows: v.rows, inRowSpacingIn: v.inRowSpacingIn, seedsPerSpot: v.seedsPerSpot,
				germinationRate: v.germinationRate, seedsPerGram: v.seedsPerGram, margin: v.margin ?? input.options?.seedMargin ?? 0.1,
				cellsPerTray: v.cellsPerTray, seedPriceCentsPerGram: v.seedPriceCentsPerGram, seedsPerPacket: v.seedsPerPacket
			}),
			// Most plantings carry no placement note: share their own list rather than copy it.
			warnings: notesByKey.has(key) ? [...own, ...notesByKey.get(key)!] : own,
			unplacedReason
		};
	};
	// A planting's pieces come one after another in `placed`, so counting runs numbers them.
	let piece = 0;
	const plantings = inPlanOrder(
		placement.placed.map((p, i) => {
			piece = i > 0 && placedFrom[i - 1] === placedFrom[i] ? piece + 1 : 0;
			return proposal(placedFrom[i], p.bedId, p.startFt, p.lengthFt, null, piece);
		}),
		placement.unplaced.map((u, i) => proposal(unplacedFrom[i], null, 0, records[unplacedFrom[i]].req.bedFeet, u.reason, 0))
	);
	for (const u of placement.unplaced) warnings.push({ code: 'not_placed', key: u.plantingKey, message: `Not placed: ${u.reason}` });
	return { plantings, shortfall, warnings };
}
