// The season workbook: who may download it, and what is in it, read back with exceljs and,
// independently, with SheetJS (xlsx). Figures are worked by hand from the invented plan in
// tests/helpers/transfer.ts, never by calling the export's own code.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import * as XLSX from 'xlsx';
import { Client, signedIn } from '../helpers/http';
import { closeTestDb, count, testDb } from '../helpers/db';
import { demo } from '../helpers/env';
import { download, loadWorkbook, sheetRecords, signUpFarm, writeHandPlan, type NewFarm } from '../helpers/transfer';

// Source: NIST Handbook 44, Appendix C: 1 ounce (avoirdupois) = 28.349 523 125 g exactly.
const G_PER_OZ = 28.349523125;

afterAll(closeTestDb);

const sheetNames = ['Season', 'Plantings', 'Seed order', 'Weekly tasks', 'Forecast', 'Crops & varieties', 'Beds'];

let demoSeasonId: number;
let farm: NewFarm;
let seasonId: number;
let wb: ExcelJS.Workbook;
let sj: XLSX.WorkBook;
let bytes: Buffer;
let headers: Headers;

beforeAll(async () => {
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	const demoFarm = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	demoSeasonId = (await testDb()('seasons').where({ farm_id: demoFarm, year: 2027 }).first('id')).id;
	farm = await signUpFarm('export');
	seasonId = (await writeHandPlan(farm.farmId)).seasonId;
	const got = await download(farm.client, seasonId);
	expect(got.res.status).toBe(200);
	headers = got.res.headers;
	bytes = got.bytes;
	wb = await loadWorkbook(bytes);
	// cellStyles makes SheetJS read the <cols> widths.
	sj = XLSX.read(bytes, { type: 'buffer', cellDates: true, cellStyles: true, bookFiles: true });
});

/** Rows of a sheet as objects keyed by header, read by exceljs. */
function rowsOf(name: string): Record<string, unknown>[] {
	const ws = wb.getWorksheet(name)!;
	const head = (ws.getRow(1).values as unknown[]).slice(1) as string[];
	const out: Record<string, unknown>[] = [];
	for (let n = 2; n <= ws.rowCount; n++) {
		const vals = ws.getRow(n).values as unknown[];
		out.push(Object.fromEntries(head.map((h, i) => [h, vals[i + 1] ?? null])));
	}
	return out;
}

describe('who may export', () => {
	it('no session: 401', async () => {
		expect((await new Client().get(`/api/seasons/${demoSeasonId}/export`)).status).toBe(401);
	});
	it('every role of the farm may download it (crew lead and share manager too)', async () => {
		for (const who of [demo.owner, demo.crew, demo.share]) {
			const { res, bytes } = await download(await signedIn(who, demo.password), demoSeasonId);
			expect(res.status, who).toBe(200);
			expect(bytes.subarray(0, 2).toString(), who).toBe('PK');
		}
	});
	it("another farm's season and a made-up id answer 404", async () => {
		expect((await download(farm.client, demoSeasonId)).res.status).toBe(404);
		expect((await download(farm.client, 99_999_999)).res.status).toBe(404);
		expect((await download(farm.client, Number.NaN)).res.status).toBe(404);
	});
});

describe('the response', () => {
	it('is an .xlsx attachment with a file name, and says how many rows it streams', () => {
		expect(headers.get('content-type')).toBe('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet');
		expect(headers.get('content-disposition')).toMatch(
			/^attachment; filename="furrowcast-testbrook-export-invented-2027\.xlsx"$/
		);
		// 6 season rows + 4 plantings + 2 seed rows + tasks + forecast + 3 crop rows + 3 beds: at least 18.
		expect(Number(headers.get('x-furrowcast-rows'))).toBeGreaterThanOrEqual(18);
		expect(Number(headers.get('x-furrowcast-estimated-bytes'))).toBeGreaterThan(bytes.length / 4);
	});
});

