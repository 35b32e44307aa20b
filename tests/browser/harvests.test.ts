// The harvest log and what follows from it, in headless Chromium: a crew lead logs a harvest
// on a phone-sized screen and finds it in the chart; the owner takes over learned figures and
// a re-plan uses them; the owner copies a season across the ISO week-53 edge.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launch, signIn, type BrowserSession } from '../helpers/browser';
import { demo } from '../helpers/env';
import { closeTestDb, testDb } from '../helpers/db';
import { addPlanting, addSeason, harvestFarm } from '../integration/harvest-fixture';

let phone: BrowserSession;
let desk: BrowserSession;
beforeAll(async () => {
	phone = await launch({ viewport: { width: 390, height: 844 } });
	desk = await launch();
});
afterAll(async () => {
	await phone.close();
	await desk.close();
	await closeTestDb();
});

async function demoSeason2026(): Promise<number> {
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	const farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	return (await testDb()('seasons').where({ farm_id: farmId, year: 2026 }).first('id')).id;
}

describe('phone: log a harvest, then see it in the chart', () => {
	it('the crew lead logs a harvest in a few taps and the chart shows it', async () => {
		const season = await demoSeason2026();
		// Any demo planting already in the field and not failed (other test files may change statuses).
		const kale = await testDb()('plantings as p')
			.join('varieties as v', 'v.id', 'p.variety_id')
			.join('crops as c', 'c.id', 'v.crop_id')
			.where({ 'p.season_id': season })
			.whereNot('p.status', 'failed')
			.andWhere('p.field_date', '<=', '2026-11-20')
			.orderBy('p.id')
			.first('p.id', 'p.status', 'p.actual_first_harvest', 'c.name as crop', 'c.harvest_unit as unit', 'v.crop_id');
		const page = await phone.context.newPage();
		await signIn(page, demo.crew, demo.password);
		await page.goto(`/seasons/${season}/harvests`);
		const today = await page.getByLabel('Date', { exact: true }).first().inputValue();
		await page.getByLabel('Find by crop or bed').fill(kale.crop.toLowerCase());
		await page.locator(`[data-testid=planting-options] input[value="${kale.id}"]`).check();
		await expect(page.locator('#log-unit').inputValue()).resolves.toBe(kale.unit);
		await page.locator('#log-quantity').fill('7');
		await Promise.all([page.waitForURL(/logged=/), page.getByRole('button', { name: 'Log harvest' }).click()]);
		await expect(page.getByRole('status').first().innerText()).resolves.toContain('Harvest logged.');
		const record = await testDb()('harvest_records')
			.where({ planting_id: kale.id, quantity: 7, harvested_on: today })
			.orderBy('id', 'desc')
			.first();
		expect(record).toBeTruthy();
		await expect(page.locator(`[data-testid=harvest-record][data-id="${record.id}"]`).innerText()).resolves.toContain(
			`7 ${kale.unit}`
		);

		// The week's logged bar for the crop is the sum of that week's records of its plantings, this one included.
		const monday = new Date(`${today}T00:00:00Z`);
		monday.setUTCDate(monday.getUTCDate() - ((monday.getUTCDay() + 6) % 7));
		const sunday = new Date(monday);
		sunday.setUTCDate(sunday.getUTCDate() + 6);
		const sum = await testDb()('harvest_records as h')
			.join('plantings as p', 'p.id', 'h.planting_id')
			.join('varieties as v', 'v.id', 'p.variety_id')
			.where({ 'p.season_id': season, 'v.crop_id': kale.crop_id, 'h.unit': kale.unit })
			.whereNot('p.status', 'failed')
			.whereBetween('h.harvested_on', [monday.toISOString().slice(0, 10), sunday.toISOString().slice(0, 10)])
			.sum({ q: 'h.quantity' })
			.first();
		await page.goto(`/seasons/${season}/results`);
		const chart = page.locator(`[data-testid=crop-chart][data-crop="${kale.crop}"]`);
		const bars = chart.locator('[data-testid=logged-bar]');
		// The chart draws in the browser once it knows its width: wait for its bars rather than race it.
		await expect
			.poll(() => bars.evaluateAll((els) => els.map((e) => Number(e.getAttribute('data-value')))), { timeout: 15_000 })
			.toContain(Number(sum!.q));
		await expect(chart.locator('[data-testid=forecast-line]').getAttribute('d')).resolves.toMatch(/^M/);

		const del = await page.request.delete(`/api/seasons/${season}/harvests/${record.id}`);
		expect(del.status()).toBe(204);
		await testDb()('plantings')
			.where({ id: kale.id })
			.update({ status: kale.status, actual_first_harvest: kale.actual_first_harvest });
		await page.close();
		await phone.context.clearCookies();
	});
});

