// The demand page in headless Chromium: editing a box quantity changes the derived target at
// once (the engine runs in the browser), the hover shows how it was reached, and saving keeps it.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launch, signIn, type BrowserSession } from '../helpers/browser';
import { closeTestDb, testDb } from '../helpers/db';
import { demo } from '../helpers/env';

let browser: BrowserSession;
let farmId: number;
let seasonId: number;
let shareId: number;
let carrot: number;
const year = 2035;

beforeAll(async () => {
	browser = await launch();
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	await testDb()('seasons').where({ farm_id: farmId, year }).delete();
	[seasonId] = await testDb()('seasons').insert({
		farm_id: farmId,
		year,
		name: `${year} browser season (invented)`,
		starts_on: `${year}-01-01`,
		ends_on: `${year}-12-31`
	});
	carrot = (await testDb()('crops').where({ farm_id: farmId, name: 'Carrot' }).first('id')).id;
	[shareId] = await testDb()('share_sizes').insert({
		farm_id: farmId,
		season_id: seasonId,
		name: 'Full share',
		members: 60,
		first_week: `${year}-W24`,
		last_week: `${year}-W26`
	});
	await testDb()('box_items').insert({
		share_size_id: shareId,
		week: `${year}-W24`,
		crop_id: carrot,
		quantity: 1.5,
		unit: 'lb'
	});
	await testDb()('channel_demand').insert({
		farm_id: farmId,
		season_id: seasonId,
		channel: 'market',
		crop_id: carrot,
		week: `${year}-W24`,
		quantity: 20
	});
});
afterAll(async () => {
	await browser.close();
	await testDb()('seasons').where({ id: seasonId }).delete();
	await closeTestDb();
});

describe('editing a box quantity', () => {
	it('changes the derived target while typing, explains it on hover, and keeps it after saving', async () => {
		const page = await browser.context.newPage();
		await signIn(page, demo.share, demo.password);
		await page.goto(`/seasons/${seasonId}/demand?grid=share:${shareId}`);
		const target = page.getByTestId(`target-${carrot}-${year}-W24`);
		// 60 full × 1.5 lb + 20 lb market = 90 + 20 = 110 lb
		await expect(target.innerText()).resolves.toBe('110');

		await page.getByLabel(`Carrot, ${year}-W24 (lb per box)`).fill('2');
		// 60 full × 2 lb + 20 lb market = 120 + 20 = 140 lb, marked as not saved yet
		await page.waitForFunction(
			(id) => (document.querySelector(`[data-testid="${id}"]`) as HTMLElement | null)?.innerText.includes('140'),
			`target-${carrot}-${year}-W24`
		);
		await expect(target.innerText()).resolves.toMatch(/^140\*/);

		await target.getByRole('button').hover();
		const tip = page.getByRole('tooltip').filter({ visible: true });
		await expect(tip.innerText()).resolves.toContain('Full share: 60 members × 2 per box');
		await expect(tip.innerText()).resolves.toMatch(/Market stand: weekly quantity\s*20 lb/);
		await expect(tip.innerText()).resolves.toMatch(/Target: .*\s*140 lb/);

		await Promise.all([page.waitForURL(/grid=share/), page.getByRole('button', { name: 'Save Full share' }).click()]);
		await page.waitForFunction(
			(id) => (document.querySelector(`[data-testid="${id}"]`) as HTMLElement | null)?.innerText.trim() === '140',
			`target-${carrot}-${year}-W24`
		);
		await expect(target.innerText()).resolves.toBe('140');
		expect(
			Number(
				(
					await testDb()('box_items')
						.where({ share_size_id: shareId, crop_id: carrot, week: `${year}-W24` })
						.first()
				).quantity
			)
		).toBe(2);
		await page.close();
		await browser.context.clearCookies();
	});

	it('the crew lead sees the same figures without inputs', async () => {
		const page = await browser.context.newPage();
		await signIn(page, demo.crew, demo.password);
		await page.goto(`/seasons/${seasonId}/demand?grid=share:${shareId}`);
		await expect(page.getByTestId(`target-${carrot}-${year}-W24`).innerText()).resolves.toBe('140');
		await expect(page.getByLabel(`Carrot, ${year}-W24 (lb per box)`).count()).resolves.toBe(0);
		await expect(page.getByRole('button', { name: 'Save Full share' }).count()).resolves.toBe(0);
		await page.close();
		await browser.context.clearCookies();
	});
});
