// Fixtures for the workbook export and import tests: a fresh farm made through /signup, a
// small invented plan written straight into it (so every figure can be worked out by hand),
// and readers for what the export sends back.
import ExcelJS from 'exceljs';
import { Client } from './http';
import { testDb, uniqueEmail } from './db';
import { baseUrl } from './env';
import { confirmedSignUp } from './signup';

export interface NewFarm {
	client: Client;
	email: string;
	farmId: number;
}

/** Signs up a new, empty farm; the client stays signed in as its owner. */
export async function signUpFarm(tag: string): Promise<NewFarm> {
	const client = new Client();
	const email = uniqueEmail(tag);
	const res = await confirmedSignUp(client, {
		name: `Owner ${tag}`,
		email,
		password: 'long-enough-pass',
		farmName: `Testbrook ${tag} (invented)`,
		latitude: '42.5',
		lastSpringFrost: '2027-05-10',
		firstFallFrost: '2027-10-05'
	});
	if (res.status !== 303) throw new Error(`signup answered ${res.status}`);
	const user = await testDb()('users').where({ email }).first('id');
	const farmId = (await testDb()('farm_members').where({ user_id: user.id }).first('farm_id')).farm_id as number;
	return { client, email, farmId };
}

export interface HandPlan {
	seasonId: number;
	cropIds: { carrot: number; lettuce: number; garlic: number };
}

/**
 * An invented plan small enough to check by hand:
 * - Carrot "Test Amber", direct: 4 rows at 1 in, 1 seed per spot, 75 % germination, 800 seeds/g,
 *   15 % margin, 90 ¢/g, 1,500 seeds a packet. Plantings P1 (bed E1, 0–50 ft, sown) and P2 (E1, 50–75 ft).
 * - Head lettuce "Test Butter", transplant: 3 rows at 12 in, 90 % germination, 800 seeds/g, 15 %
 *   margin, 128-cell trays, 250 ¢/g, 1,000 a packet. P3 (E2, 0–40 ft) and P4 (no bed, 20 ft, failed).
 * - Garlic, a crop with no variety yet.
 * - Demand: a 10-member share taking 2 lb of carrots in 2027-W27; market wants 60 heads of lettuce in 2027-W21.
 */