describe('learned figures and a re-plan', () => {
	it('the owner uses the observed figures, the plan preview sizes with them, then undoes', async () => {
		const farm = await harvestFarm('browser-figures');
		const s2026 = await addSeason(farm.farmId, 2026);
		// Three finished 10 ft plantings logging 25 + 30 + 35 = 90 lb → 3 lb/ft; days to maturity
		// 63, 60, 63 → 62 (worked in tests/integration/results-copy.test.ts).
		for (const [field, first, q] of [
			['2026-04-06', '2026-06-08', 25],
			['2026-04-13', '2026-06-12', 30],
			['2026-04-20', '2026-06-22', 35]
		] as const) {
			const id = await addPlanting(farm.farmId, s2026, {
				varietyId: farm.carrot.varietyId,
				bedId: farm.bedIds[0],
				lengthFt: 10,
				fieldDate: field,
				firstHarvest: '2026-06-05',
				lastHarvest: '2026-06-18',
				expectedYield: 20,
				status: 'finished'
			});
			await testDb()('harvest_records').insert({
				farm_id: farm.farmId,
				planting_id: id,
				harvested_on: first,
				quantity: q,
				unit: 'lb'
			});
		}
		const s2027 = await addSeason(farm.farmId, 2027);
		await testDb()('channel_demand').insert(
			[30, 31].map((w) => ({
				farm_id: farm.farmId,
				season_id: s2027,
				channel: 'market',
				crop_id: farm.carrot.cropId,
				week: `2027-W${w}`,
				quantity: 30
			}))
		);

		const page = await desk.context.newPage();
		await signIn(page, farm.email, 'long-enough-pass');
		await page.goto(`/seasons/${s2026}/results`);
		await Promise.all([
			page.waitForURL(/figures=/),
			page.getByRole('button', { name: 'Use these figures for Test Nantes' }).click()
		]);
		await expect(page.getByTestId('figure-changes').innerText()).resolves.toContain(
			'2 → 3 per bed-foot (3 plantings), 60 → 62 days'
		);

		const res = await page.request.post(`/api/seasons/${s2027}/plan/preview`, { data: {} });
		expect(res.status()).toBe(200);
		const plan = await res.json();
		const carrots = plan.plantings.filter((p: { varietyId: string }) => p.varietyId === String(farm.carrot.varietyId));
		expect(carrots.length).toBeGreaterThan(0);
		for (const p of carrots) {
			// Yield per bed-foot 3 (was 2) and 62 days from field to first harvest (was 60).
			expect(p.expectedYield / p.lengthFt).toBeCloseTo(3, 6);
			const days = (Date.parse(p.firstHarvest) - Date.parse(p.fieldDate)) / 86_400_000;
			expect(days).toBe(62);
		}
		await Promise.all([page.waitForURL(/undone=/), page.getByRole('button', { name: 'Undo' }).click()]);
		await expect(page.getByTestId('figure-changes').innerText()).resolves.toContain('undone');
		const v = await testDb()('varieties').where({ id: farm.carrot.varietyId }).first();
		expect([Number(v.yield_per_bed_foot), v.days_to_maturity]).toEqual([2, 60]);
		await page.close();
		await desk.context.clearCookies();
	});
});

describe('next season across week 53', () => {
	it('the owner copies 2026 into 2027; a W53 planting lands in W52 on the same weekday', async () => {
		const farm = await harvestFarm('browser-copy');
		const s2026 = await addSeason(farm.farmId, 2026);
		// Tue 2026-12-29 is 2026-W53-2 (ISO 8601: 2026-12-28 = 2026-W53-1). 2027 has no W53, so
		// it lands on 2027-W52-2 = Tue 28 Dec 2027. Mon 2026-01-05 (W02-1) → 2027-W02-1 = Mon 11 Jan.
		await addPlanting(farm.farmId, s2026, {
			varietyId: farm.carrot.varietyId,
			bedId: farm.bedIds[0],
			lengthFt: 30,
			fieldDate: '2026-12-29',
			firstHarvest: '2027-02-27',
			lastHarvest: '2027-03-12',
			expectedYield: 60
		});
		await addPlanting(farm.farmId, s2026, {
			varietyId: farm.carrot.varietyId,
			bedId: farm.bedIds[0],
			startFt: 50,
			lengthFt: 30,
			fieldDate: '2026-01-05',
			firstHarvest: '2026-03-06',
			lastHarvest: '2026-03-19',
			expectedYield: 60
		});
		const page = await desk.context.newPage();
		await signIn(page, farm.email, 'long-enough-pass');
		await page.goto(`/seasons/${s2026}/results`);
		await page.getByRole('button', { name: 'Copy into 2027' }).click();
		const report = page.getByTestId('copy-report');
		await expect(report.innerText()).resolves.toContain('Copied 2 plantings');
		await expect(report.innerText()).resolves.toContain('1 planting was in week 53 and now sits in week 52.');
		await Promise.all([page.waitForURL(/\/seasons\/\d+$/), report.getByRole('link', { name: '2027 season' }).click()]);
		// The overview folds its list of every planting: open it.
		await page.locator('summary', { hasText: 'Every planting' }).click();
		const text = await page.locator('table').first().innerText();
		expect(text).toContain('W52 · Tue 28 Dec');
		expect(text).toContain('W02 · Mon 11 Jan');
		expect(text).not.toContain('N1');
		await page.close();
		await desk.context.clearCookies();
	});
});
