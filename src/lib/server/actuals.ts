// Actual against plan for a season, from the harvest log, and the variety figures the owner
// may take over from it: recorded in variety_figure_changes, each one undoable.
import { actualsAgainstPlan, isoWeek, MIN_PLANTINGS_FOR_FIGURES, type ActualsResult } from '$lib/planning';
import { db } from './db';
import { farmToday } from './harvests';
import { livePlantings, loggedHarvests, plannedColumns, varietySupply, type PlannedRow } from './planned-rows';

export interface ResultNames {
	crops: Record<string, { name: string; family: string; unit: string }>;
	varieties: Record<string, { name: string; cropId: string; yieldPerBedFoot: number; daysToMaturity: number }>;
	plantings: Record<string, { bed: string | null; fieldDate: string; status: string }>;
}

export interface FigureChange {
	id: number;
	varietyId: number;
	variety: string;
	oldYield: number;
	newYield: number;
	oldDtm: number;
	newDtm: number;
	yieldPlantings: number;
	dtmPlantings: number;
	changedBy: string | null;
	changedAt: string;
	undoneAt: string | null;
}

export interface SeasonActuals {
	currentWeek: string;
	result: ActualsResult;
	names: ResultNames;
	changes: FigureChange[];
}

export async function seasonActuals(farmId: number, seasonId: number): Promise<SeasonActuals> {
	const today = await farmToday(farmId);
	const [plantings, harvests, varieties, changes] = await Promise.all([
		// A failed planting gave nothing by definition; the forecast page leaves it out too.
		livePlantings(farmId)
			.leftJoin('beds as b', 'b.id', 'p.bed_id')
			.where({ 'p.season_id': seasonId })
			.select<
				(PlannedRow & {
					variety_id: number;
					field_date: string;
					actual_field_date: string | null;
					actual_first_harvest: string | null;
					status: string;
					bed: string | null;
				})[]
			>(
				...plannedColumns,
				'p.variety_id',
				'p.field_date',
				'p.actual_field_date',
				'p.actual_first_harvest',
				'p.status',
				'b.name as bed'
			),
		loggedHarvests(farmId, seasonId)
			.whereNot('p.status', 'failed')
			.select<{ planting_id: number; harvested_on: string; quantity: string | number }[]>(
				'h.planting_id',
				'h.harvested_on',
				'h.quantity'
			),
		db()('varieties as v')
			.join('crops as c', 'c.id', 'v.crop_id')
			.where('v.farm_id', farmId)
			.select(
				'v.id',
				'v.name',
				'v.crop_id',
				'v.yield_per_bed_foot',
				'v.days_to_maturity',
				'c.name as crop',
				'c.family',
				'c.harvest_unit'
			),
		listChanges(farmId, seasonId)
	]);
	const result = actualsAgainstPlan({
		currentWeek: isoWeek(today),
		plantings: plantings.map((p) => {
			// The one planned supply (planned-supply.ts): the variety's current yield, window and curve,
			// as on the Forecast page, the crew sheets and the workbook.
			const { yieldPerBedFoot, harvestWindowDays, curve } = varietySupply(p);
			return {
				key: String(p.id),
				crop: String(p.crop_id),
				variety: String(p.variety_id),
				bedFeet: Number(p.length_ft),
				curve,
				windowDays: harvestWindowDays,
				yieldPerBedFoot,
				fieldDate: p.field_date,
				firstHarvest: p.first_harvest,
				lastHarvest: p.last_harvest,
				actualFieldDate: p.actual_field_date,
				actualFirstHarvest: p.actual_first_harvest,
				finished: p.status === 'finished'
			};
		}),
		harvests: harvests.map((h) => ({
			plantingKey: String(h.planting_id),
			date: h.harvested_on,
			quantity: Number(h.quantity)
		}))
	});
	const names: ResultNames = { crops: {}, varieties: {}, plantings: {} };
	for (const v of varieties) {
		names.crops[String(v.crop_id)] = { name: v.crop, family: v.family, unit: v.harvest_unit };
		names.varieties[String(v.id)] = {
			name: v.name,
			cropId: String(v.crop_id),
			yieldPerBedFoot: Number(v.yield_per_bed_foot),
			daysToMaturity: v.days_to_maturity
		};
	}
	for (const p of plantings) names.plantings[String(p.id)] = { bed: p.bed, fieldDate: p.field_date, status: p.status };
	return { currentWeek: isoWeek(today), result, names, changes };
}

async function listChanges(farmId: number, seasonId: number): Promise<FigureChange[]> {
	const rows = await db()('variety_figure_changes as f')
		.join('varieties as v', 'v.id', 'f.variety_id')
		.leftJoin('users as u', 'u.id', 'f.changed_by')
		.where({ 'f.farm_id': farmId, 'f.season_id': seasonId })
		.orderBy('f.id', 'desc')
		.select('f.*', 'v.name as variety', 'u.name as who');
	return rows.map((r) => ({
		id: r.id,
		varietyId: r.variety_id,
		variety: r.variety,
		oldYield: Number(r.old_yield_per_bed_foot),
		newYield: Number(r.new_yield_per_bed_foot),
		oldDtm: r.old_days_to_maturity,
		newDtm: r.new_days_to_maturity,
		yieldPlantings: r.yield_plantings,
		dtmPlantings: r.dtm_plantings,
		changedBy: r.who ?? null,
		changedAt: new Date(r.changed_at).toISOString(),
		undoneAt: r.undone_at ? new Date(r.undone_at).toISOString() : null
	}));
}