describe('read with exceljs', () => {
	it('holds our sheets in order', () => {
		expect(wb.worksheets.map((w) => w.name)).toEqual(sheetNames);
	});
	it('every sheet freezes its header row and sets every column width', () => {
		for (const ws of wb.worksheets) {
			expect(ws.views[0], ws.name).toMatchObject({ state: 'frozen', ySplit: 1 });
			const head = ws.getRow(1);
			for (let c = 1; c <= head.cellCount; c++) {
				expect(head.getCell(c).font?.bold, `${ws.name} header ${c}`).toBe(true);
				expect(ws.getColumn(c).width, `${ws.name} column ${c}`).toBeGreaterThan(5);
			}
		}
	});
	it('units stand in the headers', () => {
		const head = (name: string): unknown[] => (wb.getWorksheet(name)!.getRow(1).values as unknown[]).slice(1);
		expect(head('Plantings')).toEqual(
			expect.arrayContaining(['Start (ft)', 'Length (ft)', 'In-row spacing (in)', 'Field date', 'Seeds needed (seeds)'])
		);
		expect(head('Seed order')).toEqual(
			expect.arrayContaining(['Seeds (seeds)', 'Seed (oz)', 'Packets', 'Cost ($)', 'Bed-feet (ft)', 'Price ($/oz)'])
		);
		expect(head('Beds')).toEqual(expect.arrayContaining(['Length (ft)', 'Width (in)']));
		expect(head('Crops & varieties')).toEqual(
			expect.arrayContaining([
				'Heat limit (°F)',
				'Days to maturity (d)',
				'Germination (%)',
				'Seed price ($/oz)',
				'Seeds per ounce (seeds/oz)'
			])
		);
	});
	it('plantings: dates are dates, numbers are numbers, one row per planting', async () => {
		const rows = rowsOf('Plantings');
		expect(rows).toHaveLength(await count('plantings', { season_id: seasonId }));
		const p1 = rows.find((r) => r.Bed === 'E1' && r['Start (ft)'] === 0)!;
		expect(p1['Field date']).toBeInstanceOf(Date);
		expect((p1['Field date'] as Date).toISOString().slice(0, 10)).toBe('2027-04-19');
		expect((p1['Actual field date'] as Date).toISOString().slice(0, 10)).toBe('2027-04-20');
		expect(p1['Field week (ISO)']).toBe('2027-W16'); // 19 Apr 2027 is 105 days (15 weeks) after Monday 4 Jan (W01)
		expect(p1['Length (ft)']).toBe(50);
		expect(p1['Rows']).toBe(4);
		expect(p1['Status']).toBe('sown');
		expect(p1['Notes']).toBe('Row cover on');
		const p4 = rows.find((r) => r.Status === 'failed')!;
		expect(p4.Bed).toBeNull();
		expect(wb.getWorksheet('Plantings')!.getCell('L2').numFmt).toMatch(/yy/);
	});
	it('seed order: seeds, grams, packets and cost per variety (worked by hand)', () => {
		const rows = rowsOf('Seed order');
		const amber = rows.find((r) => r.Variety === 'Test Amber')!;
		// P1: 50 ft × 12 in ÷ 1 in = 600 spots a row × 4 rows = 2,400; seeds = ceil(2,400 ÷ 0.75 × 1.15) = 3,680; 3,680 ÷ 800 = 4.6 g → 414 ¢.
		// P2: 25 ft → 1,200 spots; ceil(1,200 ÷ 0.75 × 1.15) = 1,840 seeds; 2.3 g → 207 ¢.
		// Σ 5,520 seeds, 6.9 g, $6.21; packets ceil(5,520 ÷ 1,500) = 4; 75 bed-feet.
		// An imperial farm reads seed in ounces: 6.9 g ÷ 28.349523125 g/oz (NIST Handbook 44, App. C) = 0.2434 oz,
		// and $0.90/g × 28.349523125 = $25.51/oz.
		expect(amber).toMatchObject({
			Plantings: 2,
			'Bed-feet (ft)': 75,
			'Seeds (seeds)': 5520,
			Packets: 4,
			'Cost ($)': 6.21,
			Cells: null
		});
		expect(amber['Seed (oz)']).toBeCloseTo(6.9 / G_PER_OZ, 10);
		expect(amber['Price ($/oz)']).toBeCloseTo(0.9 * G_PER_OZ, 10);
		const butter = rows.find((r) => r.Variety === 'Test Butter')!;
		// P3: 40 ft × 12 ÷ 12 = 40 a row × 3 = 120 plants; cells ceil(120 ÷ 0.9 × 1.15) = ceil(153.3) = 154; trays ceil(154 ÷ 128) = 2;
		//     154 seeds ÷ 800 = 0.1925 g, rounded up to 0.20 g → 50 ¢.
		// P4 (failed, still sown): 60 plants; cells ceil(76.7) = 77; 1 tray; 77 ÷ 800 = 0.096 → 0.10 g → 25 ¢.
		// The order is rounded once, at the end, not planting by planting: Σ 231 seeds ÷ 800 = 0.28875 g, up to 0.29 g;
		// cost 0.29 g × $2.50 = $0.725 → $0.73; 231 cells, 3 trays; packets ceil(231 ÷ 1,000) = 1.
		expect(butter).toMatchObject({
			Plantings: 2,
			'Seeds (seeds)': 231,
			Packets: 1,
			'Cost ($)': 0.73,
			Cells: 231,
			Trays: 3
		});
		expect(butter['Seed (oz)']).toBeCloseTo(0.29 / G_PER_OZ, 10);
		// The sheet's own columns add up on every row: cost = ounces × price per ounce, to the cent.
		for (const r of rows)
			expect(Math.abs(Number(r['Cost ($)']) - Number(r['Seed (oz)']) * Number(r['Price ($/oz)']))).toBeLessThanOrEqual(
				0.005 + 1e-9
			);
		const cost = wb.getWorksheet('Seed order')!.getRow(1).values as unknown[];
		const costCol = cost.indexOf('Cost ($)');
		expect(wb.getWorksheet('Seed order')!.getRow(2).getCell(costCol).numFmt).toContain('$');
	});
	it('weekly tasks: each kind of work in its ISO week (worked by hand)', () => {
		const rows = rowsOf('Weekly tasks');
		const find = (week: string, task: string) => rows.filter((r) => r['Week (ISO)'] === week && r.Task === task);
		// Tray sowing of P3 on Mon 15 Mar 2027 = day 74, 70 days after 4 Jan → W11: 154 cells in 2 trays.
		expect(find('2027-W11', 'Tray sowing')).toEqual([
			expect.objectContaining({ Crop: 'Head lettuce', Quantity: 154, Unit: 'cells', Trays: 2 })
		]);
		expect((find('2027-W11', 'Tray sowing')[0]['Week starts (date)'] as Date).toISOString().slice(0, 10)).toBe(
			'2027-03-15'
		);
		// P3 transplanted Mon 12 Apr (W15), 120 plants; P1 sown Mon 19 Apr (W16), 3,680 seeds, 4.6 g.
		expect(find('2027-W15', 'Transplanting')).toEqual([
			expect.objectContaining({ Bed: 'E2', Quantity: 120, Unit: 'plants' })
		]);
		expect(find('2027-W16', 'Direct sowing')).toEqual([
			expect.objectContaining({ Bed: 'E1', Quantity: 3680, Unit: 'seeds' })
		]);
		expect(find('2027-W16', 'Direct sowing')[0]['Seed (oz)']).toBeCloseTo(4.6 / G_PER_OZ, 10);
		// P3 harvest Wed 26 May – Fri 4 Jun, 108 heads over 10 days = 10.8 a day: W21 gets 26–30 May = 5 days = 54; W22 gets 31 May–4 Jun = 54.
		expect(find('2027-W21', 'Harvest')).toEqual([
			expect.objectContaining({ Crop: 'Head lettuce', Quantity: 54, Unit: 'head' })
		]);
		expect(find('2027-W22', 'Harvest')).toEqual([expect.objectContaining({ Quantity: 54 })]);
		// The failed P4 gives no work at all (its tray sowing would be W12).
		expect(find('2027-W12', 'Tray sowing')).toEqual([]);
	});
	it('forecast against demand (worked by hand)', () => {
		const rows = rowsOf('Forecast');
		const at = (crop: string, week: string) => rows.find((r) => r.Crop === crop && r['Week (ISO)'] === week);
		// Lettuce W21: 40 ft × 2.7 heads = 108 over 10 days → 54 in W21 against market 60: 6 short.
		expect(at('Head lettuce', '2027-W21')).toMatchObject({
			'Planned harvest': 54,
			Demand: 60,
			Shortfall: 6,
			Surplus: 0,
			Unit: 'head'
		});
		expect(at('Head lettuce', '2027-W22')).toMatchObject({ 'Planned harvest': 54, Demand: 0, Surplus: 54 });
		// Carrot W27: P1 gives 50 × 2.5 = 125 lb over 21 days, 7 in W27 → 41.67 lb; share 10 members × 2 lb = 20 → 21.67 over.
		expect(at('Carrot', '2027-W27')).toMatchObject({
			'Planned harvest': 41.67,
			Demand: 20,
			Shortfall: 0,
			Surplus: 21.67
		});
	});
	it('crops and varieties, with a crop that has no variety yet, and beds', () => {
		const crops = rowsOf('Crops & varieties');
		expect(crops.map((r) => `${r.Crop}/${r.Variety}`)).toEqual([
			'Carrot/Test Amber',
			'Garlic/null',
			'Head lettuce/Test Butter'
		]);
		expect(crops[2]).toMatchObject({
			'Germination (%)': 0.9,
			'Cells per tray': 128,
			'Heat limit (°F)': 80,
			'Degree days to maturity (°F·d)': 900
		});
		// Stored per gram ($2.50/g, 800 seeds/g), written per ounce on an imperial farm.
		expect(crops[2]['Seed price ($/oz)']).toBeCloseTo(2.5 * G_PER_OZ, 10);
		expect(crops[2]['Seeds per ounce (seeds/oz)']).toBeCloseTo(800 * G_PER_OZ, 8);
		const beds = rowsOf('Beds');
		expect(beds).toEqual([
			{ Block: 'East', 'Block order': 1, Bed: 'E1', 'Walking order': 1, 'Length (ft)': 100, 'Width (in)': 30 },
			{ Block: 'East', 'Block order': 1, Bed: 'E2', 'Walking order': 2, 'Length (ft)': 100, 'Width (in)': 30 },
			{ Block: 'West', 'Block order': 2, Bed: 'W1', 'Walking order': 1, 'Length (ft)': 50, 'Width (in)': 42 }
		]);
	});
	it('season sheet names the season with real dates', () => {
		const rows = rowsOf('Season');
		const v = (f: string) => rows.find((r) => r.Field === f)?.Value;
		expect(v('Season name')).toBe('Test season 2027');
		expect(v('Year')).toBe(2027);
		expect((v('Starts on') as Date).toISOString().slice(0, 10)).toBe('2027-01-01');
	});
});

