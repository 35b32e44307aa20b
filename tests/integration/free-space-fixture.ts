// A small invented farm of its own for the free-space checks (API and browser), made through
// /signup and knex inserts, so the expected free feet can be worked out by hand below.
import { Client } from '../helpers/http';
import { testDb, uniqueEmail } from '../helpers/db';
import { confirmedSignUp } from '../helpers/signup';

export interface FreeSpaceFarm {
	client: Client;
	farmId: number;
	seasonId: number;
	beds: { a1: number; a2: number; e1: number };
	blocks: { west: number; east: number };
	email: string;
	password: string;
}

/**
 * Season 2027, turnaround 7 days (the farm default). Query weeks 2027-W20..W23 =
 * Mon 17 May .. Sun 13 Jun 2027 (W01 starts Mon 4 Jan; 4 Jan + 19 × 7 days = 17 May;
 * 17 May + 27 days = 13 Jun).
 * - West A1, 100 ft: 0–30 ft held to 20 May + 7 = 27 May (blocks); 60–100 ft goes in on
 *   10 Jun (blocks); 30–60 ft last harvest 9 May, held through 16 May, free from 17 May.
 *   Free: 30–60 ft (30 ft).
 * - West A2, 50 ft: 10–20 ft failed (gives its feet back); 40–50 ft goes in 14 Jun, the day
 *   after the window. Free: 0–50 ft (50 ft).
 * - East E1, 80 ft: 0–80 ft from 1 May to 1 Jul. Free: nothing.
 */
export async function makeFreeSpaceFarm(tag: string): Promise<FreeSpaceFarm> {
	const email = uniqueEmail(tag);
	const password = 'free-space-pass-27';
	const client = new Client();
	const res = await confirmedSignUp(client, {
		name: 'Free Space Tester',
		email,
		password,
		farmName: 'Lane End Plots (invented)',
		latitude: '43',
		lastSpringFrost: '2027-05-05',
		firstFallFrost: '2027-10-10'
	});
	if (res.status !== 303) throw new Error(`signup answered ${res.status}`);
	const db = testDb();
	const user = await db('users').where({ email }).first('id');
	const farmId: number = (await db('farm_members').where({ user_id: user.id }).first('farm_id')).farm_id;
	const [west] = await db('blocks').insert({ farm_id: farmId, name: 'West', position: 1 });
	const [east] = await db('blocks').insert({ farm_id: farmId, name: 'East', position: 2 });
	const [a1] = await db('beds').insert({ farm_id: farmId, block_id: west, name: 'A1', length_ft: 100, position: 1 });
	const [a2] = await db('beds').insert({ farm_id: farmId, block_id: west, name: 'A2', length_ft: 50, position: 2 });
	const [e1] = await db('beds').insert({ farm_id: farmId, block_id: east, name: 'E1', length_ft: 80, position: 1 });
	const [cropId] = await db('crops').insert({
		farm_id: farmId,
		name: 'Beet',
		family: 'Amaranthaceae',
		harvest_unit: 'lb',
		frost_tolerance: 'hardy'
	});
	const [varietyId] = await db('varieties').insert({
		farm_id: farmId,
		crop_id: cropId,
		name: 'Invented Red',
		method: 'direct',
		days_to_maturity: 55,
		harvest_window_days: 21,
		yield_per_bed_foot: 1.5,
		rows_per_bed: 4,
		in_row_spacing_in: 3,
		germination_rate: 0.8,
		seeds_per_gram: 55
	});
	const [seasonId] = await db('seasons').insert({
		farm_id: farmId,
		year: 2027,
		name: '2027 season',
		starts_on: '2027-01-01',
		ends_on: '2027-12-31'
	});
	const row = (bed: number, start: number, length: number, field: string, last: string, status = 'planned') => ({
		farm_id: farmId,
		season_id: seasonId,
		variety_id: varietyId,
		bed_id: bed,
		start_ft: start,
		length_ft: length,
		rows: 4,
		in_row_spacing_in: 3,
		method: 'direct',
		field_date: field,
		first_harvest: last,
		last_harvest: last,
		status
	});
	await db('plantings').insert([
		row(a1, 0, 30, '2027-04-01', '2027-05-20'),
		row(a1, 60, 40, '2027-06-10', '2027-08-01'),
		row(a1, 30, 30, '2027-03-01', '2027-05-09'),
		row(a2, 10, 10, '2027-05-01', '2027-06-30', 'failed'),
		row(a2, 40, 10, '2027-06-14', '2027-08-01'),
		row(e1, 0, 80, '2027-05-01', '2027-07-01')
	]);
	return { client, farmId, seasonId, beds: { a1, a2, e1 }, blocks: { west, east }, email, password };
}
