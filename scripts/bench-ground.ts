/**
 * The ground every bench farm stands on (invented): one block of 100 beds of 100 ft, one carrot
 * variety, a 2027 season. The API and grid benches write their plantings onto it.
 */
import type { Knex } from 'knex';

export interface BenchGround {
	seasonId: number;
	varietyId: number;
	/** The 100 beds, in walking order. */
	bedIds: number[];
}

export async function benchGround(db: Knex, farmId: number): Promise<BenchGround> {
	const [blockId] = await db('blocks').insert({ farm_id: farmId, name: 'Bench block', position: 1 });
	await db('beds').insert(
		Array.from({ length: 100 }, (_, i) => ({
			farm_id: farmId,
			block_id: blockId,
			name: `Bench ${i + 1}`,
			length_ft: 100,
			position: i
		}))
	);
	const bedIds = (await db('beds').where({ block_id: blockId }).orderBy('position').pluck('id')) as number[];
	const [cropId] = await db('crops').insert({
		farm_id: farmId,
		name: 'Bench carrot',
		family: 'Apiaceae',
		harvest_unit: 'lb',
		frost_tolerance: 'hardy'
	});
	const [varietyId] = await db('varieties').insert({
		farm_id: farmId,
		crop_id: cropId,
		name: 'Bench Orange',
		method: 'direct',
		days_to_maturity: 70,
		harvest_window_days: 14,
		yield_per_bed_foot: 1.5,
		rows_per_bed: 4,
		in_row_spacing_in: 1,
		seeds_per_spot: 1,
		germination_rate: 0.65,
		seeds_per_gram: 776
	});
	const [seasonId] = await db('seasons').insert({
		farm_id: farmId,
		year: 2027,
		name: 'Bench 2027 (invented)',
		starts_on: '2027-01-01',
		ends_on: '2027-12-31'
	});
	return { seasonId, varietyId, bedIds };
}
