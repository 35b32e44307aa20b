// The grid and the season's other views agree: an overlap typed into the grid shows on the bed
// timeline, a change of bed-feet shows in the forecast, and a bar on the timeline opens the
// grid with its planting selected.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { getISOWeek, getISOWeekYear } from 'date-fns';
import { launch, signIn, type BrowserSession, type Page } from '../helpers/browser';
import { demo } from '../helpers/env';
import { closeTestDb, testDb } from '../helpers/db';
import { signedIn } from '../helpers/http';

let browser: BrowserSession;
let page: Page;
let farmId: number;
let seasonId: number;
let cropId: number;
let bedX: { id: number; label: string };
/** a and b: the two plantings made to collide; c: the forecast one; fillers push b down the grid. */
const ids = { a: 0, b: 0, c: 0 };

const isoWeekOf = (d: string): string => {
	const date = new Date(`${d}T12:00:00Z`);
	return `${getISOWeekYear(date)}-W${String(getISOWeek(date)).padStart(2, '0')}`;
};
const day = (d: string, n: number): string =>
	new Date(Date.parse(`${d}T12:00:00Z`) + n * 86_400_000).toISOString().slice(0, 10);
const dateText = (v: unknown): string => (v instanceof Date ? v.toISOString().slice(0, 10) : String(v).slice(0, 10));

