/**
 * Planting-grid benchmark, in headless Chromium against the running test app: an invented
 * bench farm with 5,000 plantings, created here and removed again.
 *
 * - grid.first_paint_ms: navigation to the grid page until its first rows are painted
 *   (the page fetches the JSON and recalculates every row in the browser first).
 * - grid.plain_table_ms: the floor: the same 5,000 rows as a plain HTML table, served at a
 *   same-origin address and loaded by the same browser in the same run.
 * - grid.first_paint_ratio: the two divided (goal ≤ 1.0).
 * - grid.edit_ms: from the Enter that commits a bed-feet edit until the row's derived seed
 *   cell shows the new figure (goal under one 16 ms frame).
 * Each figure is the median of several runs.
 */
import { chromium, type Page } from 'playwright-core';
import knex from 'knex';
import { pathToFileURL } from 'node:url';
import { knexConfig } from '../knexfile';
import { chromiumFlags } from '../tests/helpers/browser';
import { Client } from '../tests/helpers/http';
import { confirmedSignUp } from '../tests/helpers/signup';
import { benchGround } from './bench-ground';

const ROWS = 5000;
const RUNS = 5;

function median(xs: number[]): number {
	const s = [...xs].sort((a, b) => a - b);
	return Math.round(s[Math.floor(s.length / 2)] * 100) / 100;
}

