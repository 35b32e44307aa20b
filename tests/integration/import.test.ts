// Importing workbooks and CSV files: only the owner may; a bad file is refused whole with
// every bad cell named by sheet, row and column, and nothing is written; the demo season,
// exported and imported into an empty farm, comes back as the same plan.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, signedIn } from '../helpers/http';
import { closeTestDb, count, testDb } from '../helpers/db';
import { baseUrl, demo } from '../helpers/env';
import { download, libraryOf, loadWorkbook, planOf, signUpFarm, upload, writeHandPlan } from '../helpers/transfer';

afterAll(closeTestDb);

let demoFarmId: number;
let demoSeasonId: number;
let demoFile: Buffer;

beforeAll(async () => {
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	demoFarmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	demoSeasonId = (await testDb()('seasons').where({ farm_id: demoFarmId, year: 2027 }).first('id')).id;
	const got = await download(await signedIn(demo.owner, demo.password), demoSeasonId);
	expect(got.res.status).toBe(200);
	demoFile = got.bytes;
});

async function farmRows(farmId: number): Promise<Record<string, number>> {
	const out: Record<string, number> = {};
	for (const t of ['crops', 'varieties', 'blocks', 'beds', 'seasons', 'plantings'])
		out[t] = await count(t, { farm_id: farmId });
	return out;
}
const nothing = { crops: 0, varieties: 0, blocks: 0, beds: 0, seasons: 0, plantings: 0 };
/** A plan as the grower types it, sorted: the figures the import works out again are left out. */
const workedOut = new Set(['tray_sow_date', 'first_harvest', 'last_harvest', 'expected_yield', 'seeds_needed']);
const typed = (plan: Record<string, unknown>[]): string[] =>
	plan.map((p) => JSON.stringify(Object.entries(p).filter(([k]) => !workedOut.has(k)))).sort();

describe('who may import', () => {
	it('no session: 401', async () => {
		expect((await upload(new Client(), 'plan.xlsx', demoFile)).status).toBe(401);
	});
	it('crew lead and share manager: 403, and nothing is written', async () => {
		const before = await farmRows(demoFarmId);
		for (const who of [demo.crew, demo.share]) {
			const res = await upload(await signedIn(who, demo.password), 'plan.xlsx', demoFile);
			expect(res.status, who).toBe(403);
		}
		expect(await farmRows(demoFarmId)).toEqual(before);
	});
	it("the page's import action is the owner's too", async () => {
		const crew = await signedIn(demo.crew, demo.password);
		const form = new FormData();
		form.set('file', new Blob([new Uint8Array(demoFile)]), 'plan.xlsx');
		const res = await crew.request(`/seasons/${demoSeasonId}/transfer?/import`, {
			method: 'POST',
			body: form,
			headers: { origin: baseUrl(), accept: 'text/html' }
		});
		expect(res.status).toBe(403);
	});
	it('a season of another farm answers 404', async () => {
		const other = await signUpFarm('import-404');
		const res = await upload(other.client, 'plan.xlsx', demoFile, { seasonId: String(demoSeasonId) });
		expect(res.status).toBe(404);
		expect(await farmRows(other.farmId)).toEqual(nothing);
	});
});

