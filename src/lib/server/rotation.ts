// Rotation look-back: which crop families each bed held in the seasons before a given year, as far
// back as the farm's setting says (default 3 years), for the planner to keep a family off those beds.
import type { Knex } from 'knex';
import { db } from './db';

/**
 * Families by bed id (as strings, the engine's ids) in the farm's seasons of years
 * `year − years` … `year − 1`; failed plantings do not count (nothing grew).
 */
export async function familiesByBed(
	farmId: number,
	year: number,
	years: number,
	conn: Knex | Knex.Transaction = db()
): Promise<Record<string, string[]>> {
	const rows: { bed_id: number; family: string }[] = await conn('plantings as p')
		.join('seasons as s', 's.id', 'p.season_id')
		.join('varieties as v', 'v.id', 'p.variety_id')
		.join('crops as c', 'c.id', 'v.crop_id')
		.where({ 'p.farm_id': farmId })
		.whereNotNull('p.bed_id')
		.whereNot('p.status', 'failed')
		.where('s.year', '<', year)
		.where('s.year', '>=', year - Math.max(1, years))
		.distinct('p.bed_id', 'c.family');
	const out: Record<string, string[]> = {};
	for (const r of rows) {
		const list = (out[String(r.bed_id)] ??= []);
		if (!list.includes(r.family)) list.push(r.family);
	}
	return out;
}
