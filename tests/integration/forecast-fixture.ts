// A small invented farm for the forecast and box tests, made through /signup and then given
// crops, plantings and share boxes straight in the database, so every expected figure can be
// worked out by hand from the numbers below.
import { Client } from '../helpers/http';
import { testDb, uniqueEmail } from '../helpers/db';
import { confirmedSignUp } from '../helpers/signup';

export interface ForecastFarm {
	client: Client;
	email: string;
	password: string;
	userId: string;
	farmId: number;
	season2027: number;
	season2026: number;
	crops: { carrot: number; spinach: number; kale: number; chard: number };
	shares: { full: number; half: number };
	plantings: { carrot: number; failed: number; fall: number };
}

export const FIXTURE_PASSWORD = 'forecast-fixture-pass';

/**
 * 2027-W24 is Mon 14 – Sun 20 Jun 2027, W25 is 21 – 27 Jun (ISO 8601: 2027-W01 starts Mon 4 Jan).
 * - carrot (lb): 2 lb per bed-foot over the window. Planting A: 10 ft, 14 – 20 Jun → 20 lb in W24.
 *   A failed carrot planting of 100 ft in W24 must count for nothing.
 * - spinach (lb): 2 lb per bed-foot, 5 ft, W24 → 10 lb. kale (bunch): 1 bunch per bed-foot, 12 ft, W24 → 12 bunches.
 * - chard (bunch): 8 ft × 1, W24 → 8 bunches.
 * - Shares W24 – W25: Full 10 members, Half 5. W24 boxes: Full 2 lb carrot + 1 bunch kale; Half 1 lb carrot.
 * - 2026 season: carrot 50 ft, Mon 16 – Sun 29 Nov 2026 (W47 – W48) → 100 lb, 50 lb a week; 31 lb logged on 18 Nov.
 */