describe('round trip: the demo season into an empty farm', () => {
	it('creates the season and gives the same plan, beds and varieties', async () => {
		const fresh = await signUpFarm('roundtrip');
		expect(await farmRows(fresh.farmId)).toEqual(nothing);
		const res = await upload(fresh.client, 'furrowcast-demo-2027.xlsx', demoFile);
		expect(res.status).toBe(201);
		const out = await res.json();
		const season = await testDb()('seasons').where({ farm_id: fresh.farmId, year: 2027 }).first();
		expect(out).toMatchObject({
			seasonId: season.id,
			seasonCreated: true,
			plantings: await count('plantings', { season_id: demoSeasonId })
		});
		expect(season.name).toBe('2027 season');
		expect([season.starts_on, season.ends_on]).toEqual(['2027-01-01', '2027-12-31']);

		// The same plantings, figure for figure. Tray sowing, harvest dates, yield and seeds are worked
		// out again as a grid edit would, with the new farm's own latitude and climate (checked by
		// hand on the small plan below), so only what the grower typed is compared here.
		const demoPlan = typed(await planOf(demoFarmId, demoSeasonId));
		expect(demoPlan.length).toBeGreaterThan(100);
		expect(typed(await planOf(fresh.farmId, season.id))).toEqual(demoPlan);
		const [a, b] = await Promise.all([libraryOf(demoFarmId), libraryOf(fresh.farmId)]);
		expect(b.beds).toEqual(a.beds);
		expect(b.varieties).toEqual(a.varieties);
		expect(b.crops).toEqual(a.crops);
	});

	it('a hand-made plan too: a crop without varieties, heat limits, degree days, failed and unplaced plantings', async () => {
		const source = await signUpFarm('roundtrip-src');
		const { seasonId } = await writeHandPlan(source.farmId);
		const file = (await download(source.client, seasonId)).bytes;
		const target = await signUpFarm('roundtrip-dst');
		const res = await upload(target.client, 'hand.xlsx', file);
		const out = await res.json();
		expect(res.status, JSON.stringify(out)).toBe(201);
		const { seasonId: newSeason } = out;
		// Both farms have the same frost dates and no weekly temperatures, so every figure comes back
		// as it was, except where the hand-written plan was off: its lettuce (transplanted, 42 days to
		// maturity, counted from the field date; 10-day harvest window) is ready on field date + 42 d,
		// not + 44 d. Source: the days-to-maturity convention for transplants, common practice (no
		// published source); arithmetic by hand.
		const fixed = (await planOf(source.farmId, seasonId)).map((p) =>
			p.crop !== 'Head lettuce'
				? p
				: p.field_date === '2027-04-12'
					? { ...p, first_harvest: '2027-05-24', last_harvest: '2027-06-02' }
					: { ...p, first_harvest: '2027-05-31', last_harvest: '2027-06-09' }
		);
		expect(await planOf(target.farmId, newSeason)).toEqual(fixed);
		expect(await libraryOf(target.farmId)).toEqual(await libraryOf(source.farmId));
		// Importing it again only previews: the file's plantings carry other ids (another farm's), so
		// they are refused by row rather than doubled, and nothing is written.
		const before = await farmRows(target.farmId);
		const again = await upload(target.client, 'hand.xlsx', file);
		expect(again.status).toBe(400);
		const body = await again.json();
		expect(body.errors).toHaveLength(4);
		expect(body.errors[0]).toMatchObject({
			sheet: 'Plantings',
			row: 2,
			header: 'Planting id',
			message: expect.stringMatching(/No planting with id \d+ in this season/)
		});
		expect(await farmRows(target.farmId)).toEqual(before);
	});

	it('an edited row is worked out again, not kept with stale figures (a new season)', async () => {
		const source = await signUpFarm('rederive-src');
		const { seasonId } = await writeHandPlan(source.farmId);
		const wb = await loadWorkbook((await download(source.client, seasonId)).bytes);
		const ws = wb.getWorksheet('Plantings')!;
		const head = (ws.getRow(1).values as unknown[]).slice(1).map(String);
		const cell = (row: number, h: string) => ws.getRow(row).getCell(head.indexOf(h) + 1);
		let p2 = 0;
		ws.eachRow((r, n) => {
			if (n > 1 && cell(n, 'Start (ft)').value === 50) p2 = n;
		});
		expect(p2).toBeGreaterThan(1);
		// P2 (carrot, E1 from 50 ft) lengthened from 25 to 30 ft, its worked-out cells left blank.
		cell(p2, 'Length (ft)').value = 30;
		for (const h of ['First harvest (date)', 'Last harvest (date)', 'Expected yield', 'Seeds needed (seeds)'])
			cell(p2, h).value = null;
		const target = await signUpFarm('rederive-dst');
		const res = await upload(target.client, 'edited.xlsx', Buffer.from(await wb.xlsx.writeBuffer()));
		expect(res.status, await res.clone().text()).toBe(201);
		const got = await testDb()('plantings').where({ farm_id: target.farmId, start_ft: 50 }).first();
		// Source: arithmetic by hand from the variety's figures (4 rows at 1 in, 1 seed per spot, 75 %
		// germination, 15 % margin, 2.5 lb a bed-foot, 70 days to maturity, 21-day window):
		// 30 ft × 12 spots/ft × 4 rows = 1,440 seeds ÷ 0.75 × 1.15 = 2,208; 30 × 2.5 = 75 lb;
		// 3 May + 70 d = 12 Jul, + 20 d = 1 Aug.
		expect(Number(got.length_ft)).toBe(30);
		expect(got.seeds_needed).toBe(2208);
		expect(Number(got.expected_yield)).toBe(75);
		expect([got.first_harvest, got.last_harvest]).toEqual(['2027-07-12', '2027-08-01']);
	});

	it('through the farm Import page: 303 to the new season', async () => {
		const fresh = await signUpFarm('roundtrip-page');
		const form = new FormData();
		form.set('file', new Blob([new Uint8Array(demoFile)]), 'plan.xlsx');
		const res = await fresh.client.request('/import?/import', {
			method: 'POST',
			body: form,
			headers: { origin: baseUrl(), accept: 'text/html' }
		});
		expect(res.status).toBe(303);
		const season = await testDb()('seasons').where({ farm_id: fresh.farmId, year: 2027 }).first('id');
		expect(res.headers.get('location')).toMatch(
			new RegExp(`^/seasons/${season.id}/transfer\\?imported=1&.*plantings=\\d+`)
		);
	});
});