describe('read with SheetJS (a second, independent reader)', () => {
	it('sees the same sheet names', () => {
		expect(sj.SheetNames).toEqual(sheetNames);
	});
	it('dates are date cells and numbers are number cells', () => {
		const ws = sj.Sheets['Plantings'];
		const rows = XLSX.utils.sheet_to_json<Record<string, unknown>>(ws);
		const p1 = rows.find((r) => r.Bed === 'E1' && r['Start (ft)'] === 0)!;
		expect(p1['Field date']).toBeInstanceOf(Date);
		expect(p1['Length (ft)']).toBe(50);
		expect(ws['L2'].t).toBe('d'); // Field date column
		expect(ws['F2'].t).toBe('n'); // Length (ft)
		const seed = XLSX.utils.sheet_to_json<Record<string, unknown>>(sj.Sheets['Seed order']);
		expect(seed.find((r) => r.Variety === 'Test Amber')?.['Cost ($)']).toBe(6.21);
	});
	it('column widths are set on every sheet', () => {
		for (const name of sheetNames) {
			const cols = sj.Sheets[name]['!cols'] ?? [];
			expect(cols.length, name).toBeGreaterThan(1);
			const headers = XLSX.utils.sheet_to_json<unknown[]>(sj.Sheets[name], { header: 1 })[0];
			expect(cols.length, name).toBe(headers.length);
			cols.forEach((c, i) => expect(c?.width ?? c?.wch ?? 0, `${name} column ${i + 1}`).toBeGreaterThan(5));
		}
	});
	it('every sheet XML holds a frozen pane below row 1', () => {
		// SheetJS does not parse panes; its raw view of the zip does show the sheet XML.
		const files = (
			sj as unknown as { files: Record<string, { content?: Uint8Array; _data?: { getContent(): Uint8Array } }> }
		).files;
		const sheetXml = Object.keys(files).filter((k) => /xl\/worksheets\/sheet\d+\.xml$/.test(k));
		expect(sheetXml).toHaveLength(sheetNames.length);
		for (const k of sheetXml) {
			const f = files[k];
			const xml = Buffer.from(f.content ?? f._data!.getContent()).toString('utf8');
			expect(xml, k).toMatch(/<pane[^>]*ySplit="1"[^>]*state="frozen"|<pane[^>]*state="frozen"[^>]*ySplit="1"/);
		}
	});
});

