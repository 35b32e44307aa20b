// Ids the access table's probes use: the demo farm's 2027 season and rows in it, a scratch
// season of the demo farm (year 2040, empty) for probes that change data, and throwaway rows
// made per probe in that scratch season. Everything made here is removed again by cleanup().
import { Client, signedIn } from '../helpers/http';
import { testDb, uniqueEmail } from '../helpers/db';
import { demo } from '../helpers/env';
import { confirmedSignUp } from '../helpers/signup';

export interface AccessFixture {
	farmId: number;
	seasonId: number;
	scratchSeasonId: number;
	plantingId: number;
	harvestId: number;
	/** The season of harvestId (the demo's harvests are logged in 2026). */
	harvestSeasonId: number;
	shareSizeId: number;
	freshPlanting(): Promise<number>;
	freshHarvest(): Promise<number>;
	freshShareSize(): Promise<number>;
	freshSwap(): Promise<number>;
	freshSeason(): Promise<number>;
	/** A demo crop and one of its varieties (read only), and throwaway ones to archive or delete. */
	cropId: number;
	varietyId: number;
	freshCrop(): Promise<number>;
	freshVariety(): Promise<{ cropId: number; varietyId: number }>;
	cleanup(): Promise<void>;
}

export const SCRATCH_YEARS = [2040, 2060];

/** The fixture in the farm of `ownerEmail` (the demo farm unless told; the units test uses a metric copy). */
export async function makeAccessFixture(ownerEmail: string = demo.owner): Promise<AccessFixture> {
	const db = testDb();
	const owner = await db('users').where({ email: ownerEmail }).first('id');
	const farmId: number = (await db('farm_members').where({ user_id: owner.id }).first('farm_id')).farm_id;
	const seasonId: number = (await db('seasons').where({ farm_id: farmId, year: 2027 }).first('id')).id;
	const harvest = await db('harvest_records as h')
		.join('plantings as p', 'p.id', 'h.planting_id')
		.where({ 'h.farm_id': farmId })
		.first('h.id', 'h.planting_id', 'p.season_id');
	const share = await db('share_sizes').where({ season_id: seasonId }).first('id');
	const variety = await db('varieties').where({ farm_id: farmId }).first('id', 'crop_id');
	const crops = await db('crops').where({ farm_id: farmId }).where('harvest_unit', 'lb').limit(2).select('id');
	await db('seasons').where({ farm_id: farmId }).where('year', '>=', SCRATCH_YEARS[0]).delete();
	const [scratchSeasonId] = await db('seasons').insert({
		farm_id: farmId,
		year: 2040,
		name: 'Scratch (tests)',
		starts_on: '2040-01-01',
		ends_on: '2040-12-31'
	});

	const freshPlanting = async (): Promise<number> => {
		const [id] = await db('plantings').insert({
			farm_id: farmId,
			season_id: scratchSeasonId,
			variety_id: variety.id,
			bed_id: null,
			start_ft: 0,
			length_ft: 10,
			rows: 2,
			in_row_spacing_in: 6,
			method: 'direct',
			field_date: '2040-05-01',
			first_harvest: '2040-07-01',
			last_harvest: '2040-07-14'
		});
		return id;
	};
	const freshShareSize = async (): Promise<number> => {
		const [id] = await db('share_sizes').insert({
			farm_id: farmId,
			season_id: scratchSeasonId,
			name: `Scratch ${Math.random().toString(36).slice(2, 8)}`,
			members: 1,
			first_week: '2040-W20',
			last_week: '2040-W30'
		});
		return id;
	};
	let seasonYear = SCRATCH_YEARS[0] + 1;
	const freshCrop = async (): Promise<number> => {
		const [id] = await db('crops').insert({
			farm_id: farmId,
			name: `Scratch crop ${Math.random().toString(36).slice(2, 10)}`,
			family: 'Apiaceae',
			harvest_unit: 'lb',
			frost_tolerance: 'hardy'
		});
		return id;
	};
	return {
		farmId,
		cropId: variety.crop_id,
		varietyId: variety.id,
		freshCrop,
		freshVariety: async () => {
			const cropId = await freshCrop();
			const [varietyId] = await db('varieties').insert({
				farm_id: farmId,
				crop_id: cropId,
				name: 'Scratch variety',
				method: 'direct',
				days_to_maturity: 30,
				harvest_window_days: 7,
				yield_per_bed_foot: 1,
				rows_per_bed: 2,
				in_row_spacing_in: 2,
				germination_rate: 0.8,
				seeds_per_gram: 100
			});
			return { cropId, varietyId };
		},
		seasonId,
		scratchSeasonId,
		plantingId: harvest.planting_id,
		harvestId: harvest.id,
		harvestSeasonId: harvest.season_id,
		shareSizeId: share.id,
		freshPlanting,
		freshShareSize,
		freshHarvest: async () => {
			const plantingId = await freshPlanting();
			const [id] = await db('harvest_records').insert({
				farm_id: farmId,
				planting_id: plantingId,
				harvested_on: '2040-07-02',
				quantity: 1,
				unit: 'lb'
			});
			return id;
		},
		freshSwap: async () => {
			const shareSizeId = await freshShareSize();
			const [id] = await db('box_swaps').insert({
				farm_id: farmId,
				season_id: scratchSeasonId,
				share_size_id: shareSizeId,
				week: '2040-W22',
				from_crop_id: crops[0].id,
				to_crop_id: crops[1].id,
				quantity: 1
			});
			return id;
		},
		freshSeason: async () => {
			// Two years apart, so a copy into the next year never meets the next throwaway season.
			seasonYear += 2;
			const [id] = await db('seasons').insert({
				farm_id: farmId,
				year: seasonYear,
				name: 'Scratch copy (tests)',
				starts_on: `${seasonYear}-01-01`,
				ends_on: `${seasonYear}-12-31`
			});
			return id;
		},
		cleanup: async () => {
			await db('seasons').where({ farm_id: farmId }).where('year', '>=', SCRATCH_YEARS[0]).delete();
			await db('crops').where({ farm_id: farmId }).where('name', 'like', 'Scratch crop %').delete();
		}
	};
}

/** The four visitors that hold a session; 'other' owns a farm of its own, made through /signup. */
export async function signInAll(): Promise<{ owner: Client; crew: Client; share: Client; other: Client }> {
	const other = new Client();
	const res = await confirmedSignUp(other, {
		name: 'Other Farm Owner',
		email: uniqueEmail('access-other'),
		password: 'quiet-meadow-lantern-2027',
		farmName: 'Far Hill Plots (invented)',
		latitude: '41',
		lastSpringFrost: '2027-04-25',
		firstFallFrost: '2027-10-15'
	});
	if (res.status !== 303) throw new Error(`signup for the other farm answered ${res.status}`);
	return {
		owner: await signedIn(demo.owner, demo.password),
		crew: await signedIn(demo.crew, demo.password),
		share: await signedIn(demo.share, demo.password),
		other
	};
}
