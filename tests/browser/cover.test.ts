// The weekly cover of a succession in headless Chromium: the grid's explain panel (beside the grid
// on a desk, a drawer on a phone) and the plan preview show, per harvest week, the need, this
// planting's share and the other plantings harvesting then. On the small invented farm of
// forecast-fixture.ts plus a 2026 carrot planting dug in 2027's W24–W25; the crew lead on the demo farm.
import { join } from 'node:path';
import { tmpdir } from 'node:os';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launch, signIn, type BrowserSession, type Page } from '../helpers/browser';
import { closeTestDb, testDb } from '../helpers/db';
import { demo } from '../helpers/env';
import { addCarryOverCarrot, makeForecastFarm, type ForecastFarm } from '../integration/forecast-fixture';

let f: ForecastFarm;
beforeAll(async () => {
	f = await makeForecastFarm('cover-screen');
	const [block] = await testDb()('blocks').insert({ farm_id: f.farmId, name: 'Cover block (invented)', position: 0 });
	const [bed] = await testDb()('beds').insert({ farm_id: f.farmId, block_id: block, name: 'C1', length_ft: 100 });
	await testDb()('beds').insert({ farm_id: f.farmId, block_id: block, name: 'C2', length_ft: 100, position: 1 });
	// 7 ft × 2 lb/ft over Thu 17 – Wed 23 Jun 2027: 2 lb a day, 8 lb in W24 (Thu–Sun), 6 lb in W25.
	await addCarryOverCarrot(f, { bedId: bed, startFt: 50 });
});
afterAll(closeTestDb);

const shot = (page: Page, name: string) =>
	page.screenshot({ path: join(process.env.FC_SCREENSHOT_DIR ?? tmpdir(), `cover-${name}.png`), fullPage: false });

/** The carrot planting A's week W24 in a cover: need 25 lb, its own 20 lb, the 2026 planting's 8 lb, 3 lb over. */
async function expectCarrotWeek(scope: ReturnType<Page['getByTestId']>): Promise<void> {
	const week = scope.locator('[data-testid="cover-week"][data-week="2027-W24"]');
	await week.waitFor();
	await expect(week.getByTestId('cover-need').innerText()).resolves.toBe('need 25 lb');
	await expect(week.getByTestId('cover-own').innerText()).resolves.toMatch(/this planting\s+20 lb/);
	const other = await week.getByTestId('cover-other').innerText();
	expect(other).toMatch(/Test variety, Cover block \(invented\) · C1 @ 50 ft/);
	expect(other).toMatch(/2026 test season\s+8 lb/);
	await expect(week.getByTestId('cover-rest').innerText()).resolves.toContain('3 lb over the need (28 lb in all)');
}

describe('the explain panel shows the weeks a planting covers', () => {
	it('on a desk, beside the grid, as the owner', async () => {
		const browser: BrowserSession = await launch({ viewport: { width: 1280, height: 900 } });
		try {
			const page = await browser.context.newPage();
			await signIn(page, f.email, f.password);
			await page.goto(`/seasons/${f.season2027}/plantings?planting=${f.plantings.carrot}`);
			const panel = page.getByTestId('explain-cover');
			await panel.waitFor();
			await expectCarrotWeek(panel);
			await panel.scrollIntoViewIfNeeded();
			await shot(page, 'grid-1280-owner');
		} finally {
			await browser.close();
		}
	});

	it('on a phone, in the drawer, as the owner', async () => {
		const browser = await launch({ viewport: { width: 390, height: 844 } });
		try {
			const page = await browser.context.newPage();
			await signIn(page, f.email, f.password);
			await page.goto(`/seasons/${f.season2027}/plantings?planting=${f.plantings.carrot}`);
			await page.getByRole('button', { name: 'Show how the focused row was worked out' }).click();
			const drawer = page.getByRole('dialog', { name: 'How the focused row was worked out' });
			const panel = drawer.getByTestId('explain-cover');
			await panel.waitFor();
			await expectCarrotWeek(panel);
			await panel.scrollIntoViewIfNeeded();
			const overflow = await page.evaluate(
				() => document.documentElement.scrollWidth - document.documentElement.clientWidth
			);
			expect(overflow).toBeLessThanOrEqual(0);
			await shot(page, 'grid-390-owner');
		} finally {
			await browser.close();
		}
	});

	for (const width of [1280, 390]) {
		it(`the crew lead reads it too, on the demo farm at ${width} px`, async () => {
			const u = await testDb()('users').where({ email: demo.owner }).first('id');
			const farm = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
			const season = await testDb()('seasons').where({ farm_id: farm, year: 2027 }).first('id');
			// A demo planting harvesting in the season and of a crop with demand, so it covers some need.
			const p = await testDb()('plantings as p')
				.join('varieties as v', 'v.id', 'p.variety_id')
				.join('box_items as b', 'b.crop_id', 'v.crop_id')
				.where({ 'p.season_id': season.id, 'p.status': 'planned' })
				.orderBy('p.id')
				.first('p.id');
			const browser = await launch({ viewport: { width, height: width > 400 ? 900 : 844 } });
			try {
				const page = await browser.context.newPage();
				await signIn(page, demo.crew, demo.password);
				await page.goto(`/seasons/${season.id}/plantings?planting=${p.id}`);
				if (width < 1280) await page.getByRole('button', { name: 'Show how the focused row was worked out' }).click();
				const panel = page.locator('[data-testid="explain-cover"]:visible');
				await panel.locator('[data-testid="cover-week"]').first().waitFor();
				const text = await panel.innerText();
				expect(text).toMatch(/need [\d,.]+ /);
				expect(text).toMatch(/this planting\s+[\d,.]+ /);
				await panel.scrollIntoViewIfNeeded();
				await shot(page, `grid-${width}-crew`);
			} finally {
				await browser.close();
			}
		});
	}
});

describe('the plan preview shows the weeks each proposed succession covers', () => {
	for (const width of [1280, 390]) {
		it(`as the owner at ${width} px`, async () => {
			const browser = await launch({ viewport: { width, height: width > 400 ? 900 : 844 } });
			try {
				const page = await browser.context.newPage();
				await signIn(page, f.email, f.password);
				await page.goto(`/seasons/${f.season2027}/plan`);
				await page.getByRole('button', { name: 'Preview', exact: true }).click();
				await page.getByTestId('plan-preview').waitFor();
				const added = page.getByTestId('list-added');
				await added.locator('summary').click();
				// The carrot succession sized for W24: the plan needs 25 lb + 10 % beside the 2026 planting's 8 lb.
				const carrotRow = added.locator('tr', { hasText: 'Carrot (test)' }).first();
				await carrotRow.getByTestId('show-cover').click();
				const cover = added.getByTestId('cover').first();
				const week = cover.locator('[data-testid="cover-week"][data-week="2027-W24"]');
				await week.waitFor();
				await expect(week.getByTestId('cover-need').innerText()).resolves.toBe('need 25 lb');
				const others = await week.getByTestId('cover-other').allInnerTexts();
				expect(others.some((o) => /C1 @ 50 ft, in the field .*\(2026 test season\)\s+8 lb/.test(o))).toBe(true);
				// Nothing short in W24 after the apply.
				await expect(week.getByTestId('cover-rest').innerText()).resolves.toMatch(/over the need|met exactly/);
				await week.scrollIntoViewIfNeeded();
				await shot(page, `plan-${width}-owner`);
			} finally {
				await browser.close();
			}
		});
	}
});
