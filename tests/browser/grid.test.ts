// The planting grid in headless Chromium: keyboard edits recalculate derived cells, a pasted
// 3×4 block, fill down, undo/redo, a stale edit from a second browser meets the conflict
// message without losing data, a crew lead cannot edit crop or bed-feet, and a user's column
// preferences load with the grid without being fetched again after each save.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launch, pasteIntoGrid, signIn, type BrowserSession, type Page } from '../helpers/browser';
import { demo } from '../helpers/env';
import { closeTestDb, testDb } from '../helpers/db';
import { signedIn } from '../helpers/http';

let browser: BrowserSession;
let seasonId: number;
let ids: number[] = [];
let crewId: string;
let crewPrefsBefore: { prefs: string } | undefined;

beforeAll(async () => {
	browser = await launch({ viewport: { width: 1600, height: 900 } });
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	const farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	crewId = (await testDb()('users').where({ email: demo.crew }).first('id')).id;
	crewPrefsBefore = await testDb()('user_grid_prefs').where({ user_id: crewId, grid: 'plantings' }).first('prefs');
	// A season of its own, so these edits never touch the demo season other tests read.
	[seasonId] = await testDb()('seasons').insert({
		farm_id: farmId,
		year: 2031,
		name: '2031 grid test (invented)',
		starts_on: '2031-01-01',
		ends_on: '2031-12-31'
	});
	const variety = await testDb()('varieties')
		.where({ farm_id: farmId, method: 'direct' })
		.whereNull('gdd_to_maturity')
		.first('id');
	const bed = await testDb()('beds').where({ farm_id: farmId }).orderBy('length_ft', 'desc').first('id');
	const owner = await signedIn(demo.owner, demo.password);
	const res = await owner.json(`/api/seasons/${seasonId}/plantings`, 'POST', {
		plantings: [0, 1, 2, 3].map((i) => ({
			varietyId: variety.id,
			bedId: bed.id,
			startFt: i * 25,
			lengthFt: 20,
			fieldDate: '2031-05-05'
		}))
	});
	ids = (await res.json()).plantings.map((p: { id: number }) => p.id);
});
afterAll(async () => {
	await testDb()('plantings').where({ season_id: seasonId }).delete();
	await testDb()('seasons').where({ id: seasonId }).delete();
	const crewPrefs = testDb()('user_grid_prefs').where({ user_id: crewId, grid: 'plantings' });
	if (crewPrefsBefore) await crewPrefs.update({ prefs: crewPrefsBefore.prefs });
	else await crewPrefs.delete();
	await closeTestDb();
	await browser.close();
});

const cell = (page: Page, row: number, col: string) => page.locator(`[data-row="${row}"] [data-col="${col}"]`);

async function openGrid(page: Page, email: string): Promise<void> {
	await signIn(page, email, demo.password);
	await page.goto(`/seasons/${seasonId}/plantings`);
	await page.locator('[data-row="0"]').waitFor();
}

async function saved(page: Page): Promise<void> {
	await page.getByTestId('save-status').getByText('All changes saved').waitFor({ timeout: 10_000 });
}