export type FigureResult = { ok: true; change: FigureChange } | { ok: false; status: 400 | 404 | 409; message: string };

/**
 * Takes a variety's observed figures from this season into the crop library. Only a figure
 * with at least MIN_PLANTINGS_FOR_FIGURES plantings behind it is taken; the other keeps its value.
 */
export async function useFigures(
	farmId: number,
	seasonId: number,
	varietyId: number,
	userId: string
): Promise<FigureResult> {
	const { result } = await seasonActuals(farmId, seasonId);
	const obs = result.varieties.find((v) => v.variety === String(varietyId));
	const yieldOk = !!obs && obs.yieldPlantings >= MIN_PLANTINGS_FOR_FIGURES && obs.observedYieldPerBedFoot !== null;
	const dtmOk =
		!!obs && obs.dtmPlantings >= MIN_PLANTINGS_FOR_FIGURES && obs.observedDtm !== null && obs.observedDtm > 0;
	const id = await db().transaction(async (trx) => {
		const v = await trx('varieties')
			.where({ id: varietyId, farm_id: farmId })
			.forUpdate()
			.first('yield_per_bed_foot', 'days_to_maturity');
		if (!v) return 'not_found' as const;
		if (!yieldOk && !dtmOk) return 'too_few' as const;
		// Three decimals, as the column keeps them.
		const newYield = yieldOk ? Math.round(obs!.observedYieldPerBedFoot! * 1000) / 1000 : Number(v.yield_per_bed_foot);
		const newDtm = dtmOk ? obs!.observedDtm! : v.days_to_maturity;
		await trx('varieties')
			.where({ id: varietyId, farm_id: farmId })
			.update({ yield_per_bed_foot: newYield, days_to_maturity: newDtm });
		const [cid] = await trx('variety_figure_changes').insert({
			farm_id: farmId,
			variety_id: varietyId,
			season_id: seasonId,
			old_yield_per_bed_foot: v.yield_per_bed_foot,
			new_yield_per_bed_foot: newYield,
			old_days_to_maturity: v.days_to_maturity,
			new_days_to_maturity: newDtm,
			yield_plantings: obs?.yieldPlantings ?? 0,
			dtm_plantings: obs?.dtmPlantings ?? 0,
			changed_by: userId
		});
		return cid as number;
	});
	if (id === 'not_found') return { ok: false, status: 404, message: 'No such variety on this farm.' };
	if (id === 'too_few')
		return {
			ok: false,
			status: 400,
			message: `Fewer than ${MIN_PLANTINGS_FOR_FIGURES} plantings stand behind this variety's figures this season.`
		};
	return { ok: true, change: (await listChanges(farmId, seasonId)).find((c) => c.id === id)! };
}

/** Puts a variety's figures back as they were before a change, unless it was edited since (409). */
export async function undoFigures(
	farmId: number,
	seasonId: number,
	changeId: number,
	userId: string
): Promise<FigureResult> {
	const out = await db().transaction(async (trx) => {
		const c = await trx('variety_figure_changes')
			.where({ id: changeId, farm_id: farmId, season_id: seasonId })
			.forUpdate()
			.first();
		if (!c) return { ok: false, status: 404, message: 'No such change of variety figures.' } as const;
		if (c.undone_at) return { ok: false, status: 409, message: 'This change was already undone.' } as const;
		const v = await trx('varieties')
			.where({ id: c.variety_id, farm_id: farmId })
			.forUpdate()
			.first('yield_per_bed_foot', 'days_to_maturity');
		if (
			!v ||
			Number(v.yield_per_bed_foot) !== Number(c.new_yield_per_bed_foot) ||
			v.days_to_maturity !== c.new_days_to_maturity
		) {
			return {
				ok: false,
				status: 409,
				message: 'The variety was changed since; edit it in the crop library instead.'
			} as const;
		}
		await trx('varieties')
			.where({ id: c.variety_id, farm_id: farmId })
			.update({ yield_per_bed_foot: c.old_yield_per_bed_foot, days_to_maturity: c.old_days_to_maturity });
		await trx('variety_figure_changes').where({ id: changeId }).update({ undone_at: trx.fn.now(), undone_by: userId });
		return { ok: true } as const;
	});
	if (!out.ok) return out;
	return { ok: true, change: (await listChanges(farmId, seasonId)).find((c) => c.id === changeId)! };
}

export interface VarietySeasonObserved {
	seasonId: number;
	season: string;
	yieldPlantings: number;
	observedYieldPerBedFoot: number | null;
	dtmPlantings: number;
	observedDtm: number | null;
}

/** A variety's observed figures in each season whose harvest log holds any of its plantings. */
export async function observedForVariety(farmId: number, varietyId: number): Promise<VarietySeasonObserved[]> {
	const seasons: { id: number; name: string }[] = await db()('seasons as s')
		.join('plantings as p', 'p.season_id', 's.id')
		.where({ 's.farm_id': farmId, 'p.variety_id': varietyId })
		.whereExists(db()('harvest_records as h').whereRaw('h.planting_id = p.id'))
		.distinct('s.id', 's.name', 's.year')
		.orderBy('s.year', 'desc');
	const out: VarietySeasonObserved[] = [];
	for (const s of seasons) {
		const { result } = await seasonActuals(farmId, s.id);
		const v = result.varieties.find((x) => x.variety === String(varietyId));
		if (v) out.push({ seasonId: s.id, season: s.name, ...v });
	}
	return out;
}
