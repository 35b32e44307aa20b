// Files in the farm's units. A metric farm's season workbook, seed order, crew sheets and demand
// file name metres, centimetres, kilograms, grams and °C, with the values converted; read back
// into a metric farm they give the very figures the database held (to its stored precision).
// A file in the other system's units is read as its headers (or unit cells) name them, and a
// bad value is refused naming its column and the bound in the file's own units.
//
// Conversion factors, exact by definition. Source: NIST Handbook 44, Appendix C (1 ft = 0.3048 m,
// 1 in = 2.54 cm, 1 lb = 0.453 592 37 kg, 1 oz = 28.349 523 125 g; °C = (°F − 32) × 5/9).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import { closeTestDb, testDb } from '../helpers/db';
import { baseUrl } from '../helpers/env';
import type { Client } from '../helpers/http';
import { download, loadWorkbook, signUpFarm, upload, writeHandPlan, type NewFarm } from '../helpers/transfer';

const M_PER_FT = 0.3048;
const CM_PER_IN = 2.54;
const KG_PER_LB = 0.45359237;

let metric: NewFarm;
let seasonId: number;
let book: ExcelJS.Workbook;
let bytes: Buffer;

/** Every row of a sheet as { header: value }. */
function rowsOf(wb: ExcelJS.Workbook, name: string): Record<string, unknown>[] {
	const ws = wb.getWorksheet(name)!;
	const head = (ws.getRow(1).values as unknown[]).slice(1).map(String);
	const out: Record<string, unknown>[] = [];
	ws.eachRow((row, n) => {
		if (n === 1) return;
		out.push(Object.fromEntries(head.map((h, i) => [h, row.getCell(i + 1).value ?? null])));
	});
	return out;
}
const headers = (wb: ExcelJS.Workbook, name: string): string[] =>
	(wb.getWorksheet(name)!.getRow(1).values as unknown[]).slice(1).map(String);

async function setSystem(farmId: number, system: 'metric' | 'imperial'): Promise<void> {
	await testDb()('farms').where({ id: farmId }).update({ unit_system: system });
}

/** The farm's stored library and plan, keyed by name, in the database's own units. */
async function stored(farmId: number) {
	const db = testDb();
	const [beds, crops, varieties, plantings] = await Promise.all([
		db('beds').where({ farm_id: farmId }).orderBy('name').select('name', 'length_ft', 'width_in'),
		db('crops')
			.where({ farm_id: farmId })
			.orderBy('name')
			.select('name', 'harvest_unit', 'heat_limit_f', 'base_temp_f'),
		db('varieties')
			.where({ farm_id: farmId })
			.orderBy('name')
			.select(
				'name',
				'yield_per_bed_foot',
				'in_row_spacing_in',
				'seeds_per_gram',
				'seed_price_cents_per_gram',
				'gdd_to_maturity'
			),
		db('plantings as p')
			.join('varieties as v', 'v.id', 'p.variety_id')
			.where({ 'p.farm_id': farmId })
			.orderBy(['v.name', 'p.field_date', 'p.length_ft'])
			.select('v.name', 'p.start_ft', 'p.length_ft', 'p.in_row_spacing_in', 'p.field_date', 'p.status')
	]);
	return { beds, crops, varieties, plantings };
}

function post(client: Client, to: string, name: string, content: string | Buffer, fields: Record<string, string> = {}) {
	const form = new FormData();
	form.set('file', new Blob([typeof content === 'string' ? content : new Uint8Array(content)]), name);
	for (const [k, v] of Object.entries(fields)) form.set(k, v);
	return client.request(to, { method: 'POST', body: form, headers: { origin: baseUrl(), accept: 'application/json' } });
}

beforeAll(async () => {
	metric = await signUpFarm('units-metric');
	await setSystem(metric.farmId, 'metric');
	({ seasonId } = await writeHandPlan(metric.farmId));
	const got = await download(metric.client, seasonId);
	expect(got.res.status).toBe(200);
	bytes = got.bytes;
	book = await loadWorkbook(bytes);
}, 60_000);
afterAll(closeTestDb);