export async function writeHandPlan(farmId: number): Promise<HandPlan> {
	const db = testDb();
	return db.transaction(async (trx) => {
		const [carrot] = await trx('crops').insert({
			farm_id: farmId,
			name: 'Carrot',
			family: 'Apiaceae',
			harvest_unit: 'lb',
			frost_tolerance: 'hardy',
			heat_limit_f: null,
			base_temp_f: 40
		});
		const [lettuce] = await trx('crops').insert({
			farm_id: farmId,
			name: 'Head lettuce',
			family: 'Asteraceae',
			harvest_unit: 'head',
			frost_tolerance: 'hardy',
			heat_limit_f: 80,
			base_temp_f: 40
		});
		const [garlic] = await trx('crops').insert({
			farm_id: farmId,
			name: 'Garlic',
			family: 'Amaryllidaceae',
			harvest_unit: 'head',
			frost_tolerance: 'hardy',
			heat_limit_f: null,
			base_temp_f: 40
		});
		const [amber] = await trx('varieties').insert({
			farm_id: farmId,
			crop_id: carrot,
			name: 'Test Amber',
			method: 'direct',
			days_to_maturity: 70,
			days_in_tray: 0,
			harvest_window_days: 21,
			yield_per_bed_foot: 2.5,
			rows_per_bed: 4,
			in_row_spacing_in: 1,
			seeds_per_spot: 1,
			germination_rate: 0.75,
			seeds_per_gram: 800,
			seed_price_cents_per_gram: 90,
			seeds_per_packet: 1500,
			cells_per_tray: 128,
			margin: 0.15,
			gdd_to_maturity: null
		});
		const [butter] = await trx('varieties').insert({
			farm_id: farmId,
			crop_id: lettuce,
			name: 'Test Butter',
			method: 'transplant',
			days_to_maturity: 42,
			days_in_tray: 28,
			harvest_window_days: 10,
			yield_per_bed_foot: 2.7,
			rows_per_bed: 3,
			in_row_spacing_in: 12,
			seeds_per_spot: 1,
			germination_rate: 0.9,
			seeds_per_gram: 800,
			seed_price_cents_per_gram: 250,
			seeds_per_packet: 1000,
			cells_per_tray: 128,
			margin: 0.15,
			gdd_to_maturity: 900
		});
		const [east] = await trx('blocks').insert({ farm_id: farmId, name: 'East', position: 1 });
		const [west] = await trx('blocks').insert({ farm_id: farmId, name: 'West', position: 2 });
		const [e1] = await trx('beds').insert({
			farm_id: farmId,
			block_id: east,
			name: 'E1',
			length_ft: 100,
			width_in: 30,
			position: 1
		});
		const [e2] = await trx('beds').insert({
			farm_id: farmId,
			block_id: east,
			name: 'E2',
			length_ft: 100,
			width_in: 30,
			position: 2
		});
		await trx('beds').insert({ farm_id: farmId, block_id: west, name: 'W1', length_ft: 50, width_in: 42, position: 1 });
		const [seasonId] = await trx('seasons').insert({
			farm_id: farmId,
			year: 2027,
			name: 'Test season 2027',
			starts_on: '2027-01-01',
			ends_on: '2027-12-31'
		});
		const base = { farm_id: farmId, season_id: seasonId, seeds_per_spot: 1 };
		await trx('plantings').insert([
			{
				...base,
				variety_id: amber,
				bed_id: e1,
				start_ft: 0,
				length_ft: 50,
				rows: 4,
				in_row_spacing_in: 1,
				method: 'direct',
				tray_sow_date: null,
				field_date: '2027-04-19',
				first_harvest: '2027-06-28',
				last_harvest: '2027-07-18',
				expected_yield: 125,
				seeds_needed: 3680,
				status: 'sown',
				actual_field_date: '2027-04-20',
				notes: 'Row cover on'
			},
			{
				...base,
				variety_id: amber,
				bed_id: e1,
				start_ft: 50,
				length_ft: 25,
				rows: 4,
				in_row_spacing_in: 1,
				method: 'direct',
				tray_sow_date: null,
				field_date: '2027-05-03',
				first_harvest: '2027-07-12',
				last_harvest: '2027-08-01',
				expected_yield: 62.5,
				seeds_needed: 1840,
				status: 'planned',
				notes: null
			},
			{
				...base,
				variety_id: butter,
				bed_id: e2,
				start_ft: 0,
				length_ft: 40,
				rows: 3,
				in_row_spacing_in: 12,
				method: 'transplant',
				tray_sow_date: '2027-03-15',
				field_date: '2027-04-12',
				first_harvest: '2027-05-26',
				last_harvest: '2027-06-04',
				expected_yield: 108,
				seeds_needed: 154,
				status: 'planned',
				notes: null
			},
			{
				...base,
				variety_id: butter,
				bed_id: null,
				start_ft: 0,
				length_ft: 20,
				rows: 3,
				in_row_spacing_in: 12,
				method: 'transplant',
				tray_sow_date: '2027-03-22',
				field_date: '2027-04-19',
				first_harvest: '2027-06-02',
				last_harvest: '2027-06-11',
				expected_yield: 54,
				seeds_needed: 77,
				status: 'failed',
				notes: 'Not placed: no room'
			}
		]);
		const [full] = await trx('share_sizes').insert({
			farm_id: farmId,
			season_id: seasonId,
			name: 'Full',
			members: 10,
			first_week: '2027-W26',
			last_week: '2027-W30'
		});
		await trx('box_items').insert({ share_size_id: full, week: '2027-W27', crop_id: carrot, quantity: 2, unit: 'lb' });
		await trx('channel_demand').insert({
			farm_id: farmId,
			season_id: seasonId,
			channel: 'market',
			crop_id: lettuce,
			week: '2027-W21',
			quantity: 60
		});
		return { seasonId, cropIds: { carrot, lettuce, garlic } };
	});
}

export async function download(client: Client, seasonId: number): Promise<{ res: Response; bytes: Buffer }> {
	const res = await client.get(`/api/seasons/${seasonId}/export`, { headers: { accept: '*/*' } });
	return { res, bytes: Buffer.from(await res.arrayBuffer()) };
}

/** POSTs a file to the import route as a browser form would. */
export async function upload(
	client: Client,
	name: string,
	content: Uint8Array | string,
	fields: Record<string, string> = {}
): Promise<Response> {
	const form = new FormData();
	form.set('file', new Blob([typeof content === 'string' ? content : new Uint8Array(content)]), name);
	for (const [k, v] of Object.entries(fields)) form.set(k, v);
	return client.request('/api/import', {
		method: 'POST',
		body: form,
		headers: { origin: baseUrl(), accept: 'application/json' }
	});
}

