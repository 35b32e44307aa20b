// Plan generation for a season: gathers the farm's data, runs the engine, and writes the result.
// Preview never writes; apply replaces the season's still-planned plantings in one transaction
// and keeps every planting that is already sown, growing, harvested or failed.
import { deriveTargetsWithNotes, planSeason, type KeptPlanting, type SeasonPlan, type SeasonVariety } from '$lib/planning';
import type { PlanRequest } from '$lib/schemas/plan';
import { todayIn } from '$lib/today';
import { db } from './db';
import * as farms from './farms';
import * as beds from './beds';
import { listVarieties, type VarietyView } from './crops';
import { targetInput } from './demand';

function engineVariety(v: VarietyView): SeasonVariety {
	return {
		id: String(v.id),
		cropId: String(v.cropId),
		name: v.name,
		crop: v.crop,
		family: v.family,
		method: v.method,
		daysToMaturity: v.daysToMaturity,
		daysInTray: v.daysInTray,
		harvestWindowDays: v.harvestWindowDays,
		yieldPerBedFoot: v.yieldPerBedFoot,
		rows: v.rows,
		inRowSpacingIn: v.inRowSpacingIn,
		seedsPerSpot: v.seedsPerSpot,
		germinationRate: v.germinationRate,
		seedsPerGram: v.seedsPerGram,
		cellsPerTray: v.cellsPerTray,
		frostTender: v.frostTolerance === 'tender',
		heatLimitF: v.heatLimitF ?? undefined,
		baseTempF: v.baseTempF,
		gddToMaturity: v.gddToMaturity ?? undefined,
		seedPriceCentsPerGram: v.seedPriceCentsPerGram,
		seedsPerPacket: v.seedsPerPacket ?? undefined,
		margin: v.margin
	};
}

export interface PlanPreview {
	plan: SeasonPlan;
	/** Planted rows the plan keeps, and planned rows it would replace. */
	kept: number;
	replaced: number;
	names: { crops: Record<string, string>; varieties: Record<string, string>; beds: Record<string, string> };
}

export async function preview(farmId: number, seasonId: number, request: PlanRequest): Promise<PlanPreview> {
	const [farm, temps, varieties, bedList, demand, existing] = await Promise.all([
		farms.get(farmId),
		farms.weeklyTemps(farmId),
		listVarieties(farmId),
		beds.list(farmId),
		targetInput(farmId, seasonId),
		db()('plantings as p')
			.join('varieties as v', 'v.id', 'p.variety_id')
			.join('crops as c', 'c.id', 'v.crop_id')
			.where({ 'p.farm_id': farmId, 'p.season_id': seasonId })
			.select('p.id', 'p.status', 'p.bed_id', 'p.start_ft', 'p.length_ft', 'p.field_date', 'p.first_harvest', 'p.last_harvest', 'v.crop_id', 'v.yield_per_bed_foot', 'c.family')
	]);
	const { targets, notes } = deriveTargetsWithNotes(demand);
	const keptRows = existing.filter((p) => p.status !== 'planned');
	const kept: KeptPlanting[] = keptRows
		.filter((p) => p.status !== 'failed')
		.map((p) => ({
			key: `planting#${p.id}`,
			cropId: String(p.crop_id),
			family: p.family,
			bedId: p.bed_id === null ? null : String(p.bed_id),
			startFt: Number(p.start_ft),
			lengthFt: Number(p.length_ft),
			fieldDate: p.field_date,
			firstHarvest: p.first_harvest,
			lastHarvest: p.last_harvest,
			yieldPerBedFoot: Number(p.yield_per_bed_foot)
		}));
	const plan = planSeason({
		farm: {
			lastSpringFrost: farm.lastSpringFrost,
			firstFallFrost: farm.firstFallFrost,
			latitude: farm.latitude,
			weeklyMeanTempF: Object.fromEntries(Object.entries(temps).map(([w, t]) => [`W${String(w).padStart(2, '0')}`, t]))
		},
		varieties: varieties.map(engineVariety),
		beds: bedList.map((b) => ({ id: String(b.id), lengthFt: b.lengthFt, blockId: String(b.blockId) })),
		targets,
		kept,
		varietyPlan: request.varietyPlan
			? Object.fromEntries(Object.entries(request.varietyPlan).map(([crop, shares]) => [crop, shares.map((s) => ({ ...s, varietyId: String(s.varietyId) }))]))
			: undefined,
		options: {
			intervalWeeks: request.intervalWeeks,
			margin: request.margin,
			bedFootIncrement: farm.bedFootIncrement,
			turnaroundDays: farm.turnaroundDays,
			today: todayIn(farm.timeZone)
		}
	});
	for (const n of notes) plan.warnings.push({ code: 'unreachable_week', message: n.message });
	return {
		plan,
		kept: keptRows.length,
		replaced: existing.length - keptRows.length,
		names: {
			crops: Object.fromEntries(varieties.map((v) => [String(v.cropId), v.crop])),
			varieties: Object.fromEntries(varieties.map((v) => [String(v.id), v.name])),
			beds: Object.fromEntries(bedList.map((b) => [String(b.id), `${b.blockName} · ${b.name}`]))
		}
	};
}

export interface ApplyResult {
	kept: number;
	removed: number;
	added: number;
	unplaced: number;
}

export async function apply(farmId: number, seasonId: number, userId: string, request: PlanRequest): Promise<ApplyResult & { preview: PlanPreview }> {
	const result = await preview(farmId, seasonId, request);
	return db().transaction(async (trx) => {
		// Lock the season's plantings: a concurrent edit waits, and the counts below stay true.
		const rows: { id: number; status: string }[] = await trx('plantings').where({ farm_id: farmId, season_id: seasonId }).forUpdate().select('id', 'status');
		const plannedIds = rows.filter((r) => r.status === 'planned').map((r) => r.id);
		if (plannedIds.length) await trx('plantings').whereIn('id', plannedIds).delete();
		const inserts = result.plan.plantings.map((p) => ({
			farm_id: farmId,
			season_id: seasonId,
			variety_id: Number(p.varietyId),
			bed_id: p.bedId === null ? null : Number(p.bedId),
			start_ft: p.startFt,
			length_ft: p.lengthFt,
			rows: p.rows,
			in_row_spacing_in: p.inRowSpacingIn,
			seeds_per_spot: p.seedsPerSpot,
			method: p.method,
			tray_sow_date: p.traySowDate,
			field_date: p.fieldDate,
			first_harvest: p.firstHarvest,
			last_harvest: p.lastHarvest,
			expected_yield: p.expectedYield,
			seeds_needed: p.seed.seeds,
			status: 'planned',
			notes: p.unplacedReason ? `Not placed: ${p.unplacedReason}` : null,
			updated_by: userId
		}));
		for (let i = 0; i < inserts.length; i += 500) await trx('plantings').insert(inserts.slice(i, i + 500));
		return {
			kept: rows.length - plannedIds.length,
			removed: plannedIds.length,
			added: inserts.length,
			unplaced: result.plan.plantings.filter((p) => p.bedId === null).length,
			preview: result
		};
	});
}
