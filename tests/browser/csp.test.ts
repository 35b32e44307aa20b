// The Content-Security-Policy does not break the app: every screen of a season, the grid, the
// charts and the timeline load and work in headless Chromium with no CSP violation reported,
// and a script injected into the page from outside is refused. Source: W3C Content Security
// Policy Level 3 (the `securitypolicyviolation` event, §5.3), as Chromium implements it.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launch, signIn, type BrowserSession, type Page } from '../helpers/browser';
import { demo } from '../helpers/env';
import { closeTestDb, testDb } from '../helpers/db';

let browser: BrowserSession;
let seasonId: number;
beforeAll(async () => {
	browser = await launch();
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	const farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id as number;
	// The demo's main season: the one with the most plantings.
	const main = await testDb()('plantings')
		.where({ farm_id: farmId })
		.groupBy('season_id')
		.orderByRaw('count(*) desc')
		.first('season_id');
	seasonId = main.season_id as number;
});
afterAll(async () => {
	await browser.close();
	await closeTestDb();
});

/** Collects CSP violations (console and DOM events) on a page, from before any script runs. */
async function watch(page: Page): Promise<string[]> {
	const seen: string[] = [];
	page.on('console', (m) => {
		if (/Content Security Policy/i.test(m.text()))
			seen.push(`${new URL(page.url()).pathname}: ${m.text().slice(0, 200)}`);
	});
	page.on('pageerror', (e) => seen.push(`${new URL(page.url()).pathname}: page error: ${e.message}`));
	await page.exposeFunction('__cspViolation', (s: string) => seen.push(`${new URL(page.url()).pathname}: ${s}`));
	await page.addInitScript(
		`document.addEventListener('securitypolicyviolation', (e) => window.__cspViolation(e.violatedDirective + ' ' + e.blockedURI));`
	);
	return seen;
}

describe('the CSP on every screen', () => {
	it('the owner goes through every season screen: no violation, and the grid, charts and timeline draw', async () => {
		const page = await browser.context.newPage();
		const seen = await watch(page);
		await signIn(page, demo.owner, demo.password);
		const screens: [string, string][] = [
			['', 'main'],
			[`/seasons/${seasonId}`, 'main'],
			[`/seasons/${seasonId}/plantings`, '[data-row="0"]'],
			[`/seasons/${seasonId}/beds`, 'svg'],
			[`/seasons/${seasonId}/demand`, 'table'],
			[`/seasons/${seasonId}/forecast`, 'svg path'],
			[`/seasons/${seasonId}/boxes`, 'main'],
			[`/seasons/${seasonId}/week`, 'main'],
			[`/seasons/${seasonId}/transfer`, 'main'],
			[`/seasons/${seasonId}/harvests`, 'main'],
			[`/seasons/${seasonId}/results`, 'main'],
			['/crops', 'main'],
			['/settings', 'main'],
			['/team', 'main'],
			['/calendar', 'main'],
			['/import', 'main']
		];
		for (const [path, selector] of screens) {
			const res = await page.goto(path || '/');
			expect(res?.status(), path).toBe(200);
			await page.locator(selector).first().waitFor({ state: 'attached' });
			await page.waitForLoadState('networkidle');
		}
		// The grid works (its scripts ran): a cell takes focus and the keyboard moves it.
		await page.goto(`/seasons/${seasonId}/plantings`);
		await page.locator('[data-row="0"] [data-col="lengthFt"]').click();
		await page.keyboard.press('ArrowDown');
		await expect(page.locator('[data-row="1"] [data-col="lengthFt"]').getAttribute('aria-selected')).resolves.toBe(
			'true'
		);
		expect(seen).toEqual([]);
		await page.close();
		await browser.context.clearCookies();
	});

	it('an inline script slipped into the page is refused and reported', async () => {
		const page = await browser.context.newPage();
		const seen = await watch(page);
		await page.goto('/signin');
		await page.evaluate(() => {
			const s = document.createElement('script');
			s.textContent = 'window.__injected = true';
			document.body.append(s);
		});
		await page.waitForTimeout(100);
		expect(await page.evaluate(() => (window as unknown as { __injected?: boolean }).__injected ?? false)).toBe(false);
		expect(seen.some((s) => /script-src/.test(s))).toBe(true);
		await page.close();
	});
});
