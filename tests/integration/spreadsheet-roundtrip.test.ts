// The season workbook through a real spreadsheet program and back, as a grower does it:
// LibreOffice Calc (Debian's, headless) opens the export, deletes a row, edits cells, pastes a
// row twice, saves as .xlsx and as CSV with its Save dialog's default options ("as shown"),
// and the result is imported into the same season. The plan is a copy of the invented demo
// season in a farm of its own, so the demo farm other tests read is left alone.
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import { signedIn } from '../helpers/http';
import { closeTestDb, testDb } from '../helpers/db';
import { baseUrl, demo } from '../helpers/env';
import { download, loadWorkbook, signUpFarm, upload, type NewFarm } from '../helpers/transfer';
import { libreOffice, scratchDir } from '../helpers/libreoffice';

afterAll(closeTestDb);

const dir = scratchDir('roundtrip');
let farm: NewFarm;
let seasonId: number;
let exported: string;
/** Row numbers and ids in the exported Plantings sheet, found by reading it. */
let editRow: {
	row: number;
	id: number;
	lengthFt: number;
	seeds: number;
	yield: number;
	crop: string;
	variety: string;
	bed: string | null;
	startFt: number;
	fieldDate: string;
};
let notesRow: { row: number; id: number };
let deleted: { row: number; id: number };
let plantingCount: number;
let header: string[];

const file = (name: string): string => join(dir, name);

async function apply(token: string): Promise<Response> {
	return farm.client.request('/api/import/apply', {
		method: 'POST',
		body: JSON.stringify({ token }),
		headers: { origin: baseUrl(), 'content-type': 'application/json', accept: 'application/json' }
	});
}

beforeAll(async () => {
	// The demo season copied into a new farm (an empty season: written straight away).
	const owner = await signedIn(demo.owner, demo.password);
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	const demoFarm = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	const demoSeason = (await testDb()('seasons').where({ farm_id: demoFarm, year: 2027 }).first('id')).id;
	const demoFile = (await download(owner, demoSeason)).bytes;
	farm = await signUpFarm('lo-roundtrip');
	const res = await upload(farm.client, 'demo.xlsx', demoFile);
	expect(res.status).toBe(201);
	seasonId = (await res.json()).seasonId;
	const got = await download(farm.client, seasonId);
	exported = file('export.xlsx');
	(await import('node:fs')).writeFileSync(exported, got.bytes);

	const wb = await loadWorkbook(got.bytes);
	const ws = wb.getWorksheet('Plantings')!;
	header = (ws.getRow(1).values as unknown[]).slice(1).map(String);
	const col = (h: string): number => header.indexOf(h) + 1;
	plantingCount = ws.actualRowCount - 1;
	const rows: {
		row: number;
		id: number;
		lengthFt: number;
		seeds: number;
		yield: number;
		crop: string;
		variety: string;
		method: string;
		bed: string | null;
		startFt: number;
		fieldDate: string;
	}[] = [];
	ws.eachRow((r, n) => {
		if (n === 1) return;
		rows.push({
			row: n,
			id: Number(r.getCell(col('Planting id')).value),
			lengthFt: Number(r.getCell(col('Length (ft)')).value),
			seeds: Number(r.getCell(col('Seeds needed (seeds)')).value),
			yield: Number(r.getCell(col('Expected yield')).value),
			crop: String(r.getCell(col('Crop')).value),
			variety: String(r.getCell(col('Variety')).value),
			method: String(r.getCell(col('Method')).value),
			bed: r.getCell(col('Bed')).value ? String(r.getCell(col('Bed')).value) : null,
			startFt: Number(r.getCell(col('Start (ft)')).value),
			fieldDate: (r.getCell(col('Field date')).value as Date).toISOString().slice(0, 10)
		});
	});
	// A direct-sown planting of at least 30 ft whose seeds need a thousands separator when shown.
	editRow = rows.find((r) => r.method === 'direct' && r.lengthFt >= 30 && r.seeds >= 1000)!;
	expect(editRow, 'a direct-sown planting of 30 ft or more with 1,000+ seeds').toBeTruthy();
	deleted = rows.find((r) => r.row > 3 && r.id !== editRow.id)!;
	notesRow = rows.find((r) => r.row > deleted.row + 1 && r.id !== editRow.id)!;

	const letter = (h: string): string => String.fromCharCode(64 + col(h));
	const crew = await farm.client.request(`/seasons/${seasonId}/week/2027-W34/sheets.xlsx`);
	expect(crew.status).toBe(200);
	(await import('node:fs')).writeFileSync(file('crew-w34.xlsx'), Buffer.from(await crew.arrayBuffer()));
	// Rows below a deleted row move up by one: edits are made first, the row deleted last.
	await libreOffice(dir, [
		{
			open: exported,
			ops: [
				{ set: { sheet: 'Plantings', cell: `${letter('Length (ft)')}${editRow.row}`, value: editRow.lengthFt - 5 } },
				{ set: { sheet: 'Plantings', cell: `${letter('Notes')}${notesRow.row}`, value: 'Edited in a spreadsheet' } },
				{ deleteRow: { sheet: 'Plantings', row: deleted.row } }
			],
			save: [
				{ path: file('edited.xlsx'), as: 'xlsx' },
				{ path: file('plantings.csv'), as: 'csv', sheet: 'Plantings' }
			]
		},
		{ open: exported, save: [{ path: file('crops.csv'), as: 'csv', sheet: 'Crops & varieties' }] },
		{
			// The same row pasted twice, below the last one, and a field date a year out of the season.
			open: exported,
			ops: [
				{ copyRow: { sheet: 'Plantings', from: 2, to: plantingCount + 2 } },
				{ copyRow: { sheet: 'Plantings', from: 2, to: plantingCount + 3 } }
			],
			save: [{ path: file('pasted-twice.xlsx'), as: 'xlsx' }]
		},
		{
			open: exported,
			ops: [{ set: { sheet: 'Plantings', cell: `${letter('Field date')}3`, value: '2028-05-01' } }],
			save: [{ path: file('next-year.xlsx'), as: 'xlsx' }]
		},
		{ open: exported, save: [{ path: file('season.pdf'), as: 'pdf' }] },
		{ open: file('crew-w34.xlsx'), save: [{ path: file('crew-w34.pdf'), as: 'pdf' }] }
	]);
}, 180_000);