describe("a metric farm's season workbook", () => {
	it('names metric units in every measured header', () => {
		expect(headers(book, 'Plantings')).toEqual(
			expect.arrayContaining(['Start (m)', 'Length (m)', 'In-row spacing (cm)', 'Expected yield', 'Yield unit'])
		);
		expect(headers(book, 'Beds')).toEqual(expect.arrayContaining(['Length (m)', 'Width (cm)']));
		expect(headers(book, 'Seed order')).toEqual(expect.arrayContaining(['Bed-metres (m)', 'Seed (g)', 'Price ($/g)']));
		expect(headers(book, 'Weekly tasks')).toEqual(expect.arrayContaining(['Start (m)', 'Length (m)', 'Seed (g)']));
		expect(headers(book, 'Crops & varieties')).toEqual(
			expect.arrayContaining([
				'Heat limit (°C)',
				'Base temperature (°C)',
				'Yield per bed-metre (harvest units)',
				'In-row spacing (cm)',
				'Seeds per gram (seeds/g)',
				'Seed price ($/g)',
				'Degree days to maturity (°C·d)'
			])
		);
		const all = book.worksheets.flatMap((ws) => headers(book, ws.name)).join('\n');
		expect(all).not.toMatch(/\((ft|in|oz|°F|°F·d)\)|bed-foot|\$\/oz/);
	});

	it('converts every value with the exact factors (worked by hand)', () => {
		// Beds E1 100 ft × 30 in → 30.48 m × 76.2 cm; W1 50 ft × 42 in → 15.24 m × 106.68 cm.
		const beds = rowsOf(book, 'Beds');
		expect(beds.find((b) => b.Bed === 'E1')!['Length (m)']).toBeCloseTo(100 * M_PER_FT, 10);
		expect(beds.find((b) => b.Bed === 'E1')!['Width (cm)']).toBeCloseTo(30 * CM_PER_IN, 10);
		expect(beds.find((b) => b.Bed === 'W1')!['Width (cm)']).toBeCloseTo(106.68, 10);
		// P1: bed E1 from 0, 50 ft → 15.24 m, 1 in → 2.54 cm; 125 lb of carrots → 56.699 kg, unit kg.
		const p1 = rowsOf(book, 'Plantings').find((r) => r.Bed === 'E1' && r['Start (m)'] === 0)!;
		expect(p1['Length (m)']).toBeCloseTo(15.24, 10);
		expect(p1['In-row spacing (cm)']).toBeCloseTo(2.54, 10);
		expect(p1['Expected yield']).toBeCloseTo(125 * KG_PER_LB, 10);
		expect(p1['Yield unit']).toBe('kg');
		// Lettuce is counted: 108 heads stay 108 heads.
		const p3 = rowsOf(book, 'Plantings').find((r) => r.Bed === 'E2')!;
		expect([p3['Expected yield'], p3['Yield unit']]).toEqual([108, 'head']);
		// Carrot 2.5 lb a bed-foot → 2.5 × 0.45359237 ÷ 0.3048 = 3.7204 kg a bed-metre; harvest unit kg.
		const crops = rowsOf(book, 'Crops & varieties');
		const carrot = crops.find((r) => r.Crop === 'Carrot')!;
		expect(carrot['Harvest unit']).toBe('kg');
		expect(carrot['Yield per bed-metre (harvest units)']).toBeCloseTo((2.5 * KG_PER_LB) / M_PER_FT, 10);
		expect(carrot['Base temperature (°C)']).toBeCloseTo(((40 - 32) * 5) / 9, 10);
		// Lettuce: 2.7 heads a bed-foot → 8.858 heads a bed-metre; heat limit 80 °F → 26.67 °C; 900 °F·d → 500 °C·d.
		const lettuce = crops.find((r) => r.Crop === 'Head lettuce')!;
		expect(lettuce['Yield per bed-metre (harvest units)']).toBeCloseTo(2.7 / M_PER_FT, 10);
		expect(lettuce['Heat limit (°C)']).toBeCloseTo(((80 - 32) * 5) / 9, 10);
		expect(lettuce['Degree days to maturity (°C·d)']).toBeCloseTo(500, 10);
		expect(lettuce['Seeds per gram (seeds/g)']).toBe(800);
		expect(lettuce['Seed price ($/g)']).toBe(2.5);
		// The seed order: 75 bed-feet of Test Amber = 22.86 bed-metres; 6.9 g at $0.90/g.
		const amber = rowsOf(book, 'Seed order').find((r) => r.Variety === 'Test Amber')!;
		expect(amber['Bed-metres (m)']).toBeCloseTo(22.86, 10);
		expect([amber['Seed (g)'], amber['Price ($/g)'], amber['Cost ($)']]).toEqual([6.9, 0.9, 6.21]);
		// The forecast: carrot W27 41.67 lb planned against 20 lb demand → 18.90 kg against 9.07 kg.
		const w27 = rowsOf(book, 'Forecast').find((r) => r.Crop === 'Carrot' && r['Week (ISO)'] === '2027-W27')!;
		expect(w27.Unit).toBe('kg');
		expect(w27.Demand).toBeCloseTo(20 * KG_PER_LB, 10);
	});

	it('imports back into a metric farm with the same stored figures', async () => {
		const twin = await signUpFarm('units-metric-twin');
		await setSystem(twin.farmId, 'metric');
		const res = await upload(twin.client, 'metric.xlsx', bytes);
		expect(res.status, await res.clone().text()).toBe(201);
		const [a, b] = await Promise.all([stored(metric.farmId), stored(twin.farmId)]);
		expect(b.beds).toEqual(a.beds);
		expect(b.crops).toEqual(a.crops);
		expect(b.varieties).toEqual(a.varieties);
		expect(b.plantings).toEqual(a.plantings);
		expect(b.plantings).toHaveLength(4);
	});

	it('imported into its own season again, changes nothing', async () => {
		const res = await upload(metric.client, 'metric.xlsx', bytes, { seasonId: String(seasonId) });
		expect(res.status).toBe(200);
		const { preview } = await res.json();
		expect(preview.changed).toEqual([]);
		expect(preview.added).toEqual([]);
		expect(preview.removed).toEqual([]);
		expect(preview.unchanged).toBe(4);
	});
});

