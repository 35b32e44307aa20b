// A farm's seasons: list, get, create (empty), rename, archive, and the two moments that say
// whether a season's plan is older than its demand (planAppliedAt, demandChangedAt).
import type { Knex } from 'knex';
import { db } from './db';

export interface Season {
	id: number;
	year: number;
	name: string;
	startsOn: string;
	endsOn: string;
	/** ISO timestamp, or null while the season is in use. Archived seasons stay readable. */
	archivedAt?: string | null;
	/** When a plan was last applied to the season (ISO timestamp), or null. */
	planAppliedAt?: string | null;
	/** When the season's demand (share sizes, box contents, channel demand) last changed, or null. */
	demandChangedAt?: string | null;
}

type SeasonRow = {
	id: number;
	year: number;
	name: string;
	starts_on: string;
	ends_on: string;
	archived_at: Date | null;
	plan_applied_at: Date | null;
	demand_changed_at: Date | null;
};

const columns = ['id', 'year', 'name', 'starts_on', 'ends_on', 'archived_at', 'plan_applied_at', 'demand_changed_at'] as const;
const iso = (d: Date | null): string | null => (d === null ? null : new Date(d).toISOString());
function toSeason(r: SeasonRow): Season {
	return {
		id: r.id,
		year: r.year,
		name: r.name,
		startsOn: r.starts_on,
		endsOn: r.ends_on,
		archivedAt: iso(r.archived_at),
		planAppliedAt: iso(r.plan_applied_at),
		demandChangedAt: iso(r.demand_changed_at)
	};
}

/**
 * True when the season's demand changed after its plan was last applied (or demand exists and no
 * plan was ever applied to it): the plan, forecast and boxes pages then offer to re-plan.
 */
export function planOlderThanDemand(s: Pick<Season, 'planAppliedAt' | 'demandChangedAt'>): boolean {
	if (!s.demandChangedAt) return false;
	return !s.planAppliedAt || s.demandChangedAt > s.planAppliedAt;
}

/** Every season of the farm, newest first; archived ones only when asked for. */
export async function list(farmId: number, opts: { archived?: boolean } = {}): Promise<Season[]> {
	const q = db()('seasons').where({ farm_id: farmId });
	if (!opts.archived) q.whereNull('archived_at');
	return (await q.orderBy('year', 'desc').select(columns)).map(toSeason);
}

export interface SeasonSummary extends Season {
	plantings: number;
	planStale: boolean;
}

/** Every season with its planting count and whether its plan is older than its demand. */
export async function listSummaries(farmId: number): Promise<SeasonSummary[]> {
	const [rows, counts] = await Promise.all([
		db()('seasons').where({ farm_id: farmId }).orderBy('year', 'desc').select(columns),
		db()('plantings').where({ farm_id: farmId }).groupBy('season_id').select('season_id').count({ n: '*' })
	]);
	const bySeason = new Map((counts as { season_id: number; n: number | string }[]).map((c) => [Number(c.season_id), Number(c.n)]));
	return rows.map((r: SeasonRow) => {
		const s = toSeason(r);
		return { ...s, plantings: bySeason.get(s.id) ?? 0, planStale: planOlderThanDemand(s) };
	});
}

/** The season of this farm, or null when the id belongs to no season of this farm. */
export async function get(farmId: number, seasonId: number): Promise<Season | null> {
	const r = await db()('seasons').where({ farm_id: farmId, id: seasonId }).first(columns);
	return r ? toSeason(r) : null;
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
	return (await db()('seasons').where({ farm_id: farmId, id: seasonId }).update({ archived_at: archived ? db().fn.now() : null })) > 0;
}

/** Records that a plan was applied to the season now (call inside the apply's transaction). */
export async function markPlanApplied(trx: Knex | Knex.Transaction, farmId: number, seasonId: number): Promise<void> {
	await trx('seasons').where({ farm_id: farmId, id: seasonId }).update({ plan_applied_at: trx.raw('NOW(3)') });
}

/** Records that the season's demand changed now (call inside the demand write's transaction). */
export async function markDemandChanged(trx: Knex | Knex.Transaction, farmId: number, seasonId: number): Promise<void> {
	await trx('seasons').where({ farm_id: farmId, id: seasonId }).update({ demand_changed_at: trx.raw('NOW(3)') });
}