describe('a bad workbook is refused whole, every bad cell named', () => {
	it('lists each cell by sheet, row and column, and writes nothing', async () => {
		const wb = await loadWorkbook(demoFile);
		const plantings = wb.getWorksheet('Plantings')!;
		// Columns by our headers: F Length (ft), L Field date, B Variety, D Bed, S Status.
		plantings.getCell('F3').value = 'lots';
		plantings.getCell('L4').value = '2027-02-30';
		plantings.getCell('B5').value = 'No Such Variety';
		plantings.getCell('D6').value = 'Z99';
		plantings.getCell('S7').value = 'eaten';
		wb.getWorksheet('Beds')!.getCell('E2').value = -5;
		wb.getWorksheet('Crops & varieties')!.getCell('C2').value = 'crate';
		// Germination: a number above 1 in a "(%)" column is a percent (85 = 85 %), so 170 % is refused.
		wb.getWorksheet('Crops & varieties')!.getCell('P3').value = 170;
		const bad = Buffer.from(await wb.xlsx.writeBuffer());

		const fresh = await signUpFarm('import-bad');
		const res = await upload(fresh.client, 'bad.xlsx', bad);
		expect(res.status).toBe(400);
		const body = await res.json();
		const cells = body.errors.map(
			(e: { sheet: string; row: number; column: string }) => `${e.sheet}!${e.column}${e.row}`
		);
		expect(cells).toEqual(
			expect.arrayContaining([
				'Plantings!F3',
				'Plantings!L4',
				'Plantings!B5',
				'Plantings!D6',
				'Plantings!S7',
				'Beds!E2',
				'Crops & varieties!C2',
				'Crops & varieties!P3'
			])
		);
		expect(body.errors.find((e: { column: string; row: number }) => e.column === 'L' && e.row === 4).message).toMatch(
			/not a real calendar date/
		);
		expect(body.errors.find((e: { column: string; row: number }) => e.column === 'F' && e.row === 3).header).toBe(
			'Length (ft)'
		);
		expect(body.message).toMatch(/^Nothing was imported/);
		expect(await farmRows(fresh.farmId)).toEqual(nothing);
	});
	it('a missing column is named once, at the header row', async () => {
		const wb = await loadWorkbook(demoFile);
		wb.getWorksheet('Beds')!.getCell('E1').value = 'Size';
		const res = await upload(
			(await signUpFarm('import-col')).client,
			'bad.xlsx',
			Buffer.from(await wb.xlsx.writeBuffer())
		);
		expect(res.status).toBe(400);
		expect((await res.json()).errors).toEqual([
			expect.objectContaining({
				sheet: 'Beds',
				row: 1,
				header: 'Length (ft)',
				message: expect.stringMatching(/missing/)
			})
		]);
	});
});

