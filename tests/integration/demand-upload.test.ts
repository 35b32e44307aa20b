// Demand upload (CSV and .xlsx): refused whole with every bad cell named by row and column, and
// nothing written; a good file written in one go; size-limited; crew leads may not upload.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as XLSX from 'xlsx';
import { Client, signedIn, html } from '../helpers/http';
import { closeTestDb, count, testDb } from '../helpers/db';
import { demo } from '../helpers/env';
import { demandSeason, type DemandFixture } from './demand-fixture';

let fx: DemandFixture;
let share: Client;
let crew: Client;
let fullId: number;
beforeAll(async () => {
	fx = await demandSeason(2032);
	[fullId] = await testDb()('share_sizes').insert({
		farm_id: fx.farmId,
		season_id: fx.seasonId,
		name: 'Full share',
		members: 60,
		first_week: '2032-W24',
		last_week: '2032-W30'
	});
	await testDb()('share_sizes').insert({
		farm_id: fx.farmId,
		season_id: fx.seasonId,
		name: 'Half share',
		members: 40,
		first_week: '2032-W24',
		last_week: '2032-W30'
	});
	[share, crew] = await Promise.all([signedIn(demo.share, demo.password), signedIn(demo.crew, demo.password)]);
});
afterAll(async () => {
	await fx.cleanup();
	await closeTestDb();
});

const path = () => `/api/seasons/${fx.seasonId}/demand/upload`;

function post(
	client: Client,
	file: Blob | null,
	name: string,
	extra: Record<string, string> = {},
	to = path()
): Promise<Response> {
	const form = new FormData();
	if (file) form.set('file', file, name);
	for (const [k, v] of Object.entries(extra)) form.set(k, v);
	return client.request(to, {
		method: 'POST',
		body: form,
		headers: { origin: process.env.FC_BASE_URL!, accept: 'application/json' }
	});
}
const csv = (text: string) => new Blob([text], { type: 'text/csv' });
async function written(): Promise<number> {
	const boxes = await testDb()('box_items as b')
		.join('share_sizes as s', 's.id', 'b.share_size_id')
		.where('s.season_id', fx.seasonId)
		.count({ n: '*' })
		.first();
	return (await count('channel_demand', { season_id: fx.seasonId })) + Number(boxes?.n ?? 0);
}

const badCsv = [
	'channel,crop,week,quantity,unit', // row 1
	'Full share,Carrot,2032-W24,1.5,lb', // row 2: good
	'Full share,Parsley root,2032-W24,1,lb', // row 3: no such crop
	'Half share,Carrot,W24,0.75,lb', // row 4: week not an ISO week
	'market,Carrot,2032-W25,abc,ton', // row 5: quantity and unit both bad (kg is read: a metric farm's weight)
	'farm stand,Kale,2032-W25,4,bunch', // row 6: no such channel
	'Full share,Kale,2032-W31,1,bunch', // row 7: after the share's last week
	'restaurant,Kale,2032-W26,10,lb', // row 8: Kale is counted in bunches
	'full share,carrot,2032-W24,2,', // row 9: the same cell as row 2 (names match in any case)
	',Carrot,2032-W24,1,lb' // row 10: no channel
].join('\n');

describe('who may upload', () => {
	it('no session 401; crew lead 403; nothing written', async () => {
		expect(
			(await post(new Client(), csv('channel,crop,week,quantity\nmarket,Carrot,2032-W24,5'), 'd.csv')).status
		).toBe(401);
		expect((await post(crew, csv('channel,crop,week,quantity\nmarket,Carrot,2032-W24,5'), 'd.csv')).status).toBe(403);
		expect(await written()).toBe(0);
	});
});