export async function runGridBench(): Promise<Record<string, number>> {
	const base = process.env.FC_BASE_URL;
	if (!base) throw new Error('FC_BASE_URL is not set: run through scripts/bench.sh');
	const db = knex(knexConfig(process.env.FC_DB_NAME));
	const email = `bench-grid-${Date.now().toString(36)}@bench.furrowcast.test`;
	const password = 'bench-grid-password';
	let farmId: number | undefined;
	const browser = await chromium.launch({
		executablePath: process.env.FC_CHROMIUM ?? '/usr/bin/chromium',
		headless: true,
		args: chromiumFlags
	});
	try {
		// The bench farm signs up as a person does (the form, then the mailed link); its ground and plan
		// are written straight in.
		const signup = await confirmedSignUp(new Client(), {
			name: 'Bench Grower (invented)',
			email,
			password,
			farmName: 'Bench Farm (invented)',
			latitude: '42',
			lastSpringFrost: '2027-05-10',
			firstFallFrost: '2027-10-05'
		});
		if (signup.status !== 303) throw new Error(`bench sign-up answered ${signup.status}`);
		const user = await db('users').where({ email }).first('id');
		farmId = (await db('farm_members').where({ user_id: user.id }).first('farm_id')).farm_id as number;
		const { seasonId, varietyId, bedIds } = await benchGround(db, farmId);
		const rows = Array.from({ length: ROWS }, (_, i) => {
			const day = 1 + (i % 28);
			return {
				farm_id: farmId,
				season_id: seasonId,
				variety_id: varietyId,
				bed_id: bedIds[i % 100],
				start_ft: (Math.floor(i / 100) % 5) * 20,
				length_ft: 20,
				rows: 4,
				in_row_spacing_in: 1,
				seeds_per_spot: 1,
				method: 'direct',
				field_date: `2027-0${4 + (Math.floor(i / 500) % 5)}-${String(day).padStart(2, '0')}`,
				first_harvest: '2027-07-01',
				last_harvest: '2027-07-14',
				expected_yield: 30,
				seeds_needed: 1000
			};
		});
		for (let i = 0; i < rows.length; i += 500) await db('plantings').insert(rows.slice(i, i + 500));

		const context = await browser.newContext({ baseURL: base, viewport: { width: 1600, height: 1000 } });
		const page = await context.newPage();
		await page.goto('/signin');
		await page.getByLabel('E-mail').fill(email);
		await page.getByLabel('Password').fill(password);
		await Promise.all([
			page.waitForURL((u) => !u.pathname.startsWith('/signin')),
			page.getByRole('button', { name: 'Sign in' }).click()
		]);

		const json = await (await page.request.get(`/api/seasons/${seasonId}/plantings`)).json();
		const esc = (s: unknown): string =>
			String(s ?? '').replace(/[&<>]/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;' })[c]!);
		const plain = `<!doctype html><html><body><table><thead><tr><th>Crop</th><th>Variety</th><th>Bed</th><th>Start</th><th>Bed-feet</th><th>Rows</th><th>Spacing</th><th>Field date</th><th>First harvest</th><th>Last harvest</th><th>Yield</th><th>Seeds</th><th>Status</th></tr></thead><tbody>${(
			json.plantings as Record<string, unknown>[]
		)
			.map(
				(p, i) =>
					`<tr data-plain="${i}"><td>${esc(p.crop)}</td><td>${esc(p.variety)}</td><td>${esc(p.bed)}</td><td>${p.startFt} ft</td><td>${p.lengthFt} ft</td><td>${p.rows}</td><td>${p.inRowSpacingIn} in</td><td>${p.fieldDate}</td><td>${p.firstHarvest}</td><td>${p.lastHarvest}</td><td>${p.expectedYield} lb</td><td>${p.seedsNeeded} seeds</td><td>${p.status}</td></tr>`
			)
			.join('')}</tbody></table></body></html>`;
		await page.route('**/__bench-plain-table', (route) =>
			route.fulfill({ status: 200, contentType: 'text/html', body: plain })
		);

		const paint = async (url: string, selector: string): Promise<number> => {
			await page.goto('about:blank');
			const t0 = Date.now();
			await page.goto(url, { waitUntil: 'commit' });
			await page.locator(selector).first().waitFor({ state: 'visible' });
			// One animation frame after the rows exist: they are painted.
			await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => r(null))));
			return Date.now() - t0;
		};
		const gridTimes: number[] = [];
		const plainTimes: number[] = [];
		for (let i = 0; i < RUNS + 1; i++) {
			const g = await paint(`/seasons/${seasonId}/plantings`, '[data-row="0"]');
			const p = await paint('/__bench-plain-table', `[data-plain="${ROWS - 1}"]`);
			// The first round warms caches (JS bundle, fonts) for both: not counted.
			if (i > 0) {
				gridTimes.push(g);
				plainTimes.push(p);
			}
		}

		await paint(`/seasons/${seasonId}/plantings`, '[data-row="0"]');
		const editTimes: number[] = [];
		for (let i = 0; i < RUNS; i++) editTimes.push(await timeEdit(page, String(21 + i)));

		const firstPaint = median(gridTimes);
		const plainTable = median(plainTimes);
		return {
			'grid.first_paint_ms': firstPaint,
			'grid.plain_table_ms': plainTable,
			'grid.first_paint_ratio': Math.round((firstPaint / plainTable) * 1000) / 1000,
			'grid.edit_ms': median(editTimes)
		};
	} finally {
		await browser.close();
		if (farmId !== undefined) {
			await db('plantings').where({ farm_id: farmId }).delete();
			await db('farms').where({ id: farmId }).delete();
		}
		await db('users').where({ email }).delete();
		await db.destroy();
	}
}

/** Types a new bed-feet figure into row 0, then times Enter → the seed cell's new text, in the page. */
async function timeEdit(page: Page, value: string): Promise<number> {
	await page.locator('[data-row="0"] [data-col="lengthFt"]').click();
	await page.keyboard.type(value);
	// Passed as text: tsx would wrap named inner functions in a helper the page does not have.
	return page.evaluate(`new Promise((resolve) => {
		const cell = () => document.querySelector('[data-row="0"] [data-col="seeds"]');
		const before = cell().textContent;
		const input = document.querySelector('[data-testid="cell-editor"]');
		const t0 = performance.now();
		const check = () => (cell().textContent !== before ? resolve(performance.now() - t0) : queueMicrotask(check));
		const obs = new MutationObserver(() => { obs.disconnect(); check(); });
		obs.observe(document.querySelector('[data-testid="grid"]'), { subtree: true, characterData: true, childList: true });
		input.dispatchEvent(new KeyboardEvent('keydown', { key: 'Enter', bubbles: true, cancelable: true }));
	})`) as Promise<number>;
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
	runGridBench().then((r) => {
		for (const [k, v] of Object.entries(r)) console.log(`${k}: ${v}`);
	});
}
