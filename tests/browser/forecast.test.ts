// The forecast and share-box pages in headless Chromium, on the small invented farm of
// tests/integration/forecast-fixture.ts, with every expected figure worked out by hand.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launch, signIn, type BrowserSession, type Page } from '../helpers/browser';
import { closeTestDb, testDb } from '../helpers/db';
import { makeForecastFarm } from '../integration/forecast-fixture';

let browser: BrowserSession;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => {
	await browser.close();
	await closeTestDb();
});

async function fetches(page: Page): Promise<number> {
	return Number(await page.getByTestId('forecast-page').getAttribute('data-fetches'));
}
async function barValue(page: Page, crop: number, week: string): Promise<number> {
	return Number(
		await page
			.locator(`[data-testid="forecast-layer"][data-crop="${crop}"] [data-testid="forecast-bar"][data-week="${week}"]`)
			.getAttribute('data-value')
	);
}

describe('forecast chart', () => {
	it('draws a layer per crop over the asked weeks, and follows a change to the plan', async () => {
		const f = await makeForecastFarm('browser-forecast');
		const page = await browser.context.newPage();
		await signIn(page, f.email, f.password);
		await page.goto(`/seasons/${f.season2027}/forecast?from=2027-W22&to=2027-W27`);
		// Pounds and bunches do not add up: with mixed units the page opens on % of demand.
		await page.waitForFunction(() =>
			document.querySelector('[data-testid="axis-y"]')?.textContent?.includes('% of demand')
		);
		await expect(page.getByRole('radio', { name: '% of demand' }).isChecked()).resolves.toBe(true);
		await page.getByLabel('Quantity').check();
		await expect(page.getByTestId('mixed-units').innerText()).resolves.toContain('different units (bunch, lb)');
		await page.waitForFunction(
			() => Number(document.querySelector('[data-testid="forecast-page"]')?.getAttribute('data-fetches')) >= 1
		);

		// Four crops with figures (carrot, spinach, kale, chard); W22 … W27 is 6 weeks, one bar each.
		const layers = page.getByTestId('forecast-layer');
		await expect(layers.count()).resolves.toBe(4);
		for (let i = 0; i < 4; i++) await expect(layers.nth(i).getByTestId('forecast-bar').count()).resolves.toBe(6);
		await expect(page.getByTestId('forecast-chart').getAttribute('data-weeks')).resolves.toBe('6');
		await expect(page.getByTestId('balance-surplus').count()).resolves.toBe(6);
		// Carrot W24: 10 ft × 2 lb = 20 lb; nothing in W23.
		expect(await barValue(page, f.crops.carrot, '2027-W24')).toBeCloseTo(20, 9);
		expect(await barValue(page, f.crops.carrot, '2027-W23')).toBe(0);

		// Hover shows the week's figures.
		await page.locator('[data-testid="week-hit"][data-week="2027-W24"]').hover();
		const figures = page.getByTestId('week-figures');
		await expect(figures.innerText()).resolves.toContain('W24 · Mon 14 Jun');
		await expect(figures.innerText()).resolves.toMatch(/Carrot \(test\)\s+20 lb\s+25 lb\s+−5 lb short/);

		// Percent of demand: W24 has two crops with demand (carrot, kale), each weighing ½:
		// carrot 20 ÷ 25 × 100 ÷ 2 = 40; kale 12 ÷ 10 × 100 ÷ 2 = 60; spinach has no demand → 0.
		await page.getByLabel('% of demand').check();
		await page.waitForFunction(() =>
			document.querySelector('[data-testid="axis-y"]')?.textContent?.includes('% of demand')
		);
		expect(await barValue(page, f.crops.carrot, '2027-W24')).toBeCloseTo(40, 9);
		expect(await barValue(page, f.crops.kale, '2027-W24')).toBeCloseTo(60, 9);
		expect(await barValue(page, f.crops.spinach, '2027-W24')).toBe(0);
		await page.getByLabel('Quantity').check();

		// Lengthen the carrot planting to 15 ft (as the grid would in another tab), then come back to this
		// tab: the page's load runs again (its server part too, for the freshness note): 15 ft × 2 lb = 30 lb in W24.
		const before = await fetches(page);
		await testDb()('plantings').where({ id: f.plantings.carrot }).update({ length_ft: 15 });
		const serverLoad = page.waitForRequest((r) => new URL(r.url()).pathname.endsWith('/forecast/__data.json'));
		await page.evaluate(() => document.dispatchEvent(new Event('visibilitychange')));
		await serverLoad;
		await page.waitForFunction(
			(n) => Number(document.querySelector('[data-testid="forecast-page"]')?.getAttribute('data-fetches')) > n,
			before
		);
		expect(await barValue(page, f.crops.carrot, '2027-W24')).toBeCloseTo(30, 9);

		// Coming back to the tab refetches too: 20 ft → 40 lb.
		const again = await fetches(page);
		await testDb()('plantings').where({ id: f.plantings.carrot }).update({ length_ft: 20 });
		await page.evaluate(() => window.dispatchEvent(new Event('focus')));
		await page.waitForFunction(
			(n) => Number(document.querySelector('[data-testid="forecast-page"]')?.getAttribute('data-fetches')) > n,
			again
		);
		expect(await barValue(page, f.crops.carrot, '2027-W24')).toBeCloseTo(40, 9);

		// The same numbers as a table: 4 crop-weeks with figures (all in W24).
		await page.getByRole('button', { name: 'Table' }).click();
		const rows = page.getByTestId('forecast-table').locator('tbody tr');
		await expect(rows.count()).resolves.toBe(4);
		await expect(page.getByTestId('forecast-table').innerText()).resolves.toMatch(
			/Carrot \(test\)\s+40\s+25\s+0\s+15\s+lb\s+forecast/
		);
		await page.close();
		await browser.context.clearCookies();
	});

	it('picks one crop family', async () => {
		const f = await makeForecastFarm('browser-family');
		const page = await browser.context.newPage();
		await signIn(page, f.email, f.password);
		await page.goto(`/seasons/${f.season2027}/forecast?from=2027-W24&to=2027-W25`);
		await page.waitForFunction(
			() => Number(document.querySelector('[data-testid="forecast-page"]')?.getAttribute('data-fetches')) >= 1
		);
		const before = await fetches(page);
		// Amaranthaceae here: spinach and chard.
		await page.getByLabel('Crop family').selectOption('Amaranthaceae');
		await page.waitForFunction(
			(n) => Number(document.querySelector('[data-testid="forecast-page"]')?.getAttribute('data-fetches')) > n,
			before
		);
		const names = await page
			.getByTestId('forecast-layer')
			.evaluateAll((els) => els.map((e) => e.getAttribute('data-crop-name')));
		expect(names).toEqual(['Chard (test)', 'Spinach (test)']);

		// The choices live in the address: a reload (or the link shared) shows the same family, weeks and view.
		await page.getByRole('radio', { name: 'Quantity' }).check();
		await page.getByRole('button', { name: 'Table' }).click();
		await page.waitForURL((u) => u.searchParams.get('view') === 'table' && u.searchParams.get('mode') === 'quantity');
		await page.reload();
		await page.waitForFunction(
			() => Number(document.querySelector('[data-testid="forecast-page"]')?.getAttribute('data-fetches')) >= 1
		);
		await expect(page.getByLabel('Crop family').inputValue()).resolves.toBe('Amaranthaceae');
		await expect(page.getByLabel('From week').inputValue()).resolves.toBe('2027-W24');
		await expect(page.getByLabel('To week').inputValue()).resolves.toBe('2027-W25');
		await expect(page.getByRole('radio', { name: 'Quantity' }).isChecked()).resolves.toBe(true);
		await expect(page.getByRole('button', { name: 'Table' }).getAttribute('aria-pressed')).resolves.toBe('true');
		// The chosen view shows it is pressed, not only to a screen reader: its fill differs from the other's.
		const fill = (name: string): Promise<string> =>
			page.getByRole('button', { name, exact: true }).evaluate((e) => getComputedStyle(e).backgroundColor);
		const [table, chart] = [await fill('Table'), await fill('Chart')];
		expect(chart).toBe('rgb(255, 255, 255)');
		expect(table).not.toBe(chart);
		await expect(page.getByTestId('forecast-table').innerText()).resolves.toContain('Spinach (test)');
		await expect(page.getByTestId('forecast-table').innerText()).resolves.not.toContain('Carrot (test)');
		await page.close();
		await browser.context.clearCookies();
	});
});

