// Who would cover each crop-week after an apply, for the plan preview: the planned plantings the
// preview proposes, the season's kept ones (sown, growing, harvested) and other seasons' plantings
// harvesting in the season's dates, each with its share of every week (planned-supply.ts), against
// the weekly targets the plan sizes for. The screen shows one succession's weeks from it
// (planning/cover.ts successionCover), so every share is worked out once, here. The preview's
// per-crop chart (supply now and after the apply, against demand) comes from the same planned supply.
import { deriveTargets, isoWeek, type ProposedPlanting } from '$lib/planning';
import type { CropCover } from '$lib/planning/cover';
import { curveOf } from './crops';
import { db } from './db';
import { targetInput } from './demand';
import { plannedCover, plannedSupply, type PlannedPlanting } from './planned-supply';
import type { CropBalance } from './plan-screen';
import type { Season } from './seasons';

/** A planting already in the ground (or another season's) named in a cover, by key `p{id}`. */
export interface PreviewCoverLabel {
	varietyId: number;
	bedId: number | null;
	startFt: number;
	fieldDate: string;
	/** The season's name when it is not this season. */
	otherSeason: string | null;
}

export interface PreviewCover {
	/** Per crop with a target or a planting; proposed plantings are keyed `n{index in plan.plantings}`. */
	crops: CropCover[];
	/** Crops sold from store: their shares are what the store gives. */
	stored: string[];
	labels: Record<string, PreviewCoverLabel>;
	/** Per crop with demand: the season's weeks with supply or demand, now and after the apply. */
	balance: CropBalance[];
}

interface Row {
	id: number;
	season_id: number;
	season_name: string;
	status: string;
	variety_id: number;
	crop_id: number;
	bed_id: number | null;
	start_ft: number | string;
	length_ft: number | string;
	field_date: string;
	first_harvest: string;
	last_harvest: string;
	yield_per_bed_foot: number | string;
	harvest_window_days: number;
	harvest_curve: string | null;
	crop_harvest_curve: string | null;
	harvest_cut_interval_days: number | null;
}

export const proposedKey = (index: number): string => `n${index}`;