export async function makeForecastFarm(tag: string): Promise<ForecastFarm> {
	const email = uniqueEmail(tag);
	const client = new Client();
	const res = await confirmedSignUp(client, {
		name: 'Forecast Tester (invented)',
		email,
		password: FIXTURE_PASSWORD,
		farmName: 'Furrow Test Plot (invented)',
		latitude: '42',
		lastSpringFrost: '2027-05-10',
		firstFallFrost: '2027-10-05'
	});
	if (res.status !== 303) throw new Error(`signup answered ${res.status}`);
	const db = testDb();
	const user = await db('users').where({ email }).first('id');
	const farmId = (await db('farm_members').where({ user_id: user.id }).first('farm_id')).farm_id as number;

	const crop = async (name: string, family: string, unit: string): Promise<number> =>
		(
			await db('crops').insert({
				farm_id: farmId,
				name,
				family,
				harvest_unit: unit,
				frost_tolerance: 'hardy',
				base_temp_f: 40
			})
		)[0];
	const crops = {
		carrot: await crop('Carrot (test)', 'Apiaceae', 'lb'),
		spinach: await crop('Spinach (test)', 'Amaranthaceae', 'lb'),
		kale: await crop('Kale (test)', 'Brassicaceae', 'bunch'),
		chard: await crop('Chard (test)', 'Amaranthaceae', 'bunch')
	};
	const variety = async (cropId: number, yieldPerBedFoot: number): Promise<number> =>
		(
			await db('varieties').insert({
				farm_id: farmId,
				crop_id: cropId,
				name: 'Test variety',
				method: 'direct',
				days_to_maturity: 50,
				harvest_window_days: 7,
				yield_per_bed_foot: yieldPerBedFoot,
				rows_per_bed: 2,
				in_row_spacing_in: 4,
				germination_rate: 0.8,
				seeds_per_gram: 500
			})
		)[0];
	const v = {
		carrot: await variety(crops.carrot, 2),
		spinach: await variety(crops.spinach, 2),
		kale: await variety(crops.kale, 1),
		chard: await variety(crops.chard, 1)
	};
	const [season2027] = await db('seasons').insert({
		farm_id: farmId,
		year: 2027,
		name: '2027 test season',
		starts_on: '2027-01-01',
		ends_on: '2027-12-31'
	});
	const [season2026] = await db('seasons').insert({
		farm_id: farmId,
		year: 2026,
		name: '2026 test season',
		starts_on: '2026-01-01',
		ends_on: '2026-12-31'
	});
	const planting = async (
		seasonId: number,
		varietyId: number,
		lengthFt: number,
		first: string,
		last: string,
		status = 'planned'
	): Promise<number> =>
		(
			await db('plantings').insert({
				farm_id: farmId,
				season_id: seasonId,
				variety_id: varietyId,
				start_ft: 0,
				length_ft: lengthFt,
				rows: 2,
				in_row_spacing_in: 4,
				method: 'direct',
				field_date: '2027-04-20',
				first_harvest: first,
				last_harvest: last,
				status
			})
		)[0];
	const plantings = {
		carrot: await planting(season2027, v.carrot, 10, '2027-06-14', '2027-06-20'),
		failed: await planting(season2027, v.carrot, 100, '2027-06-14', '2027-06-20', 'failed'),
		fall: await planting(season2026, v.carrot, 50, '2026-11-16', '2026-11-29', 'harvesting')
	};
	await planting(season2027, v.spinach, 5, '2027-06-14', '2027-06-20');
	await planting(season2027, v.kale, 12, '2027-06-14', '2027-06-20');
	await planting(season2027, v.chard, 8, '2027-06-14', '2027-06-20');
	await db('harvest_records').insert({
		farm_id: farmId,
		planting_id: plantings.fall,
		harvested_on: '2026-11-18',
		quantity: 31,
		unit: 'lb',
		recorded_by: user.id
	});

	const share = async (name: string, members: number): Promise<number> =>
		(
			await db('share_sizes').insert({
				farm_id: farmId,
				season_id: season2027,
				name,
				members,
				first_week: '2027-W24',
				last_week: '2027-W25'
			})
		)[0];
	const shares = { full: await share('Full (test)', 10), half: await share('Half (test)', 5) };
	await db('box_items').insert([
		{ share_size_id: shares.full, week: '2027-W24', crop_id: crops.carrot, quantity: 2, unit: 'lb' },
		{ share_size_id: shares.full, week: '2027-W24', crop_id: crops.kale, quantity: 1, unit: 'bunch' },
		{ share_size_id: shares.half, week: '2027-W24', crop_id: crops.carrot, quantity: 1, unit: 'lb' }
	]);
	return {
		client,
		email,
		password: FIXTURE_PASSWORD,
		userId: user.id,
		farmId,
		season2027,
		season2026,
		crops,
		shares,
		plantings
	};
}

/**
 * A carrot planting of the 2026 season dug Thu 17 – Wed 23 Jun 2027: 7 ft × 2 lb/ft = 14 lb over
 * 7 days, 2 lb a day: Thu–Sun (4 days) = 8 lb in 2027-W24, Mon–Wed (3 days) = 6 lb in W25.
 * Returns its id.
 */
export async function addCarryOverCarrot(
	f: ForecastFarm,
	place: { bedId: number | null; startFt: number }
): Promise<number> {
	const db = testDb();
	const v = await db('varieties').where({ farm_id: f.farmId, crop_id: f.crops.carrot }).first('id');
	const [id] = await db('plantings').insert({
		farm_id: f.farmId,
		season_id: f.season2026,
		variety_id: v.id,
		bed_id: place.bedId,
		start_ft: place.startFt,
		length_ft: 7,
		rows: 2,
		in_row_spacing_in: 4,
		method: 'direct',
		field_date: '2026-10-01',
		first_harvest: '2027-06-17',
		last_harvest: '2027-06-23',
		status: 'sown'
	});
	return id;
}