describe('the owner drives the grid from the keyboard', () => {
	let page: Page;
	beforeAll(async () => {
		page = await browser.context.newPage();
		await openGrid(page, demo.owner);
	});
	afterAll(async () => {
		await page.close();
		await browser.context.clearCookies();
	});

	it('edits bed-feet with the keyboard and sees yield and seed change at once', async () => {
		const seedsBefore = await cell(page, 0, 'seeds').innerText();
		await cell(page, 0, 'lengthFt').click();
		await page.keyboard.type('40');
		await page.keyboard.press('Enter');
		await expect(cell(page, 0, 'lengthFt').innerText()).resolves.toBe('40 ft');
		const seedsAfter = await cell(page, 0, 'seeds').innerText();
		// Twice the bed-feet: about twice the seed (spots are floored per row, so allow a seed or two).
		const n = (s: string) => Number(s.replace(/[^\d.]/g, ''));
		expect(n(seedsAfter) / n(seedsBefore)).toBeCloseTo(2, 1);
		await saved(page);
		expect(Number((await testDb()('plantings').where({ id: ids[0] }).first('length_ft')).length_ft)).toBe(40);
	});

	it('pastes a 3×4 block of tab-separated text', async () => {
		await cell(page, 1, 'startFt').click();
		await pasteIntoGrid(page, '26\t15\t2\t3\n51\t16\t3\t4\n76\t17\t4\t5');
		await expect(cell(page, 1, 'startFt').innerText()).resolves.toBe('26 ft');
		await expect(cell(page, 3, 'spacing').innerText()).resolves.toBe('5 in');
		await expect(cell(page, 2, 'rows').innerText()).resolves.toBe('3 rows');
		await saved(page);
		const r = await testDb()('plantings').where({ id: ids[3] }).first();
		expect([Number(r.start_ft), Number(r.length_ft), r.rows, Number(r.in_row_spacing_in)]).toEqual([76, 17, 4, 5]);
	});

	it('names the bad cell of a paste and saves the good ones only on confirmation', async () => {
		await cell(page, 0, 'notes').click();
		await pasteIntoGrid(page, 'good note\nx\n');
		await cell(page, 0, 'rows').click();
		await pasteIntoGrid(page, '2\nmany');
		await expect(page.getByTestId('paste-review').innerText()).resolves.toContain('Row 2, Rows: “many”');
		await page.getByRole('button', { name: /Save the 1 good cell/ }).click();
		await expect(cell(page, 0, 'rows').innerText()).resolves.toBe('2 rows');
	});

	it('fills down with Ctrl+D, then undoes and redoes it', async () => {
		await cell(page, 0, 'lengthFt').click();
		await cell(page, 2, 'lengthFt').click({ modifiers: ['Shift'] });
		await page.keyboard.press('Control+d');
		await expect(cell(page, 2, 'lengthFt').innerText()).resolves.toBe('40 ft');
		await expect(cell(page, 1, 'lengthFt').innerText()).resolves.toBe('40 ft');
		await page.keyboard.press('Control+z');
		await expect(cell(page, 2, 'lengthFt').innerText()).resolves.toBe('16 ft');
		await page.keyboard.press('Control+y');
		await expect(cell(page, 2, 'lengthFt').innerText()).resolves.toBe('40 ft');
		await saved(page);
	});
});

describe('the view in the address, and the data through the load', () => {
	it('keeps the grouping and week filter over a reload', async () => {
		const page = await browser.context.newPage();
		await openGrid(page, demo.owner);
		await page.getByLabel('Group by').selectOption('bed');
		await page.getByLabel('From week').fill('2031-W10');
		await page.waitForURL((u) => u.searchParams.get('group') === 'bed' && u.searchParams.get('from') === '2031-W10');
		await page.reload();
		await page.locator('[data-row="0"]').waitFor();
		await expect(page.getByLabel('Group by').inputValue()).resolves.toBe('bed');
		await expect(page.getByLabel('From week').inputValue()).resolves.toBe('2031-W10');
		await page.close();
		await browser.context.clearCookies();
	});

	it('a save loads the season again: a change made elsewhere shows, and a cell being typed in stays', async () => {
		const page = await browser.context.newPage();
		await openGrid(page, demo.owner);
		const loads = async (): Promise<number> =>
			Number(await page.getByTestId('plantings-page').getAttribute('data-loads'));
		const before = await loads();
		// Someone else's save, straight into the database (a new version, as the API would write it).
		await testDb()('plantings')
			.where({ id: ids[2] })
			.update({ notes: 'from the office', version: testDb().raw('version + 1') });
		await cell(page, 0, 'notes').click();
		await page.keyboard.type('mine');
		await page.keyboard.press('Enter');
		// Typing in another cell while the save goes out and the season loads again.
		await cell(page, 1, 'notes').click();
		await page.keyboard.type('half typed');
		await expect.poll(loads, { timeout: 10_000 }).toBeGreaterThan(before);
		await expect(cell(page, 2, 'notes').innerText()).resolves.toBe('from the office');
		await expect(page.getByTestId('cell-editor').inputValue()).resolves.toBe('half typed');
		await page.keyboard.press('Enter');
		await saved(page);
		await expect(cell(page, 0, 'notes').innerText()).resolves.toBe('mine');
		const notes = await testDb()('plantings').whereIn('id', ids.slice(0, 3)).orderBy('id').pluck('notes');
		expect(notes).toEqual(['mine', 'half typed', 'from the office']);
		await page.close();
		await browser.context.clearCookies();
	});
});

