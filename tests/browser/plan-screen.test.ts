// The plan screen in headless Chromium, on the small invented farm of forecast-fixture.ts with
// two beds added: Preview lists the changes and writes nothing; Apply writes; Undo restores the
// planned plantings exactly (every column, ids and versions included); an apply from another tab
// made while a preview is on screen makes that preview stale, and the server refuses it (409).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launch, signIn, type BrowserSession, type Page } from '../helpers/browser';
import { closeTestDb, count, testDb } from '../helpers/db';
import { makeForecastFarm, type ForecastFarm } from '../integration/forecast-fixture';

let browser: BrowserSession;
let f: ForecastFarm;
beforeAll(async () => {
	browser = await launch();
	f = await makeForecastFarm('plan-screen');
	const [block] = await testDb()('blocks').insert({ farm_id: f.farmId, name: 'Test block (invented)', position: 0 });
	await testDb()('beds').insert([
		{ farm_id: f.farmId, block_id: block, name: 'T1', length_ft: 100, position: 0 },
		{ farm_id: f.farmId, block_id: block, name: 'T2', length_ft: 100, position: 1 }
	]);
});
afterAll(async () => {
	await browser.close();
	await closeTestDb();
});

/** Every column of every planting of the season, in id order. */
async function plantings(): Promise<Record<string, unknown>[]> {
	return testDb()('plantings').where({ season_id: f.season2027 }).orderBy('id').select('*');
}
async function counts(): Promise<Record<string, number>> {
	return {
		plantings: await count('plantings', { season_id: f.season2027 }),
		applies: await count('plan_applies', { season_id: f.season2027 }),
		version: Number((await testDb()('seasons').where({ id: f.season2027 }).first('plan_version')).plan_version)
	};
}
async function countOf(page: Page, key: string): Promise<number> {
	return Number(await page.getByTestId(`count-${key}`).getAttribute('data-value'));
}
async function preview(page: Page): Promise<void> {
	await page.getByRole('button', { name: 'Preview', exact: true }).click();
	await page.getByTestId('plan-preview').waitFor();
}

describe('plan screen', () => {
	it('previews without writing, applies, undoes exactly, and notices a second apply', async () => {
		const page = await browser.context.newPage();
		await signIn(page, f.email, f.password);
		await page.goto(`/seasons/${f.season2027}/plan`);
		// Reachable from the season's tabs.
		await expect(
			page
				.getByRole('navigation', { name: 'Season' })
				.getByRole('link', { name: 'Plan', exact: true })
				.getAttribute('aria-current')
		).resolves.toBe('page');
		// Crops with demand: carrot (W24: 10 × 2 lb + 5 × 1 lb = 25 lb) and kale (10 × 1 bunch).
		await expect(page.getByTestId('plan-crop').count()).resolves.toBe(2);
		await expect(
			page.locator('[data-testid="plan-crop"]', { hasText: 'Carrot (test)' }).innerText()
		).resolves.toContain('25 lb over 1 week');

		const before = await plantings();
		const beforeCounts = await counts();
		await preview(page);
		// The 4 planned plantings go or stay; the failed one is kept; nothing is written.
		expect(await countOf(page, 'kept')).toBe(1);
		expect((await countOf(page, 'removed')) + (await countOf(page, 'unchanged'))).toBe(4);
		expect(await countOf(page, 'added')).toBeGreaterThanOrEqual(2);
		// Now: the four planned plantings (the failed one left out), 10 + 5 + 12 + 8 = 35 bed-feet.
		const totals = await page.getByTestId('plan-totals').innerText();
		expect(totals).toMatch(/Plantings\s+4\s+\d+/);
		expect(totals).toMatch(/Bed-feet\s+35 ft\s+/);
		await expect(page.getByTestId('plan-balance').count()).resolves.toBe(2);
		await expect(page.getByTestId('plan-shortfall').innerText()).resolves.toContain('Every week');
		expect(await plantings()).toEqual(before);
		expect(await counts()).toEqual(beforeCounts);

		// Apply writes: the failed planting stays; the planned ones are the plan's.
		const added = await countOf(page, 'added');
		const unchanged = await countOf(page, 'unchanged');
		await page.getByRole('button', { name: 'Apply', exact: true }).click();
		await expect(page.getByTestId('plan-message').innerText()).resolves.toMatch(/^Applied: /);
		const applied = await counts();
		expect(applied.applies).toBe(1);
		expect(applied.version).toBe(beforeCounts.version + 1);
		expect(await count('plantings', { season_id: f.season2027, status: 'planned' })).toBe(added + unchanged);
		expect(await testDb()('plantings').where({ id: f.plantings.failed }).first('status')).toEqual({ status: 'failed' });
		await expect(page.getByTestId('plan-state').innerText()).resolves.toContain('Plan last applied');

		// Undo in one step restores every column of every planting, but for the change stamp: the rows
		// put back are written anew, which is what tells the plantings answer cache (its migration,
		// 20261203_11d_change_stamps.ts) that the season changed.
		page.once('dialog', (d) => void d.accept());
		await page.getByRole('button', { name: 'Undo last apply' }).click();
		await expect(page.getByTestId('plan-message').innerText()).resolves.toMatch(/^Undone: /);
		const unstamped = (rows: Record<string, unknown>[]) => rows.map(({ change_seq: _, ...rest }) => rest);
		const undone = await plantings();
		expect(unstamped(undone)).toEqual(unstamped(before));
		expect(undone.map((r) => r.change_seq)).not.toEqual(before.map((r) => r.change_seq));
		await expect(page.getByRole('button', { name: 'Undo last apply' }).isDisabled()).resolves.toBe(true);

		// A preview on screen, then a second session of the farm's owner previews and applies.
		await preview(page);
		// (A second tab: the persistent browser context has one cookie jar, so it is the owner again.)
		const otherPage = await browser.context.newPage();
		await otherPage.goto(`/seasons/${f.season2027}/plan`);
		await preview(otherPage);
		await otherPage.getByRole('button', { name: 'Apply', exact: true }).click();
		await expect(otherPage.getByTestId('plan-message').innerText()).resolves.toMatch(/^Applied: /);
		const afterSecond = await counts();

		// The first screen finds out on its next check (coming back to the tab) and says so.
		await page.evaluate(() => window.dispatchEvent(new Event('focus')));
		await page.getByTestId('plan-stale').waitFor();
		await expect(page.getByRole('button', { name: 'Apply', exact: true }).isDisabled()).resolves.toBe(true);
		// And the server refuses that preview's fingerprint even if it is sent anyway.
		const fingerprint = await page.evaluate(async (id) => {
			const r = await fetch(`/api/seasons/${id}/plan/preview`, {
				method: 'POST',
				headers: { 'content-type': 'application/json' },
				body: '{}'
			});
			return ((await r.json()) as { fingerprint: string }).fingerprint;
		}, f.season2027);
		await testDb()('plantings')
			.where({ season_id: f.season2027, status: 'planned' })
			.limit(1)
			.update({ notes: 'edited meanwhile', version: testDb().raw('version + 1') });
		const stale = await page.evaluate(
			async ([id, fp]) =>
				(
					await fetch(`/api/seasons/${id}/plan/apply`, {
						method: 'POST',
						headers: { 'content-type': 'application/json' },
						body: JSON.stringify({ fingerprint: fp })
					})
				).status,
			[f.season2027, fingerprint] as const
		);
		expect(stale).toBe(409);
		expect(await counts()).toEqual(afterSecond);
		await otherPage.close();
		await page.close();
	});
});
