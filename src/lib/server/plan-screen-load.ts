// What the plan screen opens with: each crop's weekly targets and varieties, the farm's
// defaults, and the state of the last apply.
import { deriveTargets } from '$lib/planning';
import { db } from './db';
import { listVarieties } from './crops';
import { targetInput } from './demand';
import { lastApply, type LastApply } from './plan-history';
import { planFreshness, type PlanFreshness, type Season } from './seasons';

export interface PlanCrop {
	id: number;
	name: string;
	unit: string;
	targets: { week: string; quantity: number }[];
	varieties: { id: number; name: string; method: string; daysToMaturity: number; harvestWindowDays: number }[];
}

export interface PlanScreenData {
	crops: PlanCrop[];
	/** Crops in the library without demand this season (they get no plantings). */
	otherCrops: number;
	freshness: PlanFreshness;
	lastApply: LastApply | null;
	plantings: { total: number; planned: number };
}

export async function planScreenData(farmId: number, season: Season): Promise<PlanScreenData> {
	const [input, varieties, crops, freshness, last, counts] = await Promise.all([
		targetInput(farmId, season.id),
		listVarieties(farmId),
		db()('crops').where({ farm_id: farmId }).orderBy('name').select('id', 'name', 'harvest_unit') as Promise<
			{ id: number; name: string; harvest_unit: string }[]
		>,
		planFreshness(farmId, season.id),
		lastApply(farmId, season.id),
		db()('plantings')
			.where({ farm_id: farmId, season_id: season.id })
			.select('status')
			.count({ n: '*' })
			.groupBy('status') as Promise<{ status: string; n: number }[]>
	]);
	const byCrop = new Map<string, { week: string; quantity: number }[]>();
	for (const t of deriveTargets(input))
		if (t.quantity > 0)
			(byCrop.get(t.crop) ?? byCrop.set(t.crop, []).get(t.crop)!).push({ week: t.week, quantity: t.quantity });
	const planCrops: PlanCrop[] = crops
		.filter((c) => byCrop.has(String(c.id)))
		.map((c) => ({
			id: c.id,
			name: c.name,
			unit: c.harvest_unit,
			targets: byCrop.get(String(c.id))!.sort((a, b) => a.week.localeCompare(b.week)),
			varieties: varieties
				.filter((v) => v.cropId === c.id)
				.map((v) => ({
					id: v.id,
					name: v.name,
					method: v.method,
					daysToMaturity: v.daysToMaturity,
					harvestWindowDays: v.harvestWindowDays
				}))
		}));
	const total = counts.reduce((s, r) => s + Number(r.n), 0);
	const planned = Number(counts.find((r) => r.status === 'planned')?.n ?? 0);
	return {
		crops: planCrops,
		otherCrops: crops.length - planCrops.length,
		freshness,
		lastApply: last,
		plantings: { total, planned }
	};
}
