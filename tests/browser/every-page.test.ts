// Every page, as every role, in real Chromium: nothing wider than the window at a 1,280 px desk
// and a 390 px phone, and no serious or critical accessibility violation found by axe-core.
// The pages come from the access table (tests/integration/access-table.ts), which in turn must
// list every page on disk, so a new page is checked here without anyone remembering to add it.
// Source: WCAG 2.1 level A and AA success criteria, as axe-core's rules tag them
// (wcag2a, wcag2aa, wcag21a, wcag21aa); "serious" and "critical" are axe-core's own impact levels.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AxeBuilder } from '@axe-core/playwright';
import { launch, signIn, type BrowserSession, type Page } from '../helpers/browser';
import { closeTestDb } from '../helpers/db';
import { demo } from '../helpers/env';
import { accessTable, type Who } from '../integration/access-table';
import { makeAccessFixture, type AccessFixture } from '../integration/access-fixture';

const DESK = { width: 1280, height: 800 };
const PHONE = { width: 390, height: 844 };
const roles: { who: Who; email: string | null }[] = [
	{ who: 'anon', email: null },
	{ who: 'owner', email: demo.owner },
	{ who: 'crew', email: demo.crew },
	{ who: 'share', email: demo.share }
];

let browser: BrowserSession;
let fixture: AccessFixture;

beforeAll(async () => {
	browser = await launch({ viewport: DESK });
	fixture = await makeAccessFixture();
});
afterAll(async () => {
	await fixture?.cleanup();
	await closeTestDb();
	await browser?.close();
});

/** The pages `who` may open (200 in the access table); sign-out is left out, it ends the session. */
async function pagesFor(who: Who): Promise<{ key: string; url: string }[]> {
	const rows = accessTable.filter(
		(r) => r.key.endsWith(' page') && !r.key.startsWith('signout') && r.expect[who] === 200
	);
	return Promise.all(rows.map(async (r) => ({ key: r.key, url: await r.url(fixture, who) })));
}

/** How far the page is wider than its window, in CSS pixels (0 when it fits). */
const overflow = (page: Page): Promise<number> =>
	page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);

/**
 * axe-core's serious and critical findings. Contrast depends on the stylesheet, which is the same
 * for every role, and is by far the slowest rule on long tables: it runs once, as the owner (who
 * sees every page and every control); the other roles run every other rule.
 */
async function serious(page: Page, contrast: boolean): Promise<string[]> {
	const axe = new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']);
	if (!contrast) axe.disableRules(['color-contrast']);
	const result = await axe.analyze();
	return result.violations
		.filter((v) => v.impact === 'serious' || v.impact === 'critical')
		.map(
			(v) =>
				`${v.id} (${v.impact}): ${v.nodes
					.map((n) => n.target.join(' '))
					.slice(0, 3)
					.join(' | ')}`
		);
}

describe.each(roles)('every page as $who', ({ who, email }) => {
	let page: Page;
	beforeAll(async () => {
		await browser.context.clearCookies();
		page = await browser.context.newPage();
		if (email) await signIn(page, email, demo.password);
	});
	afterAll(async () => page?.close());

	it('fits the window at 1,280 and 390 px, with no serious or critical axe violation', async () => {
		const pages = await pagesFor(who);
		expect(pages.length).toBeGreaterThan(who === 'anon' ? 3 : 12);
		const problems: string[] = [];
		for (const { key, url } of pages) {
			await page.setViewportSize(DESK);
			const res = await page.goto(url, { waitUntil: 'networkidle' });
			if (!res || res.status() !== 200) {
				problems.push(`${key} (${url}): answered ${res?.status()}`);
				continue;
			}
			const wide = await overflow(page);
			if (wide > 0) problems.push(`${key} (${url}): ${wide} px wider than a 1,280 px window`);
			for (const v of await serious(page, who === 'owner' || who === 'anon')) problems.push(`${key} (${url}): ${v}`);
			await page.setViewportSize(PHONE);
			await page.waitForTimeout(50);
			const narrow = await overflow(page);
			if (narrow > 0) problems.push(`${key} (${url}): ${narrow} px wider than a 390 px phone`);
		}
		expect(problems).toEqual([]);
	}, 300_000);
});
