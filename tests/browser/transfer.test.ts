// Export and re-import through the pages in headless Chromium: the owner downloads the demo
// season's workbook from its Export & import page (progress shown while it streams), a new
// farm signs up and imports it from its Import page, and a bad CSV lists its bad cells.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { confirmSignUpByMail, launch, signIn, type BrowserSession } from '../helpers/browser';
import { demo } from '../helpers/env';
import { closeTestDb, count, testDb, uniqueEmail } from '../helpers/db';
import { loadWorkbook } from '../helpers/transfer';

let browser: BrowserSession;
let dir: string;
let demoSeasonId: number;
let saved: string;
/** The farm the import test made, signed in still for the next test. */
let lastEmail: string;

beforeAll(async () => {
	browser = await launch();
	dir = mkdtempSync(join(tmpdir(), 'fc-transfer-'));
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	const farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	demoSeasonId = (await testDb()('seasons').where({ farm_id: farmId, year: 2027 }).first('id')).id;
});
afterAll(async () => {
	await browser.close();
	rmSync(dir, { recursive: true, force: true });
	await closeTestDb();
});

describe('export and re-import through the pages', () => {
	it('the owner downloads the season workbook, with progress in the page', async () => {
		const page = await browser.context.newPage();
		await signIn(page, demo.owner, demo.password);
		await page.goto(`/seasons/${demoSeasonId}/transfer`);
		await expect(page.getByRole('heading', { name: 'Export & import' }).isVisible()).resolves.toBe(true);
		const [download] = await Promise.all([
			page.waitForEvent('download'),
			page.getByRole('link', { name: 'Download workbook (.xlsx)' }).click()
		]);
		expect(download.suggestedFilename()).toMatch(/^furrowcast-wrenfield-market-garden-invented-demo-2027\.xlsx$/);
		saved = join(dir, download.suggestedFilename());
		await download.saveAs(saved);
		// The page read the stream itself and says how much came.
		await expect(page.getByTestId('export-done').innerText()).resolves.toMatch(
			/Workbook ready: [\d,]+ KB, [\d,]+ rows/
		);
		const wb = await loadWorkbook(readFileSync(saved));
		const plantings = wb.getWorksheet('Plantings')!;
		expect(plantings.rowCount - 1).toBe(await count('plantings', { season_id: demoSeasonId }));
		await page.close();
		await browser.context.clearCookies();
	});

	it('a new farm signs up and imports it from its Import page', async () => {
		const page = await browser.context.newPage();
		const email = uniqueEmail('browser-import');
		lastEmail = email;
		await page.goto('/signup');
		await page.getByLabel('Your name').fill('Import tester');
		await page.getByLabel('E-mail').fill(email);
		await page.getByLabel('Password').fill('long-enough-pass');
		await page.getByLabel('Farm name').fill('Copy Farm (invented)');
		await page.getByLabel('Latitude (° N, negative for south)').fill('42.5');
		await page.getByLabel('Last spring frost').fill('2027-05-10');
		await page.getByLabel('First fall frost').fill('2027-10-05');
		await page.getByRole('button', { name: /sign up|create/i }).click();
		await confirmSignUpByMail(page);

		await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Import' }).click();
		await page.waitForURL(/\/import$/);
		await page.getByLabel('Workbook or CSV file').setInputFiles(saved);
		await Promise.all([
			page.waitForURL(/\/seasons\/\d+\/transfer\?imported=1/),
			page.getByRole('button', { name: 'Import' }).click()
		]);
		const n = await count('plantings', { season_id: demoSeasonId });
		await expect(page.getByTestId('import-summary').innerText()).resolves.toContain(`Imported ${n} plantings`);

		const u = await testDb()('users').where({ email }).first('id');
		const farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
		const season = await testDb()('seasons').where({ farm_id: farmId, year: 2027 }).first('id');
		expect(await count('plantings', { season_id: season.id })).toBe(n);
		expect(page.url()).toContain(`/seasons/${season.id}/transfer`);

		// A bad CSV of beds: refused, its bad cells listed in the page, nothing written.
		const bad = join(dir, 'beds.csv');
		writeFileSync(bad, 'Block,Bed,Length (ft)\nEast,Z1,long\n,Z2,40\n');
		await page.getByLabel('Workbook or CSV file').setInputFiles(bad);
		await page.getByRole('button', { name: 'Import' }).click();
		const issues = page.getByTestId('import-issue');
		await issues.first().waitFor();
		const texts = await issues.allInnerTexts();
		expect(texts).toHaveLength(2);
		expect(texts[0]).toMatch(/Beds\s+2\s+C · Length \(ft\)\s+Length must be a number/);
		expect(texts[1]).toMatch(/Beds\s+3\s+A · Block\s+Block is required/);
		expect(await count('beds', { farm_id: farmId, name: 'Z1' })).toBe(0);
		await page.close();
		await browser.context.clearCookies();
	});

	it('the same file edited comes back as a preview the owner confirms, at desk and phone widths', async () => {
		const u = await testDb()('users').where({ email: lastEmail }).first('id');
		const farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
		const season = (await testDb()('seasons').where({ farm_id: farmId, year: 2027 }).first('id')).id;
		// The farm's own export, with one length changed and one row gone (as a grower edits it).
		const page = await browser.context.newPage();
		await signIn(page, lastEmail, 'long-enough-pass');
		const res = await page.request.get(`/api/seasons/${season}/export`);
		const wb = await loadWorkbook(Buffer.from(await res.body()));
		const ws = wb.getWorksheet('Plantings')!;
		const heads = (ws.getRow(1).values as unknown[]).map(String);
		const lengthCell = ws.getRow(2).getCell(heads.indexOf('Length (ft)'));
		const newLength = Number(lengthCell.value) === 12 ? 14 : 12;
		lengthCell.value = newLength;
		ws.spliceRows(3, 1);
		const edited = join(dir, 'edited.xlsx');
		writeFileSync(edited, Buffer.from(await wb.xlsx.writeBuffer()));
		await page.goto(`/seasons/${season}/transfer`);
		await page.getByLabel('Workbook or CSV file').setInputFiles(edited);
		await page.getByRole('button', { name: 'Import' }).click();
		const counts = page.getByTestId('preview-counts');
		await counts.waitFor();
		await expect(counts.innerText()).resolves.toMatch(/0 added · 1 changed · 1 removed · \d+ unchanged/);
		const rows = await page.getByTestId('preview-change').allInnerTexts();
		expect(rows.some((t) => new RegExp(`Length \\(ft\\)\\s+\\d[\\d.,]*\\s+${newLength}`).test(t))).toBe(true);
		await page.setViewportSize({ width: 1280, height: 900 });
		await page.screenshot({ path: '/tmp/fc-import-preview-1280.png', fullPage: true });
		await page.setViewportSize({ width: 390, height: 844 });
		await page.screenshot({ path: '/tmp/fc-import-preview-390.png', fullPage: true });
		const before = await count('plantings', { season_id: season });
		await Promise.all([
			page.waitForURL(/\/transfer\?updated=1/),
			page.getByRole('button', { name: 'Apply these changes' }).click()
		]);
		await expect(page.getByTestId('update-summary').innerText()).resolves.toBe(
			'Season updated from the file: 0 added, 1 changed, 1 removed.'
		);
		expect(await count('plantings', { season_id: season })).toBe(before - 1);
		await page.close();
		await browser.context.clearCookies();
	});

	it('a crew lead may download but sees no import form', async () => {
		const page = await browser.context.newPage();
		await signIn(page, demo.crew, demo.password);
		await page.goto(`/seasons/${demoSeasonId}/transfer`);
		await expect(page.getByRole('link', { name: 'Download workbook (.xlsx)' }).isVisible()).resolves.toBe(true);
		await expect(page.getByLabel('Workbook or CSV file').count()).resolves.toBe(0);
		await expect(page.getByText("Only the farm's owner imports files").isVisible()).resolves.toBe(true);
		await page.close();
		await browser.context.clearCookies();
	});
});
