// A farm's seasons.
import type { Knex } from 'knex';
import { db } from './db';

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

/**
 * Takes the season's row lock, shared, at the start of a transaction that edits one of its plantings.
 * Plan apply takes the same lock exclusively before it reads and replaces the season's plantings, so
 * edits and applies queue in one order (season first, then plantings) and never deadlock each other.
 */
export async function shareSeasonLock(trx: Knex.Transaction, farmId: number, seasonId: number): Promise<void> {
	await trx('seasons').where({ farm_id: farmId, id: seasonId }).forShare().first('id');
}

/** The same, found from a planting (no lock when the planting is not the farm's). */
export async function shareSeasonLockOfPlanting(trx: Knex.Transaction, farmId: number, plantingId: number): Promise<void> {
	const row: { season_id: number } | undefined = await trx('plantings').where({ id: plantingId, farm_id: farmId }).first('season_id');
	if (row) await shareSeasonLock(trx, farmId, row.season_id);
}