describe('a file in the other system', () => {
	it("an imperial farm reads a metric farm's beds, and a metric farm an imperial one's", async () => {
		const imperial = await signUpFarm('units-imperial');
		const res = await upload(
			imperial.client,
			'beds.csv',
			'Block,Bed,Length (m),Width (cm)\nNorth,N1,30.48,76.2\nNorth,N2,15,100\n',
			{
				sheet: 'Beds'
			}
		);
		expect(res.status, await res.clone().text()).toBe(201);
		const beds = await testDb()('beds')
			.where({ farm_id: imperial.farmId })
			.orderBy('name')
			.select('name', 'length_ft', 'width_in');
		// 15 m ÷ 0.3048 = 49.21 ft → 49.2 (kept to the tenth); 100 cm ÷ 2.54 = 39.37 in → 39 (whole inches).
		expect(beds.map((b) => [b.name, Number(b.length_ft), b.width_in])).toEqual([
			['N1', 100, 30],
			['N2', 49.2, 39]
		]);

		const back = await upload(metric.client, 'beds.csv', 'Block,Bed,Length (ft),Width (in)\nSouth,S9,40,30\n', {
			sheet: 'Beds'
		});
		expect(back.status, await back.clone().text()).toBe(201);
		const s9 = await testDb()('beds').where({ farm_id: metric.farmId, name: 'S9' }).first('length_ft', 'width_in');
		expect([Number(s9.length_ft), s9.width_in]).toEqual([40, 30]);
	});

	it('a crop in kg and kg per bed-metre is stored in lb and lb per bed-foot', async () => {
		const imperial = await signUpFarm('units-imperial-crops');
		const csv =
			'Crop,Family,Harvest unit,Frost tolerance,Variety,Method,Days to maturity (d),Harvest window (d),' +
			'Yield per bed-metre (harvest units),Rows per bed,In-row spacing (cm),Germination (%),Seeds per ounce (seeds/oz),Seed price ($/oz)\n' +
			'Beet,Amaranthaceae,kg,hardy,Test Ruby,direct,55,21,3,4,5.08,80%,"1,700",$5.67\n';
		const res = await upload(imperial.client, 'crops.csv', csv, { sheet: 'Crops & varieties' });
		expect(res.status, await res.clone().text()).toBe(201);
		const crop = await testDb()('crops').where({ farm_id: imperial.farmId, name: 'Beet' }).first('harvest_unit');
		expect(crop.harvest_unit).toBe('lb');
		const v = await testDb()('varieties').where({ farm_id: imperial.farmId, name: 'Test Ruby' }).first();
		// 3 kg/m × 0.3048 ÷ 0.45359237 = 2.0159 lb/ft → 2.016; 5.08 cm = 2 in; 1,700 seeds/oz ÷ 28.3495 = 59.97/g;
		// $5.67/oz ÷ 28.3495 = $0.2000/g → 20 ¢/g.
		expect(Number(v.yield_per_bed_foot)).toBeCloseTo(2.016, 3);
		expect(Number(v.in_row_spacing_in)).toBe(2);
		expect(Number(v.seeds_per_gram)).toBe(59.97);
		expect(v.seed_price_cents_per_gram).toBe(20);
	});

	it('a bad value is refused naming its column as the file heads it, with the bound in its units', async () => {
		const before = await testDb()('beds').where({ farm_id: metric.farmId }).count({ n: '*' }).first();
		const res = await upload(metric.client, 'beds.csv', 'Block,Bed,Length (m),Width (cm)\nSouth,S10,0.1,76\n', {
			sheet: 'Beds'
		});
		expect(res.status).toBe(400);
		const body = await res.json();
		// The least bed length is 0.5 ft = 0.1524 m.
		expect(body.errors).toEqual([
			expect.objectContaining({ row: 2, column: 'C', header: 'Length (m)', message: 'Length must be at least 0.15.' })
		]);
		const after = await testDb()('beds').where({ farm_id: metric.farmId }).count({ n: '*' }).first();
		expect(after).toEqual(before);
	});
});