export async function previewCover(
	farmId: number,
	season: Season,
	proposed: ProposedPlanting[]
): Promise<PreviewCover> {
	const [rows, input, crops] = await Promise.all([
		// Every planting harvesting in the season's dates, whatever its season; failed ones supply
		// nothing. After the apply, the season's planned ones give way to the proposal.
		db()('plantings as p')
			.join('varieties as v', 'v.id', 'p.variety_id')
			.join('crops as c', 'c.id', 'v.crop_id')
			.join('seasons as s', 's.id', 'p.season_id')
			.where({ 'p.farm_id': farmId })
			.whereNot('p.status', 'failed')
			.where('p.first_harvest', '<=', season.endsOn)
			.where('p.last_harvest', '>=', season.startsOn)
			.select<Row[]>(
				'p.id',
				'p.season_id',
				's.name as season_name',
				'p.status',
				'p.variety_id',
				'v.crop_id',
				'p.bed_id',
				'p.start_ft',
				'p.length_ft',
				'p.field_date',
				'p.first_harvest',
				'p.last_harvest',
				'v.yield_per_bed_foot',
				'v.harvest_window_days',
				'v.harvest_curve',
				'c.harvest_curve as crop_harvest_curve',
				'c.harvest_cut_interval_days'
			),
		targetInput(farmId, season.id),
		db()('crops as c')
			.where({ farm_id: farmId })
			.select<{ id: number; storage_weeks: number | null; storage_loss_per_week: unknown }[]>(
				'id',
				'storage_weeks',
				'storage_loss_per_week'
			)
	]);
	const varieties = await db()('varieties as v')
		.join('crops as c', 'c.id', 'v.crop_id')
		.where({ 'v.farm_id': farmId })
		.select<
			{
				id: number;
				yield_per_bed_foot: unknown;
				harvest_window_days: number;
				harvest_curve: string | null;
				crop_harvest_curve: string | null;
				harvest_cut_interval_days: number | null;
			}[]
		>(
			'v.id',
			'v.yield_per_bed_foot',
			'v.harvest_window_days',
			'v.harvest_curve',
			'c.harvest_curve as crop_harvest_curve',
			'c.harvest_cut_interval_days'
		);
	const varietyById = new Map(varieties.map((v) => [String(v.id), v]));
	const replaced = (r: Row): boolean => r.season_id === season.id && r.status === 'planned';
	const stays = rows.filter((r) => !replaced(r));
	const planned = (r: Row): PlannedPlanting & { key: string } => ({
		key: `p${r.id}`,
		crop: String(r.crop_id),
		firstHarvest: r.first_harvest,
		lastHarvest: r.last_harvest,
		lengthFt: Number(r.length_ft),
		yieldPerBedFoot: Number(r.yield_per_bed_foot),
		harvestWindowDays: Number(r.harvest_window_days),
		curve: curveOf(r.harvest_curve ?? r.crop_harvest_curve, r.harvest_cut_interval_days)
	});
	const plantings = stays.map(planned);
	proposed.forEach((p, i) => {
		const v = varietyById.get(String(p.varietyId));
		if (!v) return;
		plantings.push({
			key: proposedKey(i),
			crop: String(p.cropId),
			firstHarvest: p.firstHarvest,
			lastHarvest: p.lastHarvest,
			lengthFt: p.lengthFt,
			yieldPerBedFoot: Number(v.yield_per_bed_foot),
			harvestWindowDays: Number(v.harvest_window_days),
			curve: curveOf(v.harvest_curve ?? v.crop_harvest_curve, v.harvest_cut_interval_days)
		});
	});
	const stores = crops
		.filter((c) => Number(c.storage_weeks ?? 0) > 0)
		.map((c) => ({
			crop: String(c.id),
			keepWeeks: Number(c.storage_weeks),
			lossPerWeek: Number(c.storage_loss_per_week ?? 0)
		}));
	const targets = deriveTargets(input);
	return {
		crops: plannedCover(plantings, targets, stores),
		stored: stores.map((s) => s.crop),
		labels: Object.fromEntries(
			stays.map((r) => [
				`p${r.id}`,
				{
					varietyId: r.variety_id,
					bedId: r.bed_id,
					startFt: Number(r.start_ft),
					fieldDate: r.field_date,
					otherSeason: r.season_id === season.id ? null : r.season_name
				}
			])
		),
		balance: balanceOf(
			season,
			plannedSupply(rows.map(planned), targets, stores),
			plannedSupply(plantings, targets, stores)
		)
	};
}

/** Supply now and after the apply against demand, per crop with demand, over the season's weeks. */
function balanceOf(
	season: Season,
	before: ReturnType<typeof plannedSupply>,
	after: ReturnType<typeof plannedSupply>
): CropBalance[] {
	const first = isoWeek(season.startsOn);
	const last = isoWeek(season.endsOn);
	const byCrop = new Map<number, Map<string, { demand: number; before: number; after: number }>>();
	const cell = (crop: string, week: string) => {
		const c = Number(crop);
		const m = byCrop.get(c) ?? byCrop.set(c, new Map()).get(c)!;
		return m.get(week) ?? m.set(week, { demand: 0, before: 0, after: 0 }).get(week)!;
	};
	for (const r of before)
		if (r.week >= first && r.week <= last) Object.assign(cell(r.crop, r.week), { demand: r.demand, before: r.supply });
	for (const r of after)
		if (r.week >= first && r.week <= last) Object.assign(cell(r.crop, r.week), { demand: r.demand, after: r.supply });
	return [...byCrop.entries()]
		.filter(([, weeks]) => [...weeks.values()].some((w) => w.demand > 0))
		.map(([cropId, weeks]) => {
			const list = [...weeks.keys()].sort();
			return {
				cropId,
				weeks: list,
				demand: list.map((w) => weeks.get(w)!.demand),
				before: list.map((w) => weeks.get(w)!.before),
				after: list.map((w) => weeks.get(w)!.after)
			};
		})
		.sort((a, b) => a.cropId - b.cropId);
}