beforeAll(async () => {
	browser = await launch({ viewport: { width: 1600, height: 900 } });
	const db = testDb();
	const u = await db('users').where({ email: demo.owner }).first('id');
	farmId = (await db('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	// A season of its own, so these edits never touch the demo season other tests read.
	[seasonId] = await db('seasons').insert({
		farm_id: farmId,
		year: 2033,
		name: '2033 grid links test (invented)',
		starts_on: '2033-01-01',
		ends_on: '2033-12-31'
	});
	// A crop of its own with round figures, so the forecast arithmetic below can be done by hand.
	[cropId] = await db('crops').insert({
		farm_id: farmId,
		name: 'Links test chard (invented)',
		family: 'Amaranthaceae',
		harvest_unit: 'lb',
		frost_tolerance: 'hardy'
	});
	const [ownVariety] = await db('varieties').insert({
		farm_id: farmId,
		crop_id: cropId,
		name: 'Links Green (invented)',
		method: 'direct',
		days_to_maturity: 50,
		harvest_window_days: 21,
		yield_per_bed_foot: 0.5,
		rows_per_bed: 2,
		in_row_spacing_in: 6,
		seeds_per_spot: 1,
		germination_rate: 0.8,
		seeds_per_gram: 60
	});
	const variety = await db('varieties')
		.where({ farm_id: farmId, method: 'direct' })
		.whereNull('gdd_to_maturity')
		.whereNot({ id: ownVariety })
		.first('id');
	const beds = await db('beds as b')
		.join('blocks as k', 'k.id', 'b.block_id')
		.where({ 'b.farm_id': farmId })
		.where('b.length_ft', '>=', 50)
		.orderBy('b.id')
		.limit(2)
		.select('b.id', 'b.name', 'k.name as block');
	bedX = { id: beds[0].id, label: `${beds[0].block} · ${beds[0].name}` };
	const owner = await signedIn(demo.owner, demo.password);
	const post = async (plantings: Record<string, unknown>[]): Promise<number[]> => {
		const res = await owner.json(`/api/seasons/${seasonId}/plantings`, 'POST', { plantings });
		expect(res.status).toBe(201);
		return (await res.json()).plantings.map((p: { id: number }) => p.id);
	};
	// 60 earlier plantings without a bed: the grid lists by field date, so a and b sit far down.
	await post(
		Array.from({ length: 60 }, () => ({
			varietyId: variety.id,
			bedId: null,
			startFt: 0,
			lengthFt: 10,
			fieldDate: '2033-04-04'
		}))
	);
	[ids.a, ids.b] = await post([
		{ varietyId: variety.id, bedId: beds[0].id, startFt: 0, lengthFt: 20, fieldDate: '2033-05-02' },
		{ varietyId: variety.id, bedId: beds[1].id, startFt: 30, lengthFt: 20, fieldDate: '2033-05-02' }
	]);
	[ids.c] = await post([{ varietyId: ownVariety, bedId: null, startFt: 0, lengthFt: 20, fieldDate: '2033-05-02' }]);
	page = await browser.context.newPage();
	await signIn(page, demo.owner, demo.password);
});
afterAll(async () => {
	const db = testDb();
	await db('plantings').where({ season_id: seasonId }).delete();
	await db('seasons').where({ id: seasonId }).delete();
	await db('varieties').where({ crop_id: cropId }).delete();
	await db('crops').where({ id: cropId }).delete();
	await closeTestDb();
	await browser.close();
});

const row = (id: number) => page.locator(`[data-planting-id="${id}"]`);
const cellOf = (id: number, col: string) => row(id).locator(`[data-col="${col}"]`);

async function openGrid(): Promise<void> {
	await page.goto(`/seasons/${seasonId}/plantings`);
	await page.locator('[data-row="0"]').waitFor();
}

/** Brings a planting's row into the virtualised grid by walking down with the arrow keys. */
async function reachRow(id: number): Promise<void> {
	await page.locator('[data-row="0"] [data-col="notes"]').click();
	for (let i = 0; i < 80 && (await row(id).count()) === 0; i++) await page.keyboard.press('PageDown');
	await row(id).waitFor();
}

async function typeInto(id: number, col: string, text: string): Promise<void> {
	await cellOf(id, col).click();
	await page.keyboard.press('Enter');
	await page.keyboard.press('Control+a');
	await page.keyboard.type(text);
	await page.keyboard.press('Enter');
}

async function saved(): Promise<void> {
	await page.getByTestId('save-status').getByText('All changes saved').waitFor({ timeout: 10_000 });
}

describe('the grid and the bed timeline', () => {
	it('the timeline shows an overlap the grid created', async () => {
		await openGrid();
		await reachRow(ids.b);
		// b moves into a's bed at foot 10: feet 10–30 against a's 0–20, same field date, so they collide.
		await typeInto(ids.b, 'bed', bedX.label);
		await expect(cellOf(ids.b, 'bed').innerText()).resolves.toBe(bedX.label);
		await typeInto(ids.b, 'startFt', '10');
		await expect(cellOf(ids.b, 'startFt').innerText()).resolves.toBe('10 ft');
		await saved();
		const b = await testDb()('plantings').where({ id: ids.b }).first('bed_id', 'start_ft');
		expect([b.bed_id, Number(b.start_ft)]).toEqual([bedX.id, 10]);

		await page.goto(`/seasons/${seasonId}/beds`);
		for (const id of [ids.a, ids.b]) {
			const bar = page.locator(`[data-testid="bed-bar"][data-planting-id="${id}"]`);
			await bar.waitFor();
			await expect(
				page.locator(`[data-testid="bed-bar"][data-planting-id="${id}"][data-conflict~="overlap"]`).count()
			).resolves.toBe(1);
		}
	});

	it('clicking a bar on the timeline lands on the grid with that planting selected', async () => {
		await page.goto(`/seasons/${seasonId}/beds`);
		await page.locator(`[data-testid="bed-bar"][data-planting-id="${ids.b}"]`).click();
		await page.waitForURL(
			(u) => u.pathname === `/seasons/${seasonId}/plantings` && u.searchParams.get('planting') === String(ids.b)
		);
		const target = row(ids.b);
		await target.waitFor();
		// Far down the grid (after 60 earlier plantings), so it was scrolled to, not just there.
		expect(Number(await target.getAttribute('data-row'))).toBeGreaterThanOrEqual(60);
		await expect(target.getAttribute('data-focused')).resolves.toBe('true');
		const box = (await target.boundingBox())!;
		const view = (await page.getByTestId('grid-scroll').boundingBox())!;
		expect(box.y).toBeGreaterThanOrEqual(view.y);
		expect(box.y + box.height).toBeLessThanOrEqual(view.y + view.height);
		// Selected and ready for the keyboard: the grid has the focus, the row is the selection.
		await expect(page.evaluate(() => document.activeElement?.getAttribute('data-testid'))).resolves.toBe('grid');
		await expect(target.locator('[aria-selected="true"]').count()).resolves.toBe(1);
		await expect(page.getByTestId('explain').innerText()).resolves.not.toContain('Choose a row');
	});
});

describe('the grid and the forecast', () => {
	it('changing bed-feet in the grid changes the forecast by bed-feet × yield ÷ weeks of harvest', async () => {
		const c = await testDb()('plantings').where({ id: ids.c }).first('first_harvest', 'last_harvest');
		const first = dateText(c.first_harvest);
		const last = dateText(c.last_harvest);
		// A week fully inside the harvest window: the first Monday on or after the first harvest.
		const dow = new Date(`${first}T12:00:00Z`).getUTCDay();
		const monday = day(first, (8 - dow) % 7);
		expect(day(monday, 6) <= last).toBe(true);
		const week = isoWeekOf(monday);
		const supply = async (): Promise<number> => {
			const res = await page.request.get(`/api/seasons/${seasonId}/forecast?crops=${cropId}`);
			expect(res.status()).toBe(200);
			const body = await res.json();
			return (
				body.rows.find((r: { crop: string; week: string }) => r.crop === String(cropId) && r.week === week)?.supply ?? 0
			);
		};
		const before = await supply();
		// 20 ft × 0.5 lb/ft = 10 lb over a 21-day window = 3 weeks → 10 ÷ 3 = 3.333 lb a full week.
		expect(before).toBeCloseTo(3.333, 2);

		await openGrid();
		await reachRow(ids.c);
		// A save runs the page's load again (invalidate('app:plan')): the grid counts each answer it takes.
		const loads = async (): Promise<number> =>
			Number(await page.getByTestId('plantings-page').getAttribute('data-loads'));
		const loadsBefore = await loads();
		await typeInto(ids.c, 'lengthFt', '32');
		await expect(cellOf(ids.c, 'lengthFt').innerText()).resolves.toBe('32 ft');
		await saved();
		await expect.poll(loads).toBeGreaterThan(loadsBefore);

		const after = await supply();
		// Δ = (32 − 20) ft × 0.5 lb/ft ÷ 3 weeks = 6 lb ÷ 3 = 2 lb more in that week (3.333 → 5.333).
		expect(after - before).toBeCloseTo(2, 2);
		expect(after).toBeCloseTo(5.333, 2);
	});
});