describe("a metric farm's other files", () => {
	it('the seed order CSV gives bed-metres and grams', async () => {
		const res = await metric.client.get(`/seasons/${seasonId}/seeds/seed-order.csv`);
		expect(res.status).toBe(200);
		const rows = Papa.parse<Record<string, string>>((await res.text()).trim(), { header: true });
		expect(rows.meta.fields).toEqual(expect.arrayContaining(['Bed-metres (m)', 'Seed (g)', 'Price (USD/g)']));
		const amber = rows.data.find((r) => r.Variety === 'Test Amber')!;
		expect([amber['Bed-metres (m)'], amber['Seed (g)'], amber['Price (USD/g)']]).toEqual(['22.86', '6.9', '0.90']);
	});

	it('the crew sheets give metres, centimetres and grams', async () => {
		// W16: P1 direct-sown on 19 Apr 2027, bed E1 0–50 ft = 0–15.24 m, 1 in = 2.54 cm, 4.6 g of seed.
		const res = await metric.client.get(`/seasons/${seasonId}/week/2027-W16/sheets.xlsx`);
		expect(res.status).toBe(200);
		const wb = await loadWorkbook(Buffer.from(await res.arrayBuffer()));
		const row = rowsOf(wb, 'Direct sowing')[0];
		expect(row['To (m)']).toBeCloseTo(15.24, 10);
		expect(row['In-row spacing (cm)']).toBeCloseTo(2.54, 10);
		expect(row['Seed (g)']).toBe(4.6);
	});

	it('the demand file is in kg, and reads back to the same stored lb', async () => {
		const file = await metric.client.get(`/api/seasons/${seasonId}/demand/file?format=csv`);
		const text = await file.text();
		// 2 lb a box of carrots = 0.907 kg (three decimals); 60 heads stay heads.
		expect(text).toContain('Full,Carrot,2027-W27,0.907,kg');
		expect(text).toContain('market,Head lettuce,2027-W21,60,head');
		const res = await post(metric.client, `/api/seasons/${seasonId}/demand/upload`, 'demand.csv', text, {
			mode: 'replace'
		});
		expect(res.status, await res.clone().text()).toBe(200);
		const box = await testDb()('box_items as b')
			.join('share_sizes as s', 's.id', 'b.share_size_id')
			.where({ 's.farm_id': metric.farmId })
			.select('b.quantity', 'b.unit');
		expect(box.map((b) => [Number(b.quantity), b.unit])).toEqual([[2, 'lb']]);
		// The .xlsx download says the same.
		const xlsx = await metric.client.get(`/api/seasons/${seasonId}/demand/file?format=xlsx`);
		const rows = rowsOf(await loadWorkbook(Buffer.from(await xlsx.arrayBuffer())), 'Demand');
		expect(rows.find((r) => r.crop === 'Carrot')).toMatchObject({ quantity: 0.907, unit: 'kg' });
	});

	it('a demand row in lb is read as lb, an empty unit as kg, and kg of a counted crop is refused', async () => {
		const up = (text: string) =>
			post(metric.client, `/api/seasons/${seasonId}/demand/upload`, 'demand.csv', text, { mode: 'merge' });
		const ok = await up('channel,crop,week,quantity,unit\nFull,Carrot,2027-W28,3,lb\nFull,Carrot,2027-W29,1,\n');
		expect(ok.status, await ok.clone().text()).toBe(200);
		const weeks = await testDb()('box_items as b')
			.join('share_sizes as s', 's.id', 'b.share_size_id')
			.where({ 's.farm_id': metric.farmId })
			.orderBy('b.week')
			.select('b.week', 'b.quantity');
		// 1 kg = 2.2046 lb → 2.2 (kept to the hundredth: 2.20).
		expect(weeks.map((w) => [w.week, Number(w.quantity)])).toEqual([
			['2027-W27', 2],
			['2027-W28', 3],
			['2027-W29', 2.2]
		]);
		const bad = await up('channel,crop,week,quantity,unit\nmarket,Head lettuce,2027-W22,5,kg\n');
		expect(bad.status).toBe(400);
		const body = await bad.json();
		expect(JSON.stringify(body)).toMatch(/unit/);
		expect(JSON.stringify(body)).toContain('Head lettuce is counted in head, not kg.');
	});
});