describe('a workbook LibreOffice saved (finding: one upload took the server down)', () => {
	it('declares a million rows, yet imports as a preview of what it changes, and the server stays up', async () => {
		const bytes = readFileSync(file('edited.xlsx'));
		// What LibreOffice writes: the sheet's dimension reaches the last row of the grid.
		const xml = await sheetXml(bytes, 'Plantings');
		expect(xml).toMatch(/<dimension ref="A1:[A-Z]+1048576"\/>/);
		const res = await upload(farm.client, 'edited.xlsx', bytes, { seasonId: String(seasonId) });
		expect(res.status).toBe(200);
		const { preview } = await res.json();
		expect(preview.removed.map((r: { id: number }) => r.id)).toEqual([deleted.id]);
		expect(preview.changed.map((c: { id: number }) => c.id).sort()).toEqual([editRow.id, notesRow.id].sort());
		expect(preview.unchanged).toBe(plantingCount - 3);
		expect(preview.added).toEqual([]);
		expect((await farm.client.request('/import')).status).toBe(200);
	});

	it('a sheet past the row limit is refused with a clear message, not read to its end', async () => {
		const big = new ExcelJS.Workbook();
		const ws = big.addWorksheet('Plantings');
		ws.addRow(header);
		for (let i = 0; i < 20_001; i++) ws.addRow(['Carrot', 'x', null, null, 0, 10]);
		const res = await upload(farm.client, 'big.xlsx', Buffer.from(await big.xlsx.writeBuffer()), {
			seasonId: String(seasonId)
		});
		expect(res.status).toBe(413);
		expect((await res.json()).message).toMatch(/more than 20,000 rows/);
	});
});

