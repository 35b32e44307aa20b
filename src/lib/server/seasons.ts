// A farm's seasons.
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
