// A farm's seasons.
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { deriveTargets } from '$lib/planning';
import { db } from './db';
import { targetInput } from './demand-targets';

export interface Season {
	id: number;
	year: number;
	name: string;
	startsOn: string;
	endsOn: string;
	/** ISO timestamp when archived, or null while in use. Archived seasons stay readable. */
	archivedAt?: string | null;
}

type SeasonRow = {
	id: number;
	year: number;
	name: string;
	starts_on: string;
	ends_on: string;
	archived_at: Date | null;
};
const columns = ['id', 'year', 'name', 'starts_on', 'ends_on', 'archived_at'] as const;
function toSeason(r: SeasonRow): Season {
	return {
		id: r.id,
		year: r.year,
		name: r.name,
		startsOn: r.starts_on,
		endsOn: r.ends_on,
		archivedAt: r.archived_at === null ? null : new Date(r.archived_at).toISOString()
	};
}

/** Every season of the farm, newest first; archived ones only when asked for. */
export async function list(farmId: number, opts: { archived?: boolean } = {}): Promise<Season[]> {
	const q = db()('seasons').where({ farm_id: farmId });
	if (!opts.archived) q.whereNull('archived_at');
	return (await q.orderBy('year', 'desc').select(columns)).map(toSeason);
}

/** `today` kept within the season: its first day before it begins, its last day after it ends. */
export function dayInSeason(today: string, season: Pick<Season, 'startsOn' | 'endsOn'>): string {
	return today < season.startsOn ? season.startsOn : today > season.endsOn ? season.endsOn : today;
}

/** The season of this farm, or null when the id belongs to no season of this farm. */
export async function get(farmId: number, seasonId: number): Promise<Season | null> {
	const r = await db()('seasons').where({ farm_id: farmId, id: seasonId }).first(columns);
	return r ? toSeason(r) : null;
}

/**
 * The one lock every writer of a season's plantings takes first, inside its transaction, before it
 * reads or locks any planting (or library row): the season's row. 'exclusive' for writers that read
 * the whole season and replace or add to it (plan apply and undo, an import into the season, a
 * season copy's check of its source); 'shared' for edits of single plantings (a grid edit, a task
 * ticked off, a harvest logged), which may run side by side but wait for, and hold off, the
 * exclusive ones. Everyone queues in one order (season first, then plantings and the rows they
 * join), so these writers never deadlock each other. Returns false when the season is not the farm's.
 */
export async function lockSeason(
	trx: Knex.Transaction,
	farmId: number,
	seasonId: number,
	mode: 'exclusive' | 'shared' = 'exclusive'
): Promise<boolean> {
	const q = trx('seasons').where({ farm_id: farmId, id: seasonId });
	const row = await (mode === 'exclusive' ? q.forUpdate() : q.forShare()).first('id');
	return !!row;
}

/** lockSeason, shared: at the start of a transaction that edits one of the season's plantings. */
export async function shareSeasonLock(trx: Knex.Transaction, farmId: number, seasonId: number): Promise<void> {
	await lockSeason(trx, farmId, seasonId, 'shared');
}

/** The same, found from a planting (no lock when the planting is not the farm's). */
export async function shareSeasonLockOfPlanting(
	trx: Knex.Transaction,
	farmId: number,
	plantingId: number
): Promise<void> {
	const row: { season_id: number } | undefined = await trx('plantings')
		.where({ id: plantingId, farm_id: farmId })
		.first('season_id');
	if (row) await shareSeasonLock(trx, farmId, row.season_id);
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
	const r:
		{ plan_applied_at: Date | null; demand_changed_at: Date | null; plan_demand_hash: string | null } | undefined =
		await db()('seasons')
			.where({ farm_id: farmId, id: seasonId })
			.first('plan_applied_at', 'demand_changed_at', 'plan_demand_hash');
	if (!r) return { planAppliedAt: null, demandChangedAt: null, demandChangedSincePlan: false };
	const changed = r.plan_demand_hash !== null && (await demandHash(farmId, seasonId)) !== r.plan_demand_hash;
	return {
		planAppliedAt: iso(r.plan_applied_at),
		demandChangedAt: iso(r.demand_changed_at),
		demandChangedSincePlan: changed
	};
}

/** Records that the season's demand was written now (inside the writer's transaction when given). */
export async function markDemandChanged(farmId: number, seasonId: number, trx?: Knex.Transaction): Promise<void> {
	await (trx ?? db())('seasons')
		.where({ farm_id: farmId, id: seasonId })
		.update({ demand_changed_at: (trx ?? db()).fn.now() });
}

// ---- The seasons page: start, rename, archive -------------------------------------------------

export interface SeasonSummary extends Season {
	plantings: number;
	freshness: PlanFreshness;
}

/** Every season (archived too) with its planting count and whether its plan is older than its demand. */
export async function listSummaries(farmId: number): Promise<SeasonSummary[]> {
	const [rows, counts] = await Promise.all([
		db()('seasons').where({ farm_id: farmId }).orderBy('year', 'desc').select(columns),
		db()('plantings').where({ farm_id: farmId }).groupBy('season_id').select('season_id').count({ n: '*' })
	]);
	const bySeason = new Map(
		(counts as { season_id: number; n: number | string }[]).map((c) => [Number(c.season_id), Number(c.n)])
	);
	return Promise.all(
		rows.map(async (r: SeasonRow) => {
			const s = toSeason(r);
			return { ...s, plantings: bySeason.get(s.id) ?? 0, freshness: await planFreshness(farmId, s.id) };
		})
	);
}

export class SeasonInputError extends Error {
	constructor(
		public field: string,
		message: string,
		public status: 400 | 409 = 400
	) {
		super(message);
	}
}

function isDuplicate(e: unknown): boolean {
	return typeof e === 'object' && e !== null && (e as { code?: string }).code === 'ER_DUP_ENTRY';
}

/** A new, empty season: the calendar year, named as given. One season per farm and year. */
export async function create(farmId: number, input: { year: number; name: string }): Promise<number> {
	if (await db()('seasons').where({ farm_id: farmId, year: input.year }).first('id')) {
		throw new SeasonInputError('year', `This farm already has a ${input.year} season.`, 409);
	}
	try {
		const [id] = await db()('seasons').insert({
			farm_id: farmId,
			year: input.year,
			name: input.name,
			starts_on: `${input.year}-01-01`,
			ends_on: `${input.year}-12-31`
		});
		return id;
	} catch (e) {
		if (isDuplicate(e)) throw new SeasonInputError('year', `This farm already has a ${input.year} season.`, 409);
		throw e;
	}
}

export async function rename(farmId: number, seasonId: number, name: string): Promise<boolean> {
	return (await db()('seasons').where({ farm_id: farmId, id: seasonId }).update({ name })) > 0;
}

/** Archives (or brings back) a season; its plantings and demand stay as they are. */
export async function setArchived(farmId: number, seasonId: number, archived: boolean): Promise<boolean> {
	return (
		(await db()('seasons')
			.where({ farm_id: farmId, id: seasonId })
			.update({ archived_at: archived ? db().fn.now() : null })) > 0
	);
}
