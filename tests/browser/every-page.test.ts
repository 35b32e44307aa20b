// Every page, as each role (and signed out), in headless Chromium: no page is wider than the
// window at 1,280 × 800 or at 390 × 844 (document.documentElement.scrollWidth against the
// window's width), and axe-core finds no serious or critical violation (WCAG 2.1 A and AA rules).
// The pages come from the access table, so a new page is checked as soon as it has its row.
// Source for the rules: axe-core's WCAG 2.0/2.1 A and AA tags (Deque, axe-core rule descriptions).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import AxeBuilder from '@axe-core/playwright';
import { chromium, type Browser } from 'playwright-core';
import { chromiumFlags, signIn, type Page } from '../helpers/browser';
import { baseUrl } from '../helpers/env';
import { closeTestDb } from '../helpers/db';
import { demo } from '../helpers/env';
import { accessTable, type Who } from '../integration/access-table';
import { makeAccessFixture, type AccessFixture } from '../integration/access-fixture';

// One browser; each role in its own context (its own cookies), the roles side by side.
let browser: Browser;
let f: AccessFixture;
beforeAll(async () => {
	browser = await chromium.launch({ executablePath: process.env.FC_CHROMIUM ?? '/usr/bin/chromium', headless: true, args: chromiumFlags });
	f = await makeAccessFixture();
});
afterAll(async () => {
	await f?.cleanup();
	await browser?.close();
	await closeTestDb();
});

/** The pages a visitor opens (200), or is sent on from (307, the crew sheets to this week's). */
async function pagesFor(who: Who): Promise<string[]> {
	const out: string[] = [];
	for (const row of accessTable) {
		if (!row.key.endsWith(' page') || row.key.startsWith('signout')) continue;
		const status = row.expect[who];
		if (status === 200 || status === 307) out.push(await row.url(f, who));
	}
	return out;
}

interface Finding {
	url: string;
	problem: string;
}

async function widthProblem(page: Page, width: number): Promise<string | null> {
	await page.setViewportSize({ width, height: width > 500 ? 800 : 844 });
	// Let charts that measure their box redraw at the new width.
	await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(() => r(null)))));
	const { scroll, inner, widest } = await page.evaluate(() => {
		const inner = window.innerWidth;
		let widest = '';
		let max = 0;
		for (const el of document.querySelectorAll('body *')) {
			const r = el.getBoundingClientRect();
			if (r.right > inner + 1 && r.right > max && getComputedStyle(el).position !== 'fixed') {
				max = r.right;
				widest = `${el.tagName.toLowerCase()}${el.id ? '#' + el.id : ''}.${String(el.className).split(' ').slice(0, 3).join('.')} (${Math.round(r.right)} px)`;
			}
		}
		return { scroll: document.documentElement.scrollWidth, inner, widest };
	});
	return scroll > inner ? `${scroll} px wide in a ${inner} px window; widest: ${widest}` : null;
}

async function visitAll(who: Who): Promise<Finding[]> {
	const findings: Finding[] = [];
	const context = await browser.newContext({ baseURL: baseUrl(), viewport: { width: 1280, height: 800 } });
	const page = await context.newPage();
	if (who !== 'anon') await signIn(page, demo[who as 'owner' | 'crew' | 'share'], demo.password);
	for (const url of await pagesFor(who)) {
		await page.setViewportSize({ width: 1280, height: 800 });
		const res = await page.goto(url, { waitUntil: 'load' });
		if (!res || res.status() >= 400) {
			findings.push({ url, problem: `answered ${res?.status()}` });
			continue;
		}
		await page.waitForLoadState('networkidle').catch(() => undefined);
		const axe = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
		for (const v of axe.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical')) {
			findings.push({ url, problem: `axe ${v.impact} ${v.id}: ${v.help} — ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(' | ')}${v.nodes.length > 3 ? ` (+${v.nodes.length - 3})` : ''}` });
		}
		for (const width of [1280, 390]) {
			const p = await widthProblem(page, width);
			if (p) findings.push({ url, problem: `at ${width} px: ${p}` });
		}
	}
	await context.close();
	return findings;
}

describe.concurrent('every page fits the window and passes axe-core', () => {
	for (const who of ['owner', 'crew', 'share', 'anon'] as const) {
		it(`as ${who}`, async () => {
			const pages = await pagesFor(who);
			expect(pages.length).toBeGreaterThan(who === 'anon' ? 3 : 15);
			const findings = await visitAll(who);
			expect(findings.map((x) => `${x.url}: ${x.problem}`)).toEqual([]);
		}, 600_000);
	}
});