describe('CSV', () => {
	const beds =
		'Block,Block order,Bed,Walking order,Length (ft),Width (in)\nEast,1,E1,1,100,30\nEast,1,E2,2,80,30\nHill,2,H1,1,50,\n';
	it('beds from a CSV: blocks and beds created', async () => {
		const fresh = await signUpFarm('csv-beds');
		const res = await upload(fresh.client, 'beds.csv', beds);
		expect(res.status).toBe(201);
		expect(await res.json()).toMatchObject({ beds: 3, blocks: 2, plantings: 0, seasonId: null });
		const lib = await libraryOf(fresh.farmId);
		expect(lib.beds).toEqual([
			{ block: 'East', block_position: 1, name: 'E1', length_ft: 100, width_in: 30, position: 1 },
			{ block: 'East', block_position: 1, name: 'E2', length_ft: 80, width_in: 30, position: 2 },
			{ block: 'Hill', block_position: 2, name: 'H1', length_ft: 50, width_in: 30, position: 1 } // blank width: the 30 in default
		]);
	});
	it('bad CSV rows named by row and column; nothing written', async () => {
		const fresh = await signUpFarm('csv-bad');
		const res = await upload(
			fresh.client,
			'beds.csv',
			'Block,Bed,Length (ft),Width (in)\nEast,E1,100,30\n,E2,abc,30\nEast,E1,50,0\n'
		);
		expect(res.status).toBe(400);
		const cells = (await res.json()).errors.map((e: { row: number; column: string }) => `${e.column}${e.row}`);
		// Row 3: no block (A), length not a number (C); row 4: E1 again (B), width 0 (D).
		expect(cells.sort()).toEqual(['A3', 'B4', 'C3', 'D4']);
		expect(await farmRows(fresh.farmId)).toEqual(nothing);
	});
	it('crops and plantings from CSV, into a season named by the upload', async () => {
		const fresh = await signUpFarm('csv-plan');
		await writeHandPlan(fresh.farmId);
		const [season2] = await testDb()('seasons').insert({
			farm_id: fresh.farmId,
			year: 2028,
			name: 'Next year',
			starts_on: '2028-01-01',
			ends_on: '2028-12-31'
		});
		const crops =
			'Crop,Family,Harvest unit,Frost tolerance,Variety,Method,Days to maturity (d),Harvest window (d),Yield per bed-foot (harvest units),Rows per bed,In-row spacing (in),Germination (%),Seeds per gram (seeds/g),Seed price ($/g)\nBeet,Amaranthaceae,Bunch,hardy,Test Ruby,direct,55,21,3,4,3,80%,55,$0.20\n';
		expect((await upload(fresh.client, 'crops.csv', crops)).status).toBe(201);
		const v = await testDb()('varieties').where({ farm_id: fresh.farmId, name: 'Test Ruby' }).first();
		expect([Number(v.germination_rate), v.seed_price_cents_per_gram, Number(v.margin), v.cells_per_tray]).toEqual([
			0.8, 20, 0.1, 128
		]);
		const plan =
			'Crop,Variety,Bed,Start (ft),Length (ft),Rows,In-row spacing (in),Method,Field date,First harvest (date),Last harvest (date)\nBeet,Test Ruby,W1,0,50,4,3,direct,2028-04-10,2028-06-05,2028-06-25\n';
		const noSeason = await upload(fresh.client, 'plan.csv', plan);
		expect(noSeason.status).toBe(400);
		expect((await noSeason.json()).errors[0].sheet).toBe('Season');
		const res = await upload(fresh.client, 'plan.csv', plan, { seasonId: String(season2) });
		expect(res.status).toBe(201);
		expect(await planOf(fresh.farmId, season2)).toEqual([
			expect.objectContaining({
				crop: 'Beet',
				variety: 'Test Ruby',
				bed: 'W1',
				length_ft: 50,
				field_date: '2028-04-10',
				status: 'planned'
			})
		]);
	});
});

describe('size and type', () => {
	let owner: Client;
	let farmId: number;
	beforeAll(async () => {
		({ client: owner, farmId } = await signUpFarm('import-size'));
	});
	it('over 5 MB: 413, naming the limit', async () => {
		const big = new Uint8Array(5 * 1024 * 1024 + 10);
		big.set([0x50, 0x4b, 0x03, 0x04]);
		const res = await owner.request('/api/import', {
			method: 'POST',
			body: (() => {
				const f = new FormData();
				f.set('file', new Blob([big]), 'big.xlsx');
				return f;
			})(),
			headers: { origin: baseUrl(), accept: 'application/json' }
		});
		expect(res.status).toBe(413);
		expect((await res.json()).message).toMatch(/5 MB/);
	});
	it('wrong file types: 415', async () => {
		expect((await upload(owner, 'notes.pdf', '%PDF-1.4 not a sheet')).status).toBe(415);
		expect((await upload(owner, 'fake.xlsx', 'Crop,Family\n')).status).toBe(415);
		expect((await upload(owner, 'zip.csv', demoFile)).status).toBe(415);
		const raw = await owner.json('/api/import', 'POST', { file: 'x' });
		expect(raw.status).toBe(415);
		expect(await farmRows(farmId)).toEqual(nothing);
	});
	it('no file, or a zip that is no workbook: 400', async () => {
		const empty = new FormData();
		empty.set('sheet', 'Beds');
		const res = await owner.request('/api/import', {
			method: 'POST',
			body: empty,
			headers: { origin: baseUrl(), accept: 'application/json' }
		});
		expect(res.status).toBe(400);
		expect((await res.json()).errors[0].header).toBe('file');
		expect((await upload(owner, 'broken.xlsx', new Uint8Array([0x50, 0x4b, 0x03, 0x04, 1, 2, 3]))).status).toBe(400);
		expect((await upload(owner, 'beds.csv', 'Block,Bed\n', { sheet: 'Barn' })).status).toBe(400);
	});
});