describe('one planned supply', () => {
	it("the demo season's Weekly tasks harvest and Forecast sheet agree for every crop and week", async () => {
		// Both sheets come from the one planned supply (the variety's yield spread by its harvest curve):
		// summing the Harvest tasks of a crop and week must give that week's Planned harvest. Storage crops
		// are left out: the Forecast sheet shows them as the store gives them, the tasks when they are dug.
		const { res, bytes: demoBytes } = await download(await signedIn(demo.owner, demo.password), demoSeasonId);
		expect(res.status).toBe(200);
		const book = await loadWorkbook(demoBytes);
		const read = (name: string) => sheetRecords(book, name);
		const stored = new Set(
			(await testDb()('crops').whereNotNull('storage_weeks').where('storage_weeks', '>', 0).select('name')).map(
				(c) => c.name
			)
		);
		const tasks = new Map<string, { sum: number; n: number }>();
		for (const r of read('Weekly tasks')) {
			if (r.Task !== 'Harvest' || stored.has(String(r.Crop))) continue;
			const k = `${r.Crop} ${r['Week (ISO)']}`;
			const t = tasks.get(k) ?? { sum: 0, n: 0 };
			t.sum += Number(r.Quantity);
			t.n++;
			tasks.set(k, t);
		}
		const forecastRows = read('Forecast').filter(
			(r) => !stored.has(String(r.Crop)) && Number(r['Planned harvest']) > 0
		);
		expect(forecastRows.length).toBeGreaterThan(100);
		for (const r of forecastRows) {
			const k = `${r.Crop} ${r['Week (ISO)']}`;
			const t = tasks.get(k);
			expect(t, k).toBeDefined();
			// Each task's quantity is rounded to 0.01, as is the sheet's sum: at most half a hundredth apart each.
			expect(Math.abs(t!.sum - Number(r['Planned harvest'])), k).toBeLessThanOrEqual(0.005 * (t!.n + 1) + 1e-9);
			tasks.delete(k);
		}
		// No harvest task in a week the Forecast sheet shows nothing for.
		expect([...tasks.entries()].filter(([, t]) => t.sum > 0.01).map(([k]) => k)).toEqual([]);
	});
});

