// Plan generation for a season: gathers the farm's data, runs the engine, and writes the result.
// Preview never writes; apply replaces the season's still-planned plantings in one transaction
// and keeps every planting that is already sown, growing, harvested or failed.
import { deriveTargetsWithNotes, planSeason, type KeptPlanting, type SeasonPlan } from '$lib/planning';
import { engineFarm, toEngineVariety } from '$lib/engine-inputs';
import { plantingRow } from '$lib/planting-row';
import type { PlanRequest } from '$lib/schemas/plan';
import { todayIn } from '$lib/today';
import { previousFamiliesByBed, seasonPlanOptions } from '$lib/plan-options';
import type { Knex } from 'knex';
import { db } from './db';
import * as farms from './farms';
import * as beds from './beds';
import { listVarieties } from './crops';
import { targetInput } from './demand';
import { demandHash, type Season } from './seasons';
import { bedHolders } from './bed-holders';
import { lockForApply, recordApply, snapshotPlanned } from './plan-history';
import { insertPlantings, plantingsWithCrop } from './planting-query';

export interface PlanPreview {
	plan: SeasonPlan;
	/** Planted rows the plan keeps, and planned rows it would replace. */
	kept: number;
	replaced: number;
	names: { crops: Record<string, string>; varieties: Record<string, string>; beds: Record<string, string> };
}

type ExistingPlanting = {
	id: number;
	status: string;
	variety_id: number;
	bed_id: number | null;
	start_ft: number;
	length_ft: number;
	field_date: string;
	first_harvest: string;
	last_harvest: string;
	crop_id: number;
	yield_per_bed_foot: number;
	family: string;
};

function seasonPlantings(
	executor: Knex | Knex.Transaction,
	farmId: number,
	seasonId: number
): Promise<ExistingPlanting[]> {
	return plantingsWithCrop(executor)
		.where({ 'p.farm_id': farmId, 'p.season_id': seasonId })
		.select(
			'p.id',
			'p.status',
			'p.variety_id',
			'p.bed_id',
			'p.start_ft',
			'p.length_ft',
			'p.field_date',
			'p.first_harvest',
			'p.last_harvest',
			'v.crop_id',
			'v.yield_per_bed_foot',
			'c.family'
		);
}

/** Everything the engine needs except the season's own plantings. */
async function gatherInputs(farmId: number, season: Season) {
	const seasonId = season.id;
	const farm = await farms.get(farmId);
	const lookBack = `${Number(season.startsOn.slice(0, 4)) - farm.rotationYears}${season.startsOn.slice(4)}`;
	const [temps, varieties, bedList, demand, obstacles, otherSeasons, earlierInBeds] = await Promise.all([
		farms.weeklyTemps(farmId),
		listVarieties(farmId),
		beds.list(farmId),
		targetInput(farmId, seasonId),
		// Other seasons' plantings in the beds while this season runs (the fall's garlic, dug next summer).
		bedHolders(farmId, season.startsOn, season.endsOn, farm.turnaroundDays, seasonId),
		// Other seasons' plantings harvesting in this season's dates: they supply its weeks too.
		db()('plantings as p')
			.join('varieties as v', 'v.id', 'p.variety_id')
			.where({ 'p.farm_id': farmId })
			.whereNot('p.season_id', seasonId)
			.whereNot('p.status', 'failed')
			.where('p.first_harvest', '<=', season.endsOn)
			.where('p.last_harvest', '>=', season.startsOn)
			.select('p.id', 'p.variety_id', 'p.length_ft', 'p.field_date', 'p.first_harvest', 'p.last_harvest'),
		// What each bed held in the years before the season, for rotation.
		plantingsWithCrop()
			.where({ 'p.farm_id': farmId })
			.whereNot('p.season_id', seasonId)
			.whereNotNull('p.bed_id')
			.whereNot('p.status', 'failed')
			.where('p.field_date', '<', season.startsOn)
			.where('p.field_date', '>=', lookBack)
			.select<{ bed_id: number; family: string; field_date: string }[]>('p.bed_id', 'c.family', 'p.field_date')
	]);
	const previousFamilyByBed = previousFamiliesByBed(
		earlierInBeds.map((p) => ({ bedId: String(p.bed_id), family: p.family, fieldDate: p.field_date })),
		season.startsOn,
		farm.rotationYears
	);
	return { farm, temps, varieties, bedList, demand, obstacles, otherSeasons, previousFamilyByBed, season };
}

/** Runs the engine over the season as it stands; writes nothing. */
export async function preview(farmId: number, season: Season, request: PlanRequest): Promise<PlanPreview> {
	const [inputs, existing] = await Promise.all([
		gatherInputs(farmId, season),
		seasonPlantings(db(), farmId, season.id)
	]);
	return planFrom(inputs, existing, request);
}

