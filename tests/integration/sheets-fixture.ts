// A small invented farm of its own for the crew-sheet and calendar tests, so every figure on the
// sheet can be worked out by hand: one block, two beds, two varieties, four plantings around
// ISO week 2027-W21 (Mon 24 May – Sun 30 May 2027), one share size and one market order.
import { Client, signedIn } from '../helpers/http';
import { testDb, uniqueEmail } from '../helpers/db';
import { confirmedSignUp } from '../helpers/signup';

export const PASSWORD = 'sheet-test-password';
export const WEEK = '2027-W21';

export interface SheetFarm {
	farmId: number;
	seasonId: number;
	owner: Client;
	crew: Client;
	share: Client;
	emails: { owner: string; crew: string; share: string };
	/** Plantings by what the crew does with them in W21. */
	p: { directCarrot: number; transplantLettuce: number; trayLettuce: number; harvestCarrot: number };
}

async function signUp(tag: string, farmName: string): Promise<{ email: string; client: Client; farmId: number }> {
	const email = uniqueEmail(tag);
	const client = new Client();
	const res = await confirmedSignUp(client, {
		name: `Test ${tag}`,
		email,
		password: PASSWORD,
		farmName,
		latitude: '41.5',
		lastSpringFrost: '2027-05-01',
		firstFallFrost: '2027-10-15'
	});
	if (res.status !== 303) throw new Error(`sign-up of ${tag} answered ${res.status}`);
	const user = await testDb()('users').where({ email }).first('id');
	const m = await testDb()('farm_members').where({ user_id: user.id }).first('farm_id');
	return { email, client, farmId: m.farm_id };
}

/** A person who belongs to `farmId` only, in `role`, signed in. */
async function member(
	tag: string,
	farmId: number,
	role: 'crew_lead' | 'share_manager'
): Promise<{ email: string; client: Client }> {
	const { email, farmId: own } = await signUp(tag, `Throwaway farm of ${tag} (invented)`);
	const user = await testDb()('users').where({ email }).first('id');
	await testDb()('farm_members').where({ user_id: user.id, farm_id: own }).delete();
	await testDb()('farm_members').insert({ farm_id: farmId, user_id: user.id, role });
	return { email, client: await signedIn(email, PASSWORD) };
}