describe("other seasons' plantings harvesting in this season", () => {
	it('last autumn’s garlic, dug this July, is on the Forecast and Weekly tasks sheets, not the Plantings sheet', async () => {
		const db = testDb();
		const garlic = (await db('crops').where({ farm_id: farm.farmId, name: 'Garlic' }).first('id')).id;
		const [season2026] = await db('seasons').insert({
			farm_id: farm.farmId,
			year: 2026,
			name: 'Test season 2026',
			starts_on: '2026-01-01',
			ends_on: '2026-12-31'
		});
		const [variety] = await db('varieties').insert({
			farm_id: farm.farmId,
			crop_id: garlic,
			name: 'Test Hardneck',
			method: 'direct',
			days_to_maturity: 260,
			days_in_tray: 0,
			harvest_window_days: 7,
			yield_per_bed_foot: 3,
			rows_per_bed: 4,
			in_row_spacing_in: 6,
			seeds_per_spot: 1,
			germination_rate: 0.95,
			seeds_per_gram: 0.2,
			margin: 0.05
		});
		const w1 = await db('beds').where({ farm_id: farm.farmId, name: 'W1' }).first('id');
		// Planted Fri 15 Oct 2026 in the 2026 season; dug Mon 5 – Sun 11 Jul 2027 = 2027-W27 (W01 starts Mon 4 Jan
		// 2027; + 26 weeks = 5 Jul). 20 ft × 3 heads a bed-foot = 60 heads, all in W27. Garlic has no demand here.
		const [planting] = await db('plantings').insert({
			farm_id: farm.farmId,
			season_id: season2026,
			variety_id: variety,
			bed_id: w1.id,
			start_ft: 0,
			length_ft: 20,
			rows: 4,
			in_row_spacing_in: 6,
			seeds_per_spot: 1,
			method: 'direct',
			field_date: '2026-10-15',
			first_harvest: '2027-07-05',
			last_harvest: '2027-07-11',
			expected_yield: 60,
			seeds_needed: 168,
			status: 'sown'
		});
		try {
			const got = await download(farm.client, seasonId);
			expect(got.res.status).toBe(200);
			const book = await loadWorkbook(got.bytes);
			const read = (name: string) => sheetRecords(book, name);
			const forecast = read('Forecast').filter((r) => r.Crop === 'Garlic');
			expect(forecast).toEqual([
				expect.objectContaining({ 'Week (ISO)': '2027-W27', 'Planned harvest': 60, Demand: 0, Surplus: 60 })
			]);
			const tasks = read('Weekly tasks').filter((r) => r.Crop === 'Garlic');
			// Its harvest only: the sowing is the 2026 workbook's work.
			expect(tasks).toEqual([
				expect.objectContaining({ 'Week (ISO)': '2027-W27', Task: 'Harvest', Bed: 'W1', Quantity: 60, Unit: 'head' })
			]);
			expect(read('Plantings').some((r) => r.Crop === 'Garlic')).toBe(false);
			// The season's own figures are unchanged by it: carrot W27 still 41.67 lb.
			expect(read('Forecast').find((r) => r.Crop === 'Carrot' && r['Week (ISO)'] === '2027-W27')).toMatchObject({
				'Planned harvest': 41.67
			});
		} finally {
			await db('plantings').where({ id: planting }).delete();
			await db('varieties').where({ id: variety }).delete();
			await db('seasons').where({ id: season2026 }).delete();
		}
	});
});