describe('share boxes', () => {
	it('a swap moves the fill from 90 % to 100 %, and undo moves it back', async () => {
		const f = await makeForecastFarm('browser-boxes');
		const page = await browser.context.newPage();
		await signIn(page, f.email, f.password);
		await page.goto(`/seasons/${f.season2027}/boxes`);
		const full = page.locator(`[data-testid="box"][data-share="${f.shares.full}"][data-week="2027-W24"]`);
		// Carrot 20 ÷ 25 lb = 80 %, kale 100 % → full box (80 + 100) ÷ 2 = 90 %.
		await expect(full.getByTestId('box-fill').innerText()).resolves.toBe('90 %');
		await expect(full.innerText()).resolves.toContain('⚠ short');
		await expect(page.getByTestId('weeks-filled').innerText()).resolves.toBe('0 of 1 weeks');

		// Suggested: 0.5 lb spinach a box (5 lb short ÷ 10 members). After it, carrot 10 × 1.5 + 5 × 1 = 20 lb = supply.
		const spinach = full.getByTestId('substitute').filter({ hasText: 'Spinach (test)' });
		await expect(spinach.getByRole('textbox').inputValue()).resolves.toBe('0.5');
		await spinach.getByRole('button', { name: /^Swap Carrot \(test\) for Spinach \(test\)/ }).click();
		await page.waitForFunction(
			(sel) => document.querySelector(sel)?.textContent?.trim() === '100 %',
			`[data-testid="box"][data-share="${f.shares.full}"][data-week="2027-W24"] [data-testid="box-fill"]`
		);
		await expect(page.getByTestId('weeks-filled').innerText()).resolves.toBe('1 of 1 weeks');
		await expect(page.getByTestId('average-fill').innerText()).resolves.toBe('100 %');

		await page.getByRole('button', { name: /^Undo swap of Carrot \(test\) for Spinach \(test\)/ }).click();
		await page.waitForFunction(
			(sel) => document.querySelector(sel)?.textContent?.trim() === '90 %',
			`[data-testid="box"][data-share="${f.shares.full}"][data-week="2027-W24"] [data-testid="box-fill"]`
		);
		// Half box back at 80 %; season average (90 + 80) ÷ 2 = 85 %.
		await expect(page.getByTestId('average-fill').innerText()).resolves.toBe('85 %');
		await expect(page.locator('[data-testid="swap"][data-undone="true"]').count()).resolves.toBe(1);
		// On a phone the swaps table scrolls inside its own frame; the page itself does not scroll sideways.
		await page.setViewportSize({ width: 390, height: 844 });
		await expect(page.getByRole('region', { name: 'Swaps made (scrolls sideways)' }).isVisible()).resolves.toBe(true);
		await expect(
			page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)
		).resolves.toBeLessThanOrEqual(0);
		await page.close();
		await browser.context.clearCookies();
	});
});
