// The bed timeline in headless Chromium: lanes for the demo beds and bars for its plantings,
// an overlap and a past-the-end range arranged in the test database shown as flagged, the
// block filter, and the free-space form answering with feet worked out by hand.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launch, signIn, type BrowserSession } from '../helpers/browser';
import { demo } from '../helpers/env';
import { closeTestDb, testDb } from '../helpers/db';
import { makeFreeSpaceFarm } from '../integration/free-space-fixture';

interface Row {
	id: number;
	bed_id: number | null;
	start_ft: number;
	length_ft: number;
	field_date: string;
	last_harvest: string;
	status: string;
}

let browser: BrowserSession;
let seasonId: number;
let farmId: number;
let rows: Row[];
const restore: Row[] = [];
beforeAll(async () => {
	browser = await launch();
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	seasonId = (await testDb()('seasons').where({ farm_id: farmId, year: 2027 }).first('id')).id;
	rows = await testDb()('plantings')
		.where({ season_id: seasonId })
		.select('id', 'bed_id', 'start_ft', 'length_ft', 'field_date', 'last_harvest', 'status')
		.orderBy('id');
});
afterAll(async () => {
	// Put the demo rows back as they were, for whoever reads this database next.
	for (const r of restore)
		await testDb()('plantings').where({ id: r.id }).update({
			bed_id: r.bed_id,
			start_ft: r.start_ft,
			length_ft: r.length_ft,
			field_date: r.field_date,
			last_harvest: r.last_harvest
		});
	await browser.close();
	await closeTestDb();
});

async function ownerPage(path: string) {
	const page = await browser.context.newPage();
	await signIn(page, demo.owner, demo.password);
	await page.goto(path);
	return page;
}

describe('the demo season as lanes and bars', () => {
	it('one lane per demo bed, a bar for every placed planting, linking to the grid', async () => {
		const page = await ownerPage(`/seasons/${seasonId}/beds`);
		// 14 North + 13 Middle + 13 South beds (db/seeds/demo-farm.ts).
		await expect(page.getByTestId('bed-lane').count()).resolves.toBe(40);
		const barIds = new Set(
			await page.getByTestId('bed-bar').evaluateAll((els) => els.map((e) => Number(e.getAttribute('data-planting-id'))))
		);
		const placed = rows.filter((r) => r.bed_id !== null);
		expect(placed.length).toBeGreaterThan(100);
		for (const r of placed) expect(barIds.has(r.id), `planting ${r.id}`).toBe(true);
		const first = page.locator(`[data-testid="bed-bar"][data-planting-id="${placed[0].id}"]`);
		await expect(first.getAttribute('href')).resolves.toBe(`/seasons/${seasonId}/plantings?planting=${placed[0].id}`);
		await expect(first.getAttribute('aria-label')).resolves.toMatch(
			/ft, in the field W\d\d · \w{3} \d+ \w{3}, harvest W\d\d/
		);
		await page.close();
		await browser.context.clearCookies();
	});
});

describe('conflicts arranged in the test database', () => {
	it('an overlap and a past-the-end range are flagged, and focus shows the planting', async () => {
		const placed = rows.filter((r) => r.bed_id !== null && r.status !== 'failed');
		const [a, b, c] = [placed[0], placed[1], placed[2]];
		restore.push(b, c);
		// b takes a's bed, feet and dates: the same ground at the same time.
		await testDb()('plantings').where({ id: b.id }).update({
			bed_id: a.bed_id,
			start_ft: a.start_ft,
			length_ft: a.length_ft,
			field_date: a.field_date,
			last_harvest: a.last_harvest
		});
		// c runs from 95 ft to 115 ft of a 100 ft demo bed (DEMO_BED_LENGTH_FT).
		const bed = await testDb()('beds').where({ id: c.bed_id }).first('length_ft');
		await testDb()('plantings')
			.where({ id: c.id })
			.update({ start_ft: Number(bed.length_ft) - 5, length_ft: 20 });

		const page = await ownerPage(`/seasons/${seasonId}/beds`);
		const bar = (id: number) => page.locator(`[data-testid="bed-bar"][data-planting-id="${id}"]`);
		await expect(bar(a.id).getAttribute('data-conflict')).resolves.toContain('overlap');
		await expect(bar(b.id).getAttribute('data-conflict')).resolves.toContain('overlap');
		await expect(bar(c.id).getAttribute('data-conflict')).resolves.toContain('past-end');
		await expect(
			page.locator('[data-testid="bed-bar"][data-conflict~="overlap"]').count()
		).resolves.toBeGreaterThanOrEqual(2);
		await expect(bar(c.id).getAttribute('aria-label')).resolves.toContain('runs past the bed end');

		// Keyboard: the bar is a focusable link; focus opens the card with the conflict spelled out.
		await bar(b.id).focus();
		const card = page.getByTestId('bar-card');
		await expect(card.innerText()).resolves.toMatch(/Overlaps .+ counting 7 turnaround days/);
		await expect(card.innerText()).resolves.toMatch(/Harvest\s+W\d\d · /);
		await page.close();
		await browser.context.clearCookies();
	});
});

