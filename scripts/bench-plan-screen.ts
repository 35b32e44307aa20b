/**
 * Plan-screen benchmark, in headless Chromium against the running test app, on the demo season
 * (the invented demo farm's 2027 season that the test set-up seeds).
 *
 * - plan.screen.preview_ms: from the click on Preview until the changes are on screen (the
 *   preview section drawn, one animation frame later). Goal < 1,000 ms.
 * - plan.screen.apply_ms: from the click on Apply until the screen says what was applied (the
 *   plantings written and the page's figures reloaded). Goal < 2,000 ms.
 * Each run's apply is undone through the API afterwards, so every run starts from the same plan.
 * Each figure is the median of several runs.
 */
import { chromium, type Page } from 'playwright-core';
import knex from 'knex';
import { knexConfig } from '../knexfile';
import { chromiumFlags } from '../tests/helpers/browser';

const RUNS = 5;

function median(xs: number[]): number {
	const s = [...xs].sort((a, b) => a - b);
	return Math.round(s[Math.floor(s.length / 2)]);
}

async function frame(page: Page): Promise<void> {
	await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => r(null))));
}

export async function runPlanScreenBench(): Promise<Record<string, number>> {
	const base = process.env.FC_BASE_URL;
	if (!base) throw new Error('FC_BASE_URL is not set: run through scripts/bench.sh');
	const db = knex(knexConfig(process.env.FC_DB_NAME));
	const browser = await chromium.launch({
		executablePath: process.env.FC_CHROMIUM ?? '/usr/bin/chromium',
		headless: true,
		args: chromiumFlags
	});
	try {
		const owner = await db('users').where({ email: 'owner@demo.furrowcast.test' }).first('id');
		const farmId = (await db('farm_members').where({ user_id: owner.id }).first('farm_id')).farm_id as number;
		const seasonId = (await db('seasons').where({ farm_id: farmId, year: 2027 }).first('id')).id as number;
		const context = await browser.newContext({ baseURL: base, viewport: { width: 1280, height: 900 } });
		const page = await context.newPage();
		await page.goto('/signin');
		await page.getByLabel('E-mail').fill('owner@demo.furrowcast.test');
		await page.getByLabel('Password').fill('demo-harvest-2027');
		await Promise.all([
			page.waitForURL((u) => !u.pathname.startsWith('/signin')),
			page.getByRole('button', { name: 'Sign in' }).click()
		]);

		const previews: number[] = [];
		const applies: number[] = [];
		for (let i = 0; i < RUNS + 1; i++) {
			await page.goto(`/seasons/${seasonId}/plan`);
			const preview = page.getByRole('button', { name: 'Preview', exact: true });
			await preview.waitFor();
			let t0 = Date.now();
			await preview.click();
			await page.getByTestId('plan-preview').waitFor();
			await frame(page);
			const p = Date.now() - t0;
			t0 = Date.now();
			await page.getByRole('button', { name: 'Apply', exact: true }).click();
			await page
				.getByTestId('plan-message')
				.filter({ hasText: /^Applied: / })
				.waitFor();
			await frame(page);
			const a = Date.now() - t0;
			// The first run warms the server and the browser; it is not counted.
			if (i > 0) {
				previews.push(p);
				applies.push(a);
			}
			const undo = await page.request.post(`/api/seasons/${seasonId}/plan/undo`);
			if (undo.status() !== 200) throw new Error(`undo answered ${undo.status()}`);
		}
		await context.close();
		return { 'plan.screen.preview_ms': median(previews), 'plan.screen.apply_ms': median(applies) };
	} finally {
		await browser.close();
		await db.destroy();
	}
}

// Run alone: npx tsx scripts/bench-plan-screen.ts (with FC_BASE_URL and FC_DB_NAME set).
if (import.meta.url === `file://${process.argv[1]}`) {
	for (const [k, v] of Object.entries(await runPlanScreenBench())) console.log(`${k}: ${v}`);
}