// Last: it changes the plan the tests above read.
describe('an edited metric file', () => {
	it('a length edited in metres previews in metres and is kept in feet', async () => {
		// P1's 15.24 m (50 ft) made 12.192 m (40 ft exactly) in a copy of the file.
		const wb = await loadWorkbook(bytes);
		const ws = wb.getWorksheet('Plantings')!;
		const head = headers(wb, 'Plantings');
		let edited = 0;
		ws.eachRow((row, n) => {
			if (n === 1 || row.getCell(head.indexOf('Bed') + 1).value !== 'E1') return;
			if (row.getCell(head.indexOf('Start (m)') + 1).value !== 0) return;
			row.getCell(head.indexOf('Length (m)') + 1).value = 12.192;
			edited++;
		});
		expect(edited).toBe(1);
		const file = Buffer.from(await wb.xlsx.writeBuffer());
		const res = await upload(metric.client, 'edited.xlsx', file, { seasonId: String(seasonId) });
		expect(res.status).toBe(200);
		const { preview } = await res.json();
		expect(preview.changed).toHaveLength(1);
		expect(preview.changed[0].changes).toEqual(
			expect.arrayContaining([
				expect.objectContaining({ field: 'lengthFt', label: 'Length (m)', from: '15.24', to: '12.19' }),
				// 40 ft × 2.5 lb = 100 lb = 45.36 kg, was 125 lb = 56.7 kg.
				expect.objectContaining({ field: 'expectedYield', from: '56.7 kg', to: '45.36 kg' })
			])
		);
		const apply = await metric.client.request('/api/import/apply', {
			method: 'POST',
			body: JSON.stringify({ token: preview.token }),
			headers: { origin: baseUrl(), 'content-type': 'application/json', accept: 'application/json' }
		});
		expect(apply.status, await apply.clone().text()).toBe(200);
		const p1 = await testDb()('plantings')
			.where({ farm_id: metric.farmId, season_id: seasonId, start_ft: 0 })
			.whereNotNull('bed_id')
			.orderBy('id')
			.first('length_ft', 'expected_yield');
		expect([Number(p1.length_ft), Number(p1.expected_yield)]).toEqual([40, 100]);
	});
});

describe('a farm that keeps its books in euros', () => {
	it('heads and formats money in its currency, and the import reads it back', async () => {
		await testDb()('farms').where({ id: metric.farmId }).update({ currency: 'EUR' });
		const got = await download(metric.client, seasonId);
		const wb = await loadWorkbook(got.bytes);
		expect(headers(wb, 'Crops & varieties')).toContain('Seed price (EUR/g)');
		expect(headers(wb, 'Seed order')).toEqual(expect.arrayContaining(['Price (EUR/g)', 'Cost (EUR)']));
		const ws = wb.getWorksheet('Seed order')!;
		expect(ws.getRow(2).getCell(headers(wb, 'Seed order').indexOf('Cost (EUR)') + 1).numFmt).toContain('€');
		const twin = await signUpFarm('units-euro-twin');
		await setSystem(twin.farmId, 'metric');
		const res = await upload(twin.client, 'euro.xlsx', got.bytes);
		expect(res.status, await res.clone().text()).toBe(201);
		const [a, b] = await Promise.all([stored(metric.farmId), stored(twin.farmId)]);
		expect(b.varieties).toEqual(a.varieties);
	});
});
