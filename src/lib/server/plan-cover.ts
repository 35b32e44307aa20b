// Who would cover each crop-week after an apply, for the plan preview: the planned plantings the
// preview proposes, the season's kept ones (sown, growing, harvested) and other seasons' plantings
// harvesting in the season's dates, each with its share of every week (planned-supply.ts), against
// the weekly targets the plan sizes for. The screen shows one succession's weeks from it
// (planning/cover.ts successionCover), so every share is worked out once, here. The preview's
// per-crop chart (supply now and after the apply, against demand) comes from the same planned supply.
import { deriveTargets, isoWeek, type ProposedPlanting } from '$lib/planning';
import type { CropCover } from '$lib/planning/cover';
import {
	cropStores,
	livePlantings,
	plannedColumns,
	plannedFromRow,
	varietySupply,
	varietySupplyColumns,
	type PlannedRow,
	type VarietySupplyRow
} from './planned-rows';
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

interface Row extends PlannedRow {
	season_id: number;
	season_name: string;
	status: string;
	variety_id: number;
	bed_id: number | null;
	start_ft: number | string;
	field_date: string;
}

export const proposedKey = (index: number): string => `n${index}`;

export async function previewCover(
	farmId: number,
	season: Season,
	proposed: ProposedPlanting[]
): Promise<PreviewCover> {
	const [rows, input, stores] = await Promise.all([
		// Every planting harvesting in the season's dates, whatever its season; failed ones supply
		// nothing. After the apply, the season's planned ones give way to the proposal.
		livePlantings(farmId)
			.join('seasons as s', 's.id', 'p.season_id')
			.where('p.first_harvest', '<=', season.endsOn)
			.where('p.last_harvest', '>=', season.startsOn)
			.select<Row[]>(
				...plannedColumns,
				'p.season_id',
				's.name as season_name',
				'p.status',
				'p.variety_id',
				'p.bed_id',
				'p.start_ft',
				'p.field_date'
			),
		targetInput(farmId, season.id),
		cropStores(farmId)
	]);
	const varieties = await db()('varieties as v')
		.join('crops as c', 'c.id', 'v.crop_id')
		.where({ 'v.farm_id': farmId })
		.select<(VarietySupplyRow & { id: number })[]>('v.id', ...varietySupplyColumns);
	const varietyById = new Map(varieties.map((v) => [String(v.id), v]));
	const replaced = (r: Row): boolean => r.season_id === season.id && r.status === 'planned';
	const stays = rows.filter((r) => !replaced(r));
	const planned = (r: Row): PlannedPlanting & { key: string } => plannedFromRow(r);
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
			...varietySupply(v)
		});
	});
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