describe('numbers as the CSV shows them (finding: "1,000" was stored as 1)', () => {
	it('the Plantings CSV saved "as shown" gives the same preview as the workbook', async () => {
		const csv = readFileSync(file('plantings.csv'), 'utf8');
		expect(csv).toContain(`"${editRow.seeds.toLocaleString('en-US')}"`);
		const res = await upload(farm.client, 'plantings.csv', csv, { seasonId: String(seasonId), sheet: 'Plantings' });
		expect(res.status).toBe(200);
		const { preview } = await res.json();
		expect(preview.removed.map((r: { id: number }) => r.id)).toEqual([deleted.id]);
		expect(preview.changed.map((c: { id: number }) => c.id).sort()).toEqual([editRow.id, notesRow.id].sort());
		expect(preview.unchanged).toBe(plantingCount - 3);
	});

	it('the Crops & varieties CSV keeps 1,000 seeds per packet and 90.0 % germination', async () => {
		const csv = readFileSync(file('crops.csv'), 'utf8');
		expect(csv).toMatch(/"1,000"/);
		const fresh = await signUpFarm('lo-crops-csv');
		const res = await upload(fresh.client, 'crops.csv', csv, { sheet: 'Crops & varieties' });
		expect(res.status).toBe(201);
		const [a, b] = await Promise.all([varietyFigures(farm.farmId), varietyFigures(fresh.farmId)]);
		expect(b).toEqual(a);
		expect(b.some((v) => v.seeds_per_packet === 1000)).toBe(true);
	});

	it('a value that reads two ways, with nothing else in the file to tell, is refused naming row and column', async () => {
		const csv = `Block,Bed,Length (ft)\r\nNorth,Z1,"1,000"\r\nNorth,Z2,40\r\n`;
		const res = await upload(farm.client, 'beds.csv', csv, { sheet: 'Beds' });
		expect(res.status).toBe(400);
		const body = await res.json();
		expect(body.errors).toEqual([
			expect.objectContaining({ sheet: 'Beds', row: 2, column: 'C', header: 'Length (ft)' })
		]);
		expect(body.errors[0].message).toMatch(/could be 1,000 or 1/);
	});
});

describe('updating a season from its own edited export', () => {
	it('refuses a field date outside the season, naming the row', async () => {
		const res = await upload(farm.client, 'next-year.xlsx', readFileSync(file('next-year.xlsx')), {
			seasonId: String(seasonId)
		});
		expect(res.status).toBe(400);
		const body = await res.json();
		expect(body.errors).toEqual([expect.objectContaining({ sheet: 'Plantings', row: 3, header: 'Field date' })]);
		expect(body.errors[0].message).toMatch(/2028-05-01 is outside/);
	});

	it('flags a row pasted twice and leaves the copy out', async () => {
		const res = await upload(farm.client, 'pasted-twice.xlsx', readFileSync(file('pasted-twice.xlsx')), {
			seasonId: String(seasonId)
		});
		expect(res.status).toBe(200);
		const { preview } = await res.json();
		// Both pasted rows carry row 2's id: they are exact copies of row 2.
		expect(preview.duplicates).toEqual([
			{ row: plantingCount + 2, of: 2 },
			{ row: plantingCount + 3, of: 2 }
		]);
		expect(preview.added).toEqual([]);
		expect(preview.changed).toEqual([]);
	});

	it('a stale preview is refused (409) and writes nothing', async () => {
		const res = await upload(farm.client, 'edited.xlsx', readFileSync(file('edited.xlsx')), {
			seasonId: String(seasonId)
		});
		const { preview } = await res.json();
		await testDb()('plantings')
			.where({ id: notesRow.id })
			.update({ version: testDb().raw('version + 1') });
		const before = await testDb()('plantings').where({ season_id: seasonId }).count({ n: '*' }).first();
		const out = await apply(preview.token);
		expect(out.status).toBe(409);
		expect(await testDb()('plantings').where({ season_id: seasonId }).count({ n: '*' }).first()).toEqual(before);
	});

	it('applies in one go on confirmation, and an edited length works out seeds and yield again', async () => {
		const res = await upload(farm.client, 'edited.xlsx', readFileSync(file('edited.xlsx')), {
			seasonId: String(seasonId)
		});
		const { preview } = await res.json();
		const change = preview.changed.find((c: { id: number }) => c.id === editRow.id);
		expect(change.changes.map((f: { field: string }) => f.field)).toEqual(
			expect.arrayContaining(['lengthFt', 'seedsNeeded', 'expectedYield'])
		);
		const out = await apply(preview.token);
		expect(out.status).toBe(200);
		expect(await out.json()).toMatchObject({ added: 0, changed: 2, removed: 1 });
		expect(await testDb()('plantings').where({ id: deleted.id }).first()).toBeUndefined();
		const p = await testDb()('plantings').where({ id: editRow.id }).first();
		expect(Number(p.length_ft)).toBe(editRow.lengthFt - 5);
		// Yield is bed-feet × yield per bed-foot, and seeds scale with the bed-feet (the seed rule is
		// linear in bed-feet; rounding up a whole seed and spot allows a few seeds either way).
		// Source: the export's own Plantings figures before the edit, common practice (no published source).
		const ratio = (editRow.lengthFt - 5) / editRow.lengthFt;
		expect(Number(p.expected_yield)).toBeCloseTo(editRow.yield * ratio, 1);
		expect(Math.abs(p.seeds_needed - editRow.seeds * ratio)).toBeLessThan(editRow.seeds * 0.01 + 5);
		expect((await testDb()('plantings').where({ id: notesRow.id }).first()).notes).toBe('Edited in a spreadsheet');
	});
});