describe('a bad file is refused whole', () => {
	it('names every bad cell by row and column, and writes nothing', async () => {
		const res = await post(share, csv(badCsv), 'demand.csv');
		expect(res.status).toBe(400);
		const body = await res.json();
		expect(body.rows.map((e: { row: number; column: string }) => [e.row, e.column])).toEqual([
			[3, 'crop'],
			[4, 'week'],
			[5, 'quantity'],
			[5, 'unit'],
			[6, 'channel'],
			[7, 'week'],
			[8, 'unit'],
			[9, 'week'],
			[10, 'channel']
		]);
		expect(body.errors['rows.3.crop']).toBe('"Parsley root" is not a crop in the library.');
		expect(body.errors['rows.7.week']).toMatch(/2032-W31 is outside Full share's distribution weeks 2032-W24–2032-W30/);
		expect(body.errors['rows.8.unit']).toBe('Kale is counted in bunch, not lb.');
		expect(body.errors['rows.9.week']).toMatch(/Row 2 already gives Carrot for Full share in 2032-W24/);
		expect(body.message).toMatch(/refused whole/);
		expect(await written()).toBe(0);
	});
	it('a header that is not the layout names row 1 and the column', async () => {
		const res = await post(share, csv('channel,crop,when,quantity\nmarket,Carrot,2032-W24,5'), 'demand.csv');
		expect(res.status).toBe(400);
		const rows = (await res.json()).rows.map((e: { row: number; column: string }) => [e.row, e.column]);
		expect(rows).toEqual([
			[1, 'when'],
			[1, 'week']
		]);
	});
	it('a bad .xlsx is refused the same way', async () => {
		const sheet = XLSX.utils.aoa_to_sheet([
			['channel', 'crop', 'week', 'quantity'],
			['market', 'Carrot', '2032-W24', 5],
			['market', 'Carrot', '2032-W25', -2]
		]);
		const book = XLSX.utils.book_new();
		XLSX.utils.book_append_sheet(book, sheet, 'Demand');
		const bytes = XLSX.write(book, { type: 'array', bookType: 'xlsx' }) as ArrayBuffer;
		const res = await post(share, new Blob([bytes]), 'demand.xlsx');
		expect(res.status).toBe(400);
		const body = await res.json();
		expect(body.rows).toEqual([{ row: 3, column: 'quantity', message: 'quantity must be at least 0.' }]);
		expect(await written()).toBe(0);
	});
	it('a zip that is not a workbook says so, not "no rows"', async () => {
		const JSZip = (await import('jszip')).default;
		const zip = new JSZip();
		zip.file('notes.txt', 'not a spreadsheet');
		const res = await post(
			share,
			new Blob([new Uint8Array(await zip.generateAsync({ type: 'uint8array' }))]),
			'demand.xlsx'
		);
		expect(res.status).toBe(400);
		const body = await res.json();
		expect(JSON.stringify(body)).toMatch(/not an \.xlsx workbook/);
		expect(JSON.stringify(body)).not.toMatch(/no rows/);
		expect(await written()).toBe(0);
	});
	it('no file: 400 naming file; an old .xls or a fake .xlsx: 400', async () => {
		const none = await post(share, null, '');
		expect(none.status).toBe(400);
		expect(Object.keys((await none.json()).errors)).toEqual(['file']);
		const fake = await post(share, csv('not a workbook'), 'demand.xlsx');
		expect(fake.status).toBe(400);
		expect((await fake.json()).rows[0].column).toBe('file');
	});
	it('a file over the size limit: 413 naming file', async () => {
		const big = 'channel,crop,week,quantity\n' + 'market,Carrot,2032-W24,5\n'.repeat(12_000); // ≈ 300 KB > 256 KB
		const res = await post(share, csv(big), 'big.csv');
		expect(res.status).toBe(413);
		expect((await res.json()).rows[0]).toMatchObject({ column: 'file' });
		expect(await written()).toBe(0);
	});
});

describe('a good file', () => {
	it('CSV: every row written; the targets come out as worked by hand', async () => {
		const res = await post(
			share,
			csv(
				[
					'channel,crop,week,quantity,unit',
					'Full share,Carrot,2032-W24,1.5,lb',
					'Half share,Carrot,2032-W24,0.75,',
					'market,Carrot,2032-W24,20,lb',
					'restaurant,Kale,2032-W30,6,bunch'
				].join('\r\n')
			),
			'demand.csv'
		);
		expect(res.status).toBe(200);
		expect(await res.json()).toEqual({ ok: true, rows: 4, set: 4, cleared: 0 });
		const demand = await (await crew.get(`/api/seasons/${fx.seasonId}/demand`)).json();
		// Carrot W24: 60 × 1.5 lb + 40 × 0.75 lb + 20 lb = 90 + 30 + 20 = 140 lb; Kale W30: 6 bunches
		expect(demand.targets).toHaveLength(2);
		expect(demand.targets).toContainEqual({ crop: fx.crop('Carrot'), week: '2032-W24', quantity: 140 });
		expect(demand.targets).toContainEqual({ crop: fx.crop('Kale'), week: '2032-W30', quantity: 6 });
		expect((await testDb()('box_items').where({ share_size_id: fullId }).first()).unit).toBe('lb');
	});
	it('.xlsx, merge: changes one cell and clears another with 0, keeping the rest', async () => {
		const sheet = XLSX.utils.aoa_to_sheet([
			['Channel', 'Crop', 'Week', 'Quantity'],
			['Full share', 'Carrot', '2032-W24', 2],
			['market', 'Carrot', '2032-W24', 0]
		]);
		const book = XLSX.utils.book_new();
		XLSX.utils.book_append_sheet(book, sheet, 'Demand');
		const res = await post(
			share,
			new Blob([XLSX.write(book, { type: 'array', bookType: 'xlsx' }) as ArrayBuffer]),
			'demand.xlsx'
		);
		expect(res.status).toBe(200);
		expect(await res.json()).toEqual({ ok: true, rows: 2, set: 1, cleared: 1 });
		const demand = await (await share.get(`/api/seasons/${fx.seasonId}/demand`)).json();
		// Carrot W24: 60 × 2 lb + 40 × 0.75 lb + no market = 120 + 30 = 150 lb
		expect(demand.targets).toContainEqual({ crop: fx.crop('Carrot'), week: '2032-W24', quantity: 150 });
		expect(demand.targets).toHaveLength(2);
	});
	it('replace: the file becomes the whole demand', async () => {
		const res = await post(share, csv('channel,crop,week,quantity\nmarket,Kale,2032-W26,9'), 'demand.csv', {
			mode: 'replace'
		});
		expect(res.status).toBe(200);
		expect(await written()).toBe(1);
		const bad = await post(share, csv('channel,crop,week,quantity\nmarket,Kale,2032-W26,9'), 'demand.csv', {
			mode: 'wipe'
		});
		expect(bad.status).toBe(400);
		expect(Object.keys((await bad.json()).errors)).toEqual(['mode']);
	});
});

describe('the upload form on the page', () => {
	it('shows every bad cell by row and column, writes nothing; crew lead 403', async () => {
		const page = `/seasons/${fx.seasonId}/demand?/upload`;
		const before = await written();
		const form = new FormData();
		form.set('file', csv(badCsv), 'demand.csv');
		const res = await share.request(page, {
			method: 'POST',
			body: form,
			headers: { origin: process.env.FC_BASE_URL!, accept: 'text/html' }
		});
		expect(res.status).toBe(400);
		const text = await html(res);
		expect(text).toContain('The file was refused whole; nothing was written. 9 problems');
		expect(text).toContain('"Parsley root" is not a crop in the library.');
		expect(await written()).toBe(before);
		const again = new FormData();
		again.set('file', csv('channel,crop,week,quantity\nmarket,Kale,2032-W26,1'), 'demand.csv');
		expect(
			(
				await crew.request(page, {
					method: 'POST',
					body: again,
					headers: { origin: process.env.FC_BASE_URL!, accept: 'text/html' }
				})
			).status
		).toBe(403);
	});
});
