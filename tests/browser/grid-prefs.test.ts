// A user's grid preferences (hidden columns, column widths) load with the planting grid and apply; a save
// reloads the plantings through `invalidate('app:plan')` without reading the preferences again.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launch, signIn, type BrowserSession } from '../helpers/browser';
import { demo } from '../helpers/env';
import { closeTestDb, testDb } from '../helpers/db';
import { signedIn } from '../helpers/http';

let browser: BrowserSession;
let seasonId: number;
let crewId: string;
let crewPrefsBefore: { prefs: string } | undefined;

beforeAll(async () => {
	browser = await launch({ viewport: { width: 1600, height: 900 } });
	const owner = await testDb()('users').where({ email: demo.owner }).first('id');
	crewId = (await testDb()('users').where({ email: demo.crew }).first('id')).id;
	crewPrefsBefore = await testDb()('user_grid_prefs').where({ user_id: crewId, grid: 'plantings' }).first('prefs');
	const farmId = (await testDb()('farm_members').where({ user_id: owner.id }).first('farm_id')).farm_id;
	// A season of its own, so the crew lead's status edit never touches the demo season other tests read.
	[seasonId] = await testDb()('seasons').insert({
		farm_id: farmId,
		year: 2032,
		name: '2032 grid prefs test (invented)',
		starts_on: '2032-01-01',
		ends_on: '2032-12-31'
	});
	const variety = await testDb()('varieties').where({ farm_id: farmId, method: 'direct' }).first('id');
	const bed = await testDb()('beds').where({ farm_id: farmId }).orderBy('length_ft', 'desc').first('id');
	const ownerClient = await signedIn(demo.owner, demo.password);
	const res = await ownerClient.json(`/api/seasons/${seasonId}/plantings`, 'POST', {
		plantings: [0, 1].map((i) => ({
			varietyId: variety.id,
			bedId: bed.id,
			startFt: i * 25,
			lengthFt: 20,
			fieldDate: '2032-05-03'
		}))
	});
	expect(res.status).toBe(201);
});
afterAll(async () => {
	await testDb()('plantings').where({ season_id: seasonId }).delete();
	await testDb()('seasons').where({ id: seasonId }).delete();
	const own = testDb()('user_grid_prefs').where({ user_id: crewId, grid: 'plantings' });
	if (crewPrefsBefore) await own.update({ prefs: crewPrefsBefore.prefs });
	else await own.delete();
	await closeTestDb();
	await browser.close();
});

describe('grid preferences', () => {
	it('hide a column and size another on load, and a save reloads the plantings without reading them again', async () => {
		const crew = await signedIn(demo.crew, demo.password);
		const put = await crew.json('/api/me/prefs/grid', 'PUT', { widths: { notes: 320 }, hidden: ['trays'] });
		expect(put.status).toBe(204);

		const page = await browser.context.newPage();
		await signIn(page, demo.crew, demo.password);
		await page.goto(`/seasons/${seasonId}/plantings`);
		const row = page.locator('[data-row="0"]');
		await row.waitFor();
		// The hidden column is not drawn; the sized one is as wide as the preference says.
		await expect(row.locator('[data-col="trays"]').count()).resolves.toBe(0);
		await expect(row.locator('[data-col="seeds"]').count()).resolves.toBe(1);
		await expect(row.locator('[data-col="notes"]').evaluate((e) => e.getBoundingClientRect().width)).resolves.toBe(320);

		const asked: string[] = [];
		page.on('request', (r) => asked.push(new URL(r.url()).pathname));
		const loads = async (): Promise<number> =>
			Number(await page.getByTestId('plantings-page').getAttribute('data-loads'));
		const before = await loads();
		// The crew lead records a planting's status: the save, then the plantings loaded again.
		await row.locator('[data-col="status"]').click();
		await page.keyboard.press('Enter');
		await page.getByTestId('cell-editor').fill('sow');
		await page.keyboard.press('Enter');
		await page.getByTestId('save-status').getByText('All changes saved').waitFor({ timeout: 10_000 });
		await expect.poll(loads, { timeout: 10_000 }).toBeGreaterThan(before);
		expect(asked).toContain(`/api/seasons/${seasonId}/plantings`);
		expect(asked.filter((p) => p === '/api/me/prefs/grid' || p.endsWith('__data.json'))).toEqual([]);
		// And the preferences still hold over the reload.
		await expect(row.locator('[data-col="trays"]').count()).resolves.toBe(0);
		await expect(row.locator('[data-col="notes"]').evaluate((e) => e.getBoundingClientRect().width)).resolves.toBe(320);
		await page.close();
		await browser.context.clearCookies();
	});
});
