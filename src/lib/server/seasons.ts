// A farm's seasons.
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { deriveTargets } from '$lib/planning';
import { db } from './db';
import { targetInput } from './demand';

export interface Season {
	id: number;
	year: number;
	name: string;
	startsOn: string;
	endsOn: string;
}

const columns = ['id', 'year', 'name', 'starts_on', 'ends_on'] as const;
function toSeason(r: { id: number; year: number; name: string; starts_on: string; ends_on: string }): Season {
	return { id: r.id, year: r.year, name: r.name, startsOn: r.starts_on, endsOn: r.ends_on };
}

export async function list(farmId: number): Promise<Season[]> {
	return (await db()('seasons').where({ farm_id: farmId }).orderBy('year', 'desc').select(columns)).map(toSeason);
}

/** The season of this farm, or null when the id belongs to no season of this farm. */
export async function get(farmId: number, seasonId: number): Promise<Season | null> {
	const r = await db()('seasons').where({ farm_id: farmId, id: seasonId }).first(columns);
	return r ? toSeason(r) : null;
}

// ---- Plan against demand -------------------------------------------------------------------
// One answer to "is this season's plan older than its demand?", shared by the seasons, plan,
// forecast and share-box pages. The plan screen records, at each apply, a hash of the weekly
// targets it planned for; demand has changed since when today's targets hash differently.
// demand_changed_at (set by every demand write) says when.

export interface PlanFreshness {
	/** ISO timestamp of the last apply from the plan screen; null when none. */
	planAppliedAt: string | null;
	/** ISO timestamp of the last demand write; null when none was recorded. */
	demandChangedAt: string | null;
	/** True when the season's weekly targets differ from those the last apply planned for. */
	demandChangedSincePlan: boolean;
}

const iso = (v: Date | string | null): string | null => (v === null ? null : new Date(v).toISOString());

/** Hash of a season's weekly targets (crop, week, quantity), independent of row order. */
export async function demandHash(farmId: number, seasonId: number): Promise<string> {
	const targets = deriveTargets(await targetInput(farmId, seasonId))
		.filter((t) => t.quantity > 1e-9)
		.map((t) => `${t.crop}|${t.week}|${Math.round(t.quantity * 1000) / 1000}`)
		.sort();
	return createHash('sha256').update(targets.join('\n')).digest('hex');
}

export async function planFreshness(farmId: number, seasonId: number): Promise<PlanFreshness> {
	const r: { plan_applied_at: Date | null; demand_changed_at: Date | null; plan_demand_hash: string | null } | undefined = await db()('seasons')
		.where({ farm_id: farmId, id: seasonId })
		.first('plan_applied_at', 'demand_changed_at', 'plan_demand_hash');
	if (!r) return { planAppliedAt: null, demandChangedAt: null, demandChangedSincePlan: false };
	const changed = r.plan_demand_hash !== null && (await demandHash(farmId, seasonId)) !== r.plan_demand_hash;
	return { planAppliedAt: iso(r.plan_applied_at), demandChangedAt: iso(r.demand_changed_at), demandChangedSincePlan: changed };
}

/** Records that the season's demand was written now (inside the writer's transaction when given). */
export async function markDemandChanged(farmId: number, seasonId: number, trx?: Knex.Transaction): Promise<void> {
	await (trx ?? db())('seasons').where({ farm_id: farmId, id: seasonId }).update({ demand_changed_at: (trx ?? db()).fn.now() });
}
