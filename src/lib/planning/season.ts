/**
 * A whole season in one call: weekly targets per crop, less what kept plantings already
 * supply, become successions per variety, placed into beds around the kept plantings.
 * The server's plan preview and the demo seed both plan through here.
 */
import type { Bed, BedPlanting } from './bed-types';
import { forecast } from './forecast';
import { placePlantings } from './placement';
import { seedNeed, type SeedNeed } from './seed';
import { planSuccessions, type Farm, type PlanOptions } from './successions';
import type { CropWeekQuantity, PlanningWarning, SowingMethod, Variety } from './types';

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
	const planned = new Map<string, { variety: SeasonVariety; s: ReturnType<typeof planSuccessions>['successions'][number] }>();

	for (const [cropId, cropTargets] of targetsByCrop) {
		const shares: VarietyShare[] = input.varietyPlan?.[cropId] ?? byCrop.get(cropId)?.slice(0, 1).map((v) => ({ varietyId: v.id })) ?? [];
		if (shares.length === 0) {
			warnings.push({ code: 'no_variety', cropId, message: `No variety of this crop is in the library, so its targets cannot be planned.`, weeks: cropTargets.map((t) => t.week) });
			shortfall.push(...cropTargets);
			continue;
		}
		for (const share of shares) {
			const variety = varietyById.get(share.varietyId);
			if (!variety || variety.cropId !== cropId) {
				warnings.push({ code: 'no_variety', cropId, message: `Variety ${share.varietyId} is not a variety of this crop; its share of the targets is left unplanned.` });
				continue;
			}
			const weekly = cropTargets
				.filter((t) => weekNumber(t.week) >= (share.fromWeek ?? 1) && weekNumber(t.week) <= (share.toWeek ?? 53))
				.map((t) => ({ week: t.week, quantity: t.quantity * (share.fraction ?? 1) }));
			if (weekly.length === 0) continue;
			const result = planSuccessions({ variety, targets: weekly, farm: input.farm, options: { ...input.options, keyPrefix: `${variety.id}@w${share.fromWeek ?? 1}` } });
			for (const s of result.successions) planned.set(s.key, { variety, s });
			for (const w of result.warnings) warnings.push({ ...w, cropId });
			shortfall.push(...result.shortfall.map((q) => ({ crop: cropId, week: q.week, quantity: q.quantity })));
		}
	}

	const fixed: BedPlanting[] = kept
		.filter((k): k is KeptPlanting & { bedId: string } => k.bedId !== null)
		.map((k) => ({ key: k.key, bedId: k.bedId, startFt: k.startFt, lengthFt: k.lengthFt, fieldDate: k.fieldDate, lastHarvest: k.lastHarvest, family: k.family }));
	const placement = placePlantings(
		[...planned.values()].map(({ s, variety }) => ({ key: s.key, bedFeet: s.bedFeet, fieldDate: s.fieldDate, lastHarvest: s.lastHarvest, family: variety.family })),
		input.beds,
		{ turnaroundDays: input.options?.turnaroundDays, fixed, previousFamilyByBed: input.previousFamilyByBed }
	);
	const notesByKey = new Map<string, PlanningWarning[]>();
	for (const n of placement.warnings) (notesByKey.get(n.plantingKey) ?? notesByKey.set(n.plantingKey, []).get(n.plantingKey)!).push({ code: n.code, message: n.message });

	const proposal = (key: string, bedId: string | null, startFt: number, lengthFt: number, unplacedReason: string | null, piece: number): ProposedPlanting => {
		const { s, variety: v } = planned.get(key)!;
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
			traySowDate: s.traySowDate ?? null,
			fieldDate: s.fieldDate,
			firstHarvest: s.firstHarvest,
			lastHarvest: s.lastHarvest,
			expectedYield: Math.round(lengthFt * v.yieldPerBedFoot * 100) / 100,
			// Seed for this piece of bed: a planting split over two beds needs seed for each.
			seed: seedNeed({
				method: v.method, bedFeet: lengthFt, rows: v.rows, inRowSpacingIn: v.inRowSpacingIn, seedsPerSpot: v.seedsPerSpot,
				germinationRate: v.germinationRate, seedsPerGram: v.seedsPerGram, margin: v.margin ?? input.options?.seedMargin ?? 0.1,
				cellsPerTray: v.cellsPerTray, seedPriceCentsPerGram: v.seedPriceCentsPerGram, seedsPerPacket: v.seedsPerPacket
			}),
			warnings: [...s.warnings, ...(notesByKey.get(key) ?? [])],
			unplacedReason
		};
	};
	const pieces = new Map<string, number>();
	const plantings = [
		...placement.placed.map((p) => {
			const n = pieces.get(p.plantingKey) ?? 0;
			pieces.set(p.plantingKey, n + 1);
			return proposal(p.plantingKey, p.bedId, p.startFt, p.lengthFt, null, n);
		}),
		...placement.unplaced.map((u) => proposal(u.plantingKey, null, 0, planned.get(u.plantingKey)!.s.bedFeet, u.reason, 0))
	].sort((a, b) => (a.fieldDate < b.fieldDate ? -1 : a.fieldDate > b.fieldDate ? 1 : a.key < b.key ? -1 : 1));
	for (const u of placement.unplaced) warnings.push({ code: 'not_placed', key: u.plantingKey, message: `Not placed: ${u.reason}` });
	return { plantings, shortfall, warnings };
}
