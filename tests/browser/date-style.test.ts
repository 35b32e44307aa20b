// The farm's date style, end to end in Chromium: the owner picks day/month/year in Farm & beds,
// and a date pasted into the planting grid is then read that way, whatever the browser's own
// language is (this browser runs in en-US). Checked on a desk and on a 390 px phone.
// Source: the day/month order of each locale comes from Intl.DateTimeFormat (CLDR data):
// en-GB writes 24/06/2027, en-US writes 6/24/2027.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launch, pasteIntoGrid, signIn, type BrowserSession } from '../helpers/browser';
import { closeTestDb, testDb } from '../helpers/db';
import { signUpFarm, writeHandPlan, type NewFarm } from '../helpers/transfer';

let browser: BrowserSession;
let farm: NewFarm;
let seasonId: number;

beforeAll(async () => {
	browser = await launch({ viewport: { width: 1280, height: 900 } });
	farm = await signUpFarm('date-style');
	({ seasonId } = await writeHandPlan(farm.farmId));
});
afterAll(async () => {
	await closeTestDb();
	await browser.close();
});

describe('a farm that writes day/month/year', () => {
	it('the owner chooses the date style in Farm & beds', async () => {
		const page = await browser.context.newPage();
		await signIn(page, farm.email, 'long-enough-pass');
		await page.goto('/settings');
		const select = page.locator('#field-dateLocale');
		// Each choice shows how it writes 24 June 2028.
		await expect(select.locator('option[value="en-GB"]').innerText()).resolves.toBe('24/06/2028 · en-GB');
		await select.selectOption('en-GB');
		await page.locator('form[action="?/farm"]').getByRole('button', { name: /Save/ }).click();
		await page.getByRole('status').getByText('Saved.').waitFor();
		await page.screenshot({ path: '/tmp/fc-date-style-desk.png', fullPage: false });
		expect((await testDb()('farms').where({ id: farm.farmId }).first('date_locale')).date_locale).toBe('en-GB');
		await page.close();
	});

	it('a pasted 12/07/2027 is 12 July in the grid, and the review says how it was read', async () => {
		const page = await browser.context.newPage();
		await page.setViewportSize({ width: 390, height: 844 });
		await page.goto(`/seasons/${seasonId}/plantings`);
		await page.locator('[data-row="0"]').waitFor();
		const first = await testDb()('plantings').where({ season_id: seasonId }).orderBy('id').first('id', 'field_date');
		await page.locator('[data-row="0"] [data-col="fieldDate"]').click();
		await pasteIntoGrid(page, '12/07/2027');
		// Day and month could swap: nothing is saved until the reading is confirmed.
		await expect(page.getByTestId('paste-note').innerText()).resolves.toMatch(
			/read as 12 July 2027 \(day\/month\/year, as en-GB writes dates\)/
		);
		await page.screenshot({ path: '/tmp/fc-date-style-phone.png', fullPage: false });
		await page.getByRole('button', { name: /Save the 1 good cell/ }).click();
		await page.getByTestId('save-status').getByText('All changes saved').waitFor({ timeout: 10_000 });
		const saved = await testDb()('plantings').where({ season_id: seasonId }).whereNot({ field_date: first.field_date });
		expect(saved.map((p: { field_date: string }) => p.field_date)).toContain('2027-07-12');
		await page.close();
	});
});
