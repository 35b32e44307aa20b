// Plantings that hold bed-feet over a span of days, whatever their season: beds carry plantings
// across seasons (garlic planted in the fall is dug the next summer), so a plan for a season
// works around those of other seasons that are in the ground while it runs.
import { addDays, type BedPlanting } from '$lib/planning';
import type { Knex } from 'knex';
import { plantingsWithCrop } from './planting-query';

/** Narrows a query on `plantings as p` to placed plantings in the ground at some time in [from, to] (turnaround counted). */
export function holdingBedIn(
	q: Knex.QueryBuilder,
	from: string,
	to: string,
	turnaroundDays: number
): Knex.QueryBuilder {
	return q
		.whereNotNull('p.bed_id')
		.andWhere('p.field_date', '<=', to)
		.andWhere('p.last_harvest', '>=', addDays(from, -turnaroundDays));
}

/**
 * The farm's placed, not-failed plantings in the ground at some time in [from, to] (their last
 * harvest plus the turnaround on or after `from`), other than those of `exceptSeasonId`, as the
 * engine's obstacles. The bed timeline counts the same plantings.
 */
export async function bedHolders(
	farmId: number,
	from: string,
	to: string,
	turnaroundDays: number,
	exceptSeasonId?: number
): Promise<BedPlanting[]> {
	const q = plantingsWithCrop().where('p.farm_id', farmId).whereNot('p.status', 'failed');
	holdingBedIn(q, from, to, turnaroundDays);
	if (exceptSeasonId !== undefined) q.whereNot('p.season_id', exceptSeasonId);
	const rows = await q.select(
		'p.id',
		'p.bed_id',
		'p.start_ft',
		'p.length_ft',
		'p.field_date',
		'p.last_harvest',
		'c.family'
	);
	return rows.map((p) => ({
		key: `planting#${p.id}`,
		bedId: String(p.bed_id),
		startFt: Number(p.start_ft),
		lengthFt: Number(p.length_ft),
		fieldDate: p.field_date,
		lastHarvest: p.last_harvest,
		family: p.family
	}));
}