describe('two people edit the same planting', () => {
	it('the stale edit gets the conflict message naming who won, and nothing is lost', async () => {
		const other = await launch();
		const a = await browser.context.newPage();
		const b = await other.context.newPage();
		await openGrid(a, demo.owner);
		await openGrid(b, demo.crew);
		// The crew lead saves first.
		await cell(b, 3, 'notes').click();
		await b.keyboard.type('crew was here');
		await b.keyboard.press('Enter');
		await saved(b);
		// The owner's page still holds the old version.
		await cell(a, 3, 'notes').click();
		await a.keyboard.type('owner note');
		await a.keyboard.press('Enter');
		const conflict = a.getByTestId('conflicts');
		await conflict.waitFor();
		await expect(conflict.innerText()).resolves.toMatch(/Demo Crew|crew/i);
		await expect(conflict.innerText()).resolves.toContain('owner note');
		await expect(cell(a, 3, 'notes').innerText()).resolves.toBe('crew was here');
		await a.getByRole('button', { name: 'Re-apply my edit' }).click();
		await saved(a);
		expect((await testDb()('plantings').where({ id: ids[3] }).first('notes')).notes).toBe('owner note');
		await a.close();
		await browser.context.clearCookies();
		await other.close();
	});
});

describe('roles', () => {
	it('a crew lead cannot edit crop or bed-feet, but can set the status', async () => {
		const page = await browser.context.newPage();
		await openGrid(page, demo.crew);
		await expect(cell(page, 0, 'crop').getAttribute('aria-readonly')).resolves.toBe('true');
		await cell(page, 0, 'lengthFt').click();
		await page.keyboard.press('Enter');
		await expect(page.getByTestId('cell-editor').count()).resolves.toBe(0);
		await expect(page.getByTestId('grid-message').innerText()).resolves.toContain('read-only');
		await cell(page, 0, 'status').click();
		await page.keyboard.press('Enter');
		await page.getByTestId('cell-editor').fill('sow');
		await page.keyboard.press('Enter');
		await expect(cell(page, 0, 'status').innerText()).resolves.toBe('sown');
		await saved(page);
		expect((await testDb()('plantings').where({ id: ids[0] }).first('status')).status).toBe('sown');
		await page.close();
		await browser.context.clearCookies();
	});
});

describe('column preferences', () => {
	it('hide a column and size another on load; a save reloads the plantings without reading them again', async () => {
		const crew = await signedIn(demo.crew, demo.password);
		const put = await crew.json('/api/me/prefs/grid', 'PUT', { widths: { notes: 320 }, hidden: ['trays'] });
		expect(put.status).toBe(204);
		const page = await browser.context.newPage();
		await openGrid(page, demo.crew);
		const width = (col: string): Promise<number> => cell(page, 1, col).evaluate((e) => e.getBoundingClientRect().width);
		// The hidden column is not drawn; the sized one is as wide as the preference says.
		await expect(cell(page, 1, 'trays').count()).resolves.toBe(0);
		await expect(cell(page, 1, 'seeds').count()).resolves.toBe(1);
		await expect(width('notes')).resolves.toBe(320);

		const asked: string[] = [];
		page.on('request', (r) => asked.push(new URL(r.url()).pathname));
		const loads = async (): Promise<number> =>
			Number(await page.getByTestId('plantings-page').getAttribute('data-loads'));
		const before = await loads();
		await cell(page, 1, 'notes').click();
		await page.keyboard.type('prefs stay');
		await page.keyboard.press('Enter');
		await saved(page);
		await expect.poll(loads, { timeout: 10_000 }).toBeGreaterThan(before);
		expect(asked).toContain(`/api/seasons/${seasonId}/plantings`);
		expect(asked.filter((p) => p === '/api/me/prefs/grid' || p.endsWith('__data.json'))).toEqual([]);
		// The preferences still hold over the reload.
		await expect(cell(page, 1, 'trays').count()).resolves.toBe(0);
		await expect(width('notes')).resolves.toBe(320);
		await page.close();
		await browser.context.clearCookies();
	});
});
