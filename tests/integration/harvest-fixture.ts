// An invented farm of one's own for the harvest-log tests: signed up through /signup, then
// beds, one crop of each kind needed and a 2026 season arranged straight in the database.
import { Client } from '../helpers/http';
import { testDb, uniqueEmail } from '../helpers/db';
import { confirmedSignUp } from '../helpers/signup';

export interface HarvestFarm {
	owner: Client;
	email: string;
	farmId: number;
	userId: string;
	bedIds: number[];
	carrot: { cropId: number; varietyId: number };
	basil: { cropId: number; varietyId: number };
}

export async function harvestFarm(tag: string): Promise<HarvestFarm> {
	const owner = new Client();
	const email = uniqueEmail(tag);
	const res = await confirmedSignUp(owner, {
		name: 'Test Owner',
		email,
		password: 'long-enough-pass',
		farmName: `${tag} farm (invented)`,
		latitude: '41',
		lastSpringFrost: '2026-05-10',
		firstFallFrost: '2026-10-05'
	});
	if (res.status !== 303) throw new Error(`signup answered ${res.status}`);
	const db = testDb();
	const user = await db('users').where({ email }).first('id');
	const farmId = (await db('farm_members').where({ user_id: user.id }).first('farm_id')).farm_id as number;
	const [blockId] = await db('blocks').insert({ farm_id: farmId, name: 'North', position: 1 });
	const bedIds: number[] = [];
	for (const name of ['N1', 'N2', 'N3'])
		bedIds.push(
			(
				await db('beds').insert({
					farm_id: farmId,
					block_id: blockId,
					name,
					length_ft: 100,
					position: bedIds.length + 1
				})
			)[0]
		);
	const [carrotCrop] = await db('crops').insert({
		farm_id: farmId,
		name: 'Carrot',
		family: 'Apiaceae',
		harvest_unit: 'lb',
		frost_tolerance: 'hardy',
		base_temp_f: 40
	});
	const [basilCrop] = await db('crops').insert({
		farm_id: farmId,
		name: 'Basil',
		family: 'Lamiaceae',
		harvest_unit: 'bunch',
		frost_tolerance: 'tender',
		base_temp_f: 50
	});
	const variety = {
		method: 'direct',
		days_in_tray: 0,
		rows_per_bed: 4,
		in_row_spacing_in: 2,
		germination_rate: 0.8,
		seeds_per_gram: 700,
		margin: 0.1
	};
	const [carrotVar] = await db('varieties').insert({
		farm_id: farmId,
		crop_id: carrotCrop,
		name: 'Test Nantes',
		days_to_maturity: 60,
		harvest_window_days: 14,
		yield_per_bed_foot: 2,
		...variety
	});
	const [basilVar] = await db('varieties').insert({
		farm_id: farmId,
		crop_id: basilCrop,
		name: 'Test Genovese',
		days_to_maturity: 40,
		harvest_window_days: 28,
		yield_per_bed_foot: 1,
		...variety
	});
	return {
		owner,
		email,
		farmId,
		userId: user.id,
		bedIds,
		carrot: { cropId: carrotCrop, varietyId: carrotVar },
		basil: { cropId: basilCrop, varietyId: basilVar }
	};
}

export async function addSeason(farmId: number, year: number): Promise<number> {
	return (
		await testDb()('seasons').insert({
			farm_id: farmId,
			year,
			name: `${year} season`,
			starts_on: `${year}-01-01`,
			ends_on: `${year}-12-31`
		})
	)[0];
}

export interface PlantingRow {
	varietyId: number;
	bedId: number | null;
	startFt?: number;
	lengthFt: number;
	fieldDate: string;
	firstHarvest: string;
	lastHarvest: string;
	status?: string;
	expectedYield: number;
}

export async function addPlanting(farmId: number, seasonId: number, p: PlantingRow): Promise<number> {
	return (
		await testDb()('plantings').insert({
			farm_id: farmId,
			season_id: seasonId,
			variety_id: p.varietyId,
			bed_id: p.bedId,
			start_ft: p.startFt ?? 0,
			length_ft: p.lengthFt,
			rows: 4,
			in_row_spacing_in: 2,
			method: 'direct',
			field_date: p.fieldDate,
			first_harvest: p.firstHarvest,
			last_harvest: p.lastHarvest,
			expected_yield: p.expectedYield,
			status: p.status ?? 'planned'
		})
	)[0];
}