export async function makeSheetFarm(timeZone = 'America/Chicago'): Promise<SheetFarm> {
	const db = testDb();
	const owner = await signUp('sheet-owner', 'Sheet Test Farm (invented)');
	const farmId = owner.farmId;
	await db('farms').where({ id: farmId }).update({ time_zone: timeZone });
	const [blockId] = await db('blocks').insert({ farm_id: farmId, name: 'East', position: 1 });
	const [bedE1] = await db('beds').insert({
		farm_id: farmId,
		block_id: blockId,
		name: 'E1',
		length_ft: 100,
		width_in: 30,
		position: 1
	});
	const [bedE2] = await db('beds').insert({
		farm_id: farmId,
		block_id: blockId,
		name: 'E2',
		length_ft: 100,
		width_in: 30,
		position: 2
	});
	const [carrot] = await db('crops').insert({
		farm_id: farmId,
		name: 'Carrot',
		family: 'Apiaceae',
		harvest_unit: 'lb',
		frost_tolerance: 'hardy',
		base_temp_f: 40
	});
	const [lettuce] = await db('crops').insert({
		farm_id: farmId,
		name: 'Lettuce',
		family: 'Asteraceae',
		harvest_unit: 'head',
		frost_tolerance: 'hardy',
		base_temp_f: 40
	});
	const [nantes] = await db('varieties').insert({
		farm_id: farmId,
		crop_id: carrot,
		name: 'Test Nantes',
		method: 'direct',
		days_to_maturity: 70,
		days_in_tray: 0,
		harvest_window_days: 14,
		yield_per_bed_foot: 1.5,
		rows_per_bed: 4,
		in_row_spacing_in: 1,
		seeds_per_spot: 2,
		germination_rate: 0.65,
		seeds_per_gram: 776.03,
		cells_per_tray: 128,
		margin: 0.1
	});
	const [butter] = await db('varieties').insert({
		farm_id: farmId,
		crop_id: lettuce,
		name: 'Test Butterhead',
		method: 'transplant',
		days_to_maturity: 45,
		days_in_tray: 28,
		harvest_window_days: 14,
		yield_per_bed_foot: 3,
		rows_per_bed: 3,
		in_row_spacing_in: 12,
		seeds_per_spot: 1,
		germination_rate: 0.9,
		seeds_per_gram: 800,
		cells_per_tray: 72,
		margin: 0.1
	});
	const [seasonId] = await db('seasons').insert({
		farm_id: farmId,
		year: 2027,
		name: '2027 test season',
		starts_on: '2027-01-01',
		ends_on: '2027-12-31'
	});
	const common = { farm_id: farmId, season_id: seasonId, seeds_per_spot: 1 };
	const [directCarrot] = await db('plantings').insert({
		...common,
		variety_id: nantes,
		bed_id: bedE2,
		start_ft: 0,
		length_ft: 60,
		rows: 4,
		in_row_spacing_in: 1,
		seeds_per_spot: 2,
		method: 'direct',
		field_date: '2027-05-25',
		first_harvest: '2027-08-03',
		last_harvest: '2027-08-16',
		expected_yield: 90
	});
	const [transplantLettuce] = await db('plantings').insert({
		...common,
		variety_id: butter,
		bed_id: bedE1,
		start_ft: 10,
		length_ft: 50,
		rows: 3,
		in_row_spacing_in: 12,
		method: 'transplant',
		tray_sow_date: '2027-04-27',
		field_date: '2027-05-26',
		first_harvest: '2027-07-10',
		last_harvest: '2027-07-23',
		expected_yield: 150,
		status: 'sown'
	});
	const [trayLettuce] = await db('plantings').insert({
		...common,
		variety_id: butter,
		bed_id: bedE1,
		start_ft: 60,
		length_ft: 40,
		rows: 3,
		in_row_spacing_in: 12,
		method: 'transplant',
		tray_sow_date: '2027-05-27',
		field_date: '2027-06-24',
		first_harvest: '2027-08-08',
		last_harvest: '2027-08-21',
		expected_yield: 120
	});
	const [harvestCarrot] = await db('plantings').insert({
		...common,
		variety_id: nantes,
		bed_id: bedE2,
		start_ft: 60,
		length_ft: 40,
		rows: 4,
		in_row_spacing_in: 1,
		seeds_per_spot: 2,
		method: 'direct',
		field_date: '2027-03-15',
		first_harvest: '2027-05-24',
		last_harvest: '2027-06-06',
		expected_yield: 60,
		status: 'sown'
	});
	const [shareId] = await db('share_sizes').insert({
		farm_id: farmId,
		season_id: seasonId,
		name: 'Test box',
		members: 10,
		first_week: '2027-W20',
		last_week: '2027-W30',
		pickup_days: 'Thu'
	});
	await db('box_items').insert({ share_size_id: shareId, week: WEEK, crop_id: carrot, quantity: 1.5, unit: 'lb' });
	await db('channel_demand').insert({
		farm_id: farmId,
		season_id: seasonId,
		channel: 'market',
		crop_id: carrot,
		week: WEEK,
		quantity: 8
	});

	const crew = await member('sheet-crew', farmId, 'crew_lead');
	const share = await member('sheet-share', farmId, 'share_manager');
	return {
		farmId,
		seasonId,
		owner: owner.client,
		crew: crew.client,
		share: share.client,
		emails: { owner: owner.email, crew: crew.email, share: share.email },
		p: { directCarrot, transplantLettuce, trayLettuce, harvestCarrot }
	};
}

/** Hand-worked figures for the fixture (arithmetic in comments, never from the code under test). */
export const expected = {
	// Direct carrot, 60 ft × 4 rows at 1 in, 2 seeds per spot, germination 0.65, margin 10 %:
	// spots = 60 × 12 ÷ 1 = 720 per row × 4 = 2,880; seeds = ceil(2,880 × 2 ÷ 0.65 × 1.1) = ceil(9,747.7) = 9,748;
	// grams = 9,748 ÷ 776.03 = 12.561… → rounded up to 0.01 g = 12.57 g (worked example in DEVELOPERS.md).
	directSeeds: 9748,
	directGrams: 12.57,
	// Lettuce for transplanting, 50 ft × 3 rows at 12 in: spots = 50 × 12 ÷ 12 = 50 × 3 = 150 plants.
	transplantPlants: 150,
	// Tray lettuce, 40 ft × 3 rows at 12 in: 40 plants × 3 = 120; cells = ceil(120 ÷ 0.9 × 1.1) = ceil(146.67) = 147;
	// trays = ceil(147 ÷ 72) = 3; seeds = 147 × 1; grams = 147 ÷ 800 = 0.18375 → 0.19 g.
	trayCells: 147,
	trayTrays: 3,
	trayGrams: 0.19,
	// Carrot harvest: 40 ft × the variety's 1.5 lb per ft (the one planned-supply rule) = 60 lb over 14 days
	// (24 May – 6 Jun) = 4.29 lb a day; W21 holds 7 of them = 30 lb.
	harvestWeekLb: 30,
	// Demand: Test box 10 members × 1.5 lb = 15 lb; market 8 lb.
	boxLb: 15,
	marketLb: 8
};