/** A season's plan as comparable rows, by names rather than ids (ids differ between farms). */
export async function planOf(farmId: number, seasonId: number): Promise<Record<string, unknown>[]> {
	const rows = await testDb()('plantings as p')
		.join('varieties as v', 'v.id', 'p.variety_id')
		.join('crops as c', 'c.id', 'v.crop_id')
		.leftJoin('beds as b', 'b.id', 'p.bed_id')
		.where({ 'p.farm_id': farmId, 'p.season_id': seasonId })
		.select(
			'c.name as crop',
			'v.name as variety',
			'b.name as bed',
			'p.start_ft',
			'p.length_ft',
			'p.rows',
			'p.in_row_spacing_in',
			'p.seeds_per_spot',
			'p.method',
			'p.tray_sow_date',
			'p.field_date',
			'p.first_harvest',
			'p.last_harvest',
			'p.expected_yield',
			'p.seeds_needed',
			'p.status',
			'p.actual_tray_sow_date',
			'p.actual_field_date',
			'p.actual_first_harvest',
			'p.actual_last_harvest',
			'p.notes'
		);
	const out = rows.map((r) => ({
		...r,
		start_ft: Number(r.start_ft),
		length_ft: Number(r.length_ft),
		in_row_spacing_in: Number(r.in_row_spacing_in),
		expected_yield: Number(r.expected_yield)
	}));
	return out.sort((a, b) => JSON.stringify(a).localeCompare(JSON.stringify(b)));
}

export async function libraryOf(farmId: number): Promise<{
	varieties: Record<string, unknown>[];
	beds: Record<string, unknown>[];
	crops: Record<string, unknown>[];
}> {
	const db = testDb();
	const varieties = await db('varieties as v')
		.join('crops as c', 'c.id', 'v.crop_id')
		.where('v.farm_id', farmId)
		.orderBy(['c.name', 'v.name'])
		.select(
			'c.name as crop',
			'v.name',
			'v.method',
			'v.days_to_maturity',
			'v.days_in_tray',
			'v.harvest_window_days',
			'v.yield_per_bed_foot',
			'v.rows_per_bed',
			'v.in_row_spacing_in',
			'v.seeds_per_spot',
			'v.germination_rate',
			'v.seeds_per_gram',
			'v.seed_price_cents_per_gram',
			'v.seeds_per_packet',
			'v.cells_per_tray',
			'v.margin',
			'v.gdd_to_maturity'
		);
	const beds = await db('beds as b')
		.join('blocks as k', 'k.id', 'b.block_id')
		.where('b.farm_id', farmId)
		.orderBy('b.name')
		.select('k.name as block', 'k.position as block_position', 'b.name', 'b.length_ft', 'b.width_in', 'b.position');
	const crops = await db('crops')
		.where({ farm_id: farmId })
		.orderBy('name')
		.select('name', 'family', 'harvest_unit', 'frost_tolerance', 'heat_limit_f', 'base_temp_f', 'sow_from', 'sow_to');
	const numeric = (r: Record<string, unknown>): Record<string, unknown> =>
		Object.fromEntries(
			Object.entries(r).map(([k, v]) => [k, typeof v === 'string' && /^-?\d+(\.\d+)?$/.test(v) ? Number(v) : v])
		);
	return { varieties: varieties.map(numeric), beds: beds.map(numeric), crops: crops.map(numeric) };
}

/** Loads bytes with exceljs (its typing wants a Node Buffer of a particular flavour). */
export async function loadWorkbook(bytes: Uint8Array): Promise<ExcelJS.Workbook> {
	const wb = new ExcelJS.Workbook();
	await wb.xlsx.load(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
	return wb;
}

/** A worksheet's rows as records keyed by its header row (empty cells as null). */
export function sheetRecords(book: ExcelJS.Workbook, name: string): Record<string, unknown>[] {
	const ws = book.getWorksheet(name)!;
	const head = (ws.getRow(1).values as unknown[]).slice(1) as string[];
	const out: Record<string, unknown>[] = [];
	for (let n = 2; n <= ws.rowCount; n++) {
		const vals = ws.getRow(n).values as unknown[];
		out.push(Object.fromEntries(head.map((h, i) => [h, vals[i + 1] ?? null])));
	}
	return out;
}