describe('filter by block', () => {
	it('block North shows its 14 beds only', async () => {
		const page = await ownerPage(`/seasons/${seasonId}/beds`);
		await page.getByLabel('Block').selectOption({ label: 'North' });
		await Promise.all([
			page.waitForURL((u) => u.searchParams.has('block')),
			page.getByRole('button', { name: 'Show' }).click()
		]);
		await expect(page.getByTestId('bed-lane').count()).resolves.toBe(14);
		const names = await page
			.getByTestId('bed-lane')
			.evaluateAll((els) => els.map((e) => e.getAttribute('data-bed-name')));
		expect(names.every((n) => n?.startsWith('N'))).toBe(true);
		await page.close();
		await browser.context.clearCookies();
	});
});

describe('free space, in a farm of our own', () => {
	it('from W20 to W23: A1 30–60 ft and A2 0–50 ft; with 40 ft minimum only A2', async () => {
		const own = await makeFreeSpaceFarm('free-browser');
		const page = await browser.context.newPage();
		await signIn(page, own.email, own.password);
		await page.goto(`/seasons/${own.seasonId}/beds`);
		await expect(page.getByTestId('bed-lane').count()).resolves.toBe(3);
		// Six plantings, all in beds (the failed one drawn faded).
		await expect(page.getByTestId('bed-bar').count()).resolves.toBe(6);

		await page.getByLabel('From week').fill('2027-W20');
		await page.getByLabel('To week').fill('2027-W23');
		await Promise.all([
			page.waitForURL((u) => u.searchParams.has('from')),
			page.getByRole('button', { name: 'Find free beds' }).click()
		]);
		const result = page.getByTestId('free-space-result');
		// Worked by hand in tests/integration/free-space-fixture.ts.
		await expect(result.getByRole('status').innerText()).resolves.toContain(
			'2 of 3 beds have space free from W20 · Mon 17 May to W23 · Sun 13 Jun'
		);
		const rowsShown = await result.getByTestId('free-bed').allInnerTexts();
		expect(rowsShown).toHaveLength(2);
		expect(rowsShown[0]).toMatch(/A1[\s\S]*30–60 ft \(30 ft\)[\s\S]*30 ft/);
		expect(rowsShown[1]).toMatch(/A2[\s\S]*0–50 ft \(50 ft\)[\s\S]*50 ft/);

		await page.getByLabel('Minimum length (ft)').fill('40');
		await Promise.all([
			page.waitForURL((u) => u.searchParams.get('minFt') === '40'),
			page.getByRole('button', { name: 'Find free beds' }).click()
		]);
		await expect(result.getByTestId('free-bed').allInnerTexts()).resolves.toEqual([
			expect.stringMatching(/A2[\s\S]*0–50 ft \(50 ft\)/)
		]);

		await page.getByLabel('From week').fill('2027-W30');
		await page.getByLabel('To week').fill('2027-W20');
		await Promise.all([
			page.waitForURL((u) => u.searchParams.get('from') === '2027-W30'),
			page.getByRole('button', { name: 'Find free beds' }).click()
		]);
		await expect(page.locator('#field-to-error').innerText()).resolves.toBe(
			'To week must not be before the from week.'
		);
		await page.close();
		await browser.context.clearCookies();
	});
});