function planFrom(
	inputs: Awaited<ReturnType<typeof gatherInputs>>,
	existing: ExistingPlanting[],
	request: PlanRequest
): PlanPreview {
	const { farm, temps, varieties, bedList, demand, obstacles, otherSeasons, previousFamilyByBed, season } = inputs;
	const engineVarieties = new Map(varieties.map((v) => [String(v.id), toEngineVariety(v)]));
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
			yieldPerBedFoot: Number(p.yield_per_bed_foot),
			curve: engineVarieties.get(String(p.variety_id))?.harvestCurve,
			windowDays: engineVarieties.get(String(p.variety_id))?.harvestWindowDays
		}));
	// Supply only: their bed-feet are already worked around as obstacles.
	for (const p of otherSeasons) {
		const v = engineVarieties.get(String(p.variety_id));
		if (!v) continue;
		kept.push({
			key: `planting#${p.id}`,
			cropId: v.cropId,
			family: v.family,
			bedId: null,
			startFt: 0,
			lengthFt: Number(p.length_ft),
			fieldDate: p.field_date,
			firstHarvest: p.first_harvest,
			lastHarvest: p.last_harvest,
			yieldPerBedFoot: v.yieldPerBedFoot,
			curve: v.harvestCurve,
			windowDays: v.harvestWindowDays
		});
	}
	const plan = planSeason({
		farm: engineFarm(farm, temps),
		// Archived varieties keep their plantings (kept ones still use their curves above) but are offered to no new plan.
		varieties: varieties.filter((v) => !v.archived).map((v) => engineVarieties.get(String(v.id))!),
		beds: bedList.map((b) => ({ id: String(b.id), lengthFt: b.lengthFt, blockId: String(b.blockId) })),
		targets,
		kept,
		obstacles,
		varietyPlan: request.varietyPlan
			? Object.fromEntries(
					Object.entries(request.varietyPlan).map(([crop, shares]) => [
						crop,
						shares.map((s) => ({ ...s, varietyId: String(s.varietyId) }))
					])
				)
			: undefined,
		previousFamilyByBed,
		// The same options the demo seed plans with (plan-options.ts).
		options: seasonPlanOptions(farm, request, todayIn(farm.timeZone), Number(season.startsOn.slice(0, 4)))
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

/**
 * `expected` is the fingerprint of the preview the owner looked at: when given, the apply is
 * refused (PlanConflictError) if the season moved on since. Without it, the plan is computed from the
 * season as it stands under the lock, so whatever committed before is kept, and nothing is planted
 * twice. The replaced plantings are kept for undo.
 */
export async function apply(
	farmId: number,
	season: Season,
	userId: string,
	request: PlanRequest,
	expected?: string
): Promise<ApplyResult & { preview: PlanPreview }> {
	const seasonId = season.id;
	// Farm, varieties, beds and demand are read first, outside the lock: holding it while waiting for
	// more pool connections could starve the edits queued behind it.
	const [inputs, demandDigest] = await Promise.all([gatherInputs(farmId, season), demandHash(farmId, seasonId)]);
	return db().transaction(async (trx) => {
		// One lock for computing and writing: the season row (a second apply, and every planting edit, which
		// shares it, waits here), then the season's plantings, planned from as read under the lock. A status
		// change that committed first is seen (its planting is kept, not planned again); a later one waits,
		// then finds its planned row replaced. Planning from rows read before the lock could plant a kept
		// planting twice.
		await lockForApply(trx, farmId, seasonId, expected, demandDigest);
		const rows: { id: number; status: string }[] = await trx('plantings')
			.where({ farm_id: farmId, season_id: seasonId })
			.forUpdate()
			.select('id', 'status');
		const result = planFrom(inputs, await seasonPlantings(trx, farmId, seasonId), request);
		const plannedIds = rows.filter((r) => r.status === 'planned').map((r) => r.id);
		const replaced = await snapshotPlanned(trx, plannedIds);
		if (plannedIds.length) await trx('plantings').whereIn('id', plannedIds).delete();
		const inserts = result.plan.plantings.map((p) =>
			plantingRow(p, {
				farmId,
				seasonId,
				varietyId: Number(p.varietyId),
				bedId: p.bedId === null ? null : Number(p.bedId),
				updatedBy: userId
			})
		);
		await insertPlantings(trx, inserts);
		await recordApply(trx, { farmId, seasonId, userId, options: request, replaced, demandDigest });
		return {
			kept: rows.length - plannedIds.length,
			removed: plannedIds.length,
			added: inserts.length,
			unplaced: result.plan.plantings.filter((p) => p.bedId === null).length,
			preview: result
		};
	});
}