describe('the edited export into an empty season (a new farm): nothing kept stale, nothing doubled', () => {
	it("an edited length works out seeds and yield again instead of keeping the file's figures", async () => {
		const target = await signUpFarm('lo-empty');
		const res = await upload(target.client, 'edited.xlsx', readFileSync(file('edited.xlsx')));
		expect(res.status, await res.clone().text()).toBe(201);
		expect((await res.json()).plantings).toBe(plantingCount - 1);
		const p = await testDb()('plantings as p')
			.join('varieties as v', 'v.id', 'p.variety_id')
			.leftJoin('beds as b', 'b.id', 'p.bed_id')
			.where({ 'p.farm_id': target.farmId, 'v.name': editRow.variety, 'p.field_date': editRow.fieldDate })
			.where({ 'p.start_ft': editRow.startFt })
			.modify((q) => (editRow.bed ? q.where('b.name', editRow.bed) : q.whereNull('p.bed_id')))
			.first('p.*');
		expect(Number(p.length_ft)).toBe(editRow.lengthFt - 5);
		// Same rule as the season update above. Source: the export's own Plantings figures before the
		// edit, common practice (no published source).
		const ratio = (editRow.lengthFt - 5) / editRow.lengthFt;
		expect(Number(p.expected_yield)).toBeCloseTo(editRow.yield * ratio, 1);
		expect(Math.abs(p.seeds_needed - editRow.seeds * ratio)).toBeLessThan(editRow.seeds * 0.01 + 5);
	});

	it('a row pasted twice is refused, naming both rows, and nothing is written', async () => {
		const target = await signUpFarm('lo-empty-twice');
		const res = await upload(target.client, 'pasted-twice.xlsx', readFileSync(file('pasted-twice.xlsx')));
		expect(res.status).toBe(400);
		const body = await res.json();
		expect(body.errors).toEqual([
			expect.objectContaining({
				sheet: 'Plantings',
				row: plantingCount + 2,
				message: expect.stringMatching(/repeats row 2 exactly/)
			}),
			expect.objectContaining({
				sheet: 'Plantings',
				row: plantingCount + 3,
				message: expect.stringMatching(/repeats row 2 exactly/)
			})
		]);
		for (const t of ['crops', 'varieties', 'beds', 'seasons', 'plantings'])
			expect(await testDb()(t).where({ farm_id: target.farmId }).count({ n: '*' }).first(), t).toEqual({ n: 0 });
	});
});

describe('printing the workbooks (LibreOffice to PDF, read back with pdftotext)', () => {
	it('the season workbook: landscape, whole rows on a page, and every page carries its header row and title', async () => {
		const wb = await loadWorkbook(readFileSync(exported));
		const sheets = wb.worksheets.map((ws) => {
			const heads = (ws.getRow(1).values as unknown[]).slice(1).map(String);
			return { name: ws.name, first: heads[0], last: heads[heads.length - 1], rows: ws.actualRowCount };
		});
		const pages = pdfPages(file('season.pdf'));
		// Fit to width, landscape: at least 20 rows a page (Letter or A4 at any scale fit to width keeps more).
		const bound = sheets.reduce((n, sh) => n + Math.ceil(sh.rows / 20), 0);
		expect(pages.length).toBeLessThanOrEqual(bound);
		for (const [i, text] of pages.entries()) {
			const sheet = sheets.find((sh) => text.includes(sh.first) && text.includes(sh.last));
			expect(sheet, `page ${i + 1} has a whole header row:\n${text.slice(0, 400)}`).toBeTruthy();
			expect(text, `page ${i + 1}`).toContain('Testbrook lo-roundtrip');
			expect(text, `page ${i + 1}`).toContain('2027 season');
		}
		// The workbook keeps its filters through a LibreOffice save (the names it needs are there).
		const book = await zipText(readFileSync(file('edited.xlsx')), 'xl/workbook.xml');
		const names = [...book.matchAll(/<definedName\b[^>]*>/g)].map((m) => m[0]);
		expect(names.some((n) => n.includes('name="_xlnm._FilterDatabase"') && n.includes('localSheetId="1"'))).toBe(true);
		expect(await sheetXml(readFileSync(file('edited.xlsx')), 'Plantings')).toMatch(/<autoFilter ref="A1:[A-Z]+\d+"/);
	});

	it("a busy week's crew-sheet workbook: every page names the kind, the week and the farm, with its header row", async () => {
		const pages = pdfPages(file('crew-w34.pdf'));
		expect(pages.length).toBeGreaterThan(1);
		for (const [i, text] of pages.entries()) {
			expect(text, `page ${i + 1}`).toMatch(/(Tray sowing|Direct sowing|Transplanting|Harvest) · 2027-W34/);
			expect(text, `page ${i + 1}`).toContain('Testbrook lo-roundtrip');
			expect(text, `page ${i + 1}`).toContain('Crop');
			expect(text, `page ${i + 1}`).toContain('Notes');
		}
	});
});

/** Text of each page of a PDF (Debian's pdftotext, poppler-utils). */
function pdfPages(path: string): string[] {
	return execFileSync('pdftotext', ['-layout', path, '-'], { encoding: 'utf8' })
		.split('\f')
		.filter((t) => t.trim() !== '');
}

async function zipText(bytes: Buffer, path: string): Promise<string> {
	const JSZip = (await import('jszip')).default;
	return (await JSZip.loadAsync(bytes)).file(path)!.async('string');
}

async function sheetXml(bytes: Buffer, name: string): Promise<string> {
	const JSZip = (await import('jszip')).default;
	const zip = await JSZip.loadAsync(bytes);
	const book = await zip.file('xl/workbook.xml')!.async('string');
	const rels = await zip.file('xl/_rels/workbook.xml.rels')!.async('string');
	const rid = new RegExp(`<sheet [^>]*name="${name}"[^>]*r:id="([^"]+)"`).exec(book)![1];
	const target =
		new RegExp(`Id="${rid}"[^>]*Target="([^"]+)"`).exec(rels)?.[1] ??
		new RegExp(`Target="([^"]+)"[^>]*Id="${rid}"`).exec(rels)![1];
	return zip.file(`xl/${target.replace(/^\/?xl\//, '')}`)!.async('string');
}

async function varietyFigures(farmId: number): Promise<Record<string, unknown>[]> {
	return testDb()('varieties as v')
		.join('crops as c', 'c.id', 'v.crop_id')
		.where('v.farm_id', farmId)
		.orderBy(['c.name', 'v.name'])
		.select(
			'c.name as crop',
			'v.name',
			'v.seeds_per_packet',
			'v.germination_rate',
			'v.margin',
			'v.seed_price_cents_per_gram',
			'v.seeds_per_gram',
			'v.gdd_to_maturity'
		);
}
