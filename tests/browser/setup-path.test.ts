// A new owner signs up and walks the set-up path by clicks and typing only: location and frost,
// twelve beds in one go, crops from the starter library, the first season; then enters demand,
// previews and applies a plan, opens the grid and prints the first week's crew sheets to PDF. Then a step skipped
// on a second farm is still reachable later from its own page. Every page is checked at a phone
// width for sideways scrolling.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { confirmSignUpByMail, launch, type BrowserSession, type Page } from '../helpers/browser';
import { testDb, closeTestDb, uniqueEmail } from '../helpers/db';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

let browser: BrowserSession;
beforeAll(async () => {
	browser = await launch();
});
afterAll(async () => {
	await browser.close();
	await closeTestDb();
});

async function signUp(page: Page, email: string, farm: string): Promise<void> {
	await browser.context.clearCookies();
	await page.goto('/signup');
	await page.getByLabel('Your name').fill('New Owner');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill('a-long-new-farm-password');
	await page.getByLabel('Farm name').fill(farm);
	await page.getByLabel(/^Latitude/).fill('44.5');
	await page.getByLabel('Last spring frost').fill('2027-05-12');
	await page.getByLabel('First fall frost').fill('2027-10-02');
	await page.getByRole('button', { name: 'Create farm' }).click();
	await page.getByText('Check your e-mail to finish').waitFor({ timeout: 15_000 });
	await confirmSignUpByMail(page);
}

/** Text of each page of a PDF, with Debian's pdftotext (poppler-utils). */
function pdfText(pdf: Buffer): string[] {
	const file = join(mkdtempSync(join(tmpdir(), 'fc-setup-print-')), 'sheets.pdf');
	writeFileSync(file, pdf);
	return execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' })
		.split('\f')
		.filter((t) => t.trim() !== '');
}

async function noSidewaysScroll(page: Page): Promise<void> {
	const { scroll, width } = await page.evaluate(() => ({
		scroll: document.documentElement.scrollWidth,
		width: window.innerWidth
	}));
	expect(scroll, `${page.url()} is ${scroll}px wide in a ${width}px window`).toBeLessThanOrEqual(width);
}

describe('set-up path', () => {
	it('takes a new farm from sign-up to beds, crops and a first season', async () => {
		const page = await browser.context.newPage();
		const email = uniqueEmail('setup');
		await signUp(page, email, 'Setup Path Farm (invented)');
		const farmId = (
			await testDb()('farm_members as m')
				.join('users as u', 'u.id', 'm.user_id')
				.where('u.email', email)
				.first('m.farm_id')
		).farm_id;

		// 1. Location and frost: the sign-up's answers are there to check; the time zone is typed.
		await expect.poll(() => page.getByLabel('Last spring frost').inputValue()).toBe('2027-05-12');
		await page.getByLabel('Time zone').fill('America/Chicago');
		await page.getByLabel(/^Latitude/).fill('44.6');
		await Promise.all([page.waitForURL('**/setup/beds'), page.getByRole('button', { name: 'Save and go on' }).click()]);
		const farm = await testDb()('farms').where({ id: farmId }).first();
		expect(farm.time_zone).toBe('America/Chicago');
		expect(Number(farm.latitude)).toBeCloseTo(44.6, 5);

		// 2. Twelve beds of 100 ft, 30 in wide, in one go.
		await page.getByLabel('Block', { exact: true }).fill('North');
		await page.getByLabel('Number of beds').fill('12');
		await page.getByLabel('Bed length (ft)').fill('100');
		await page.getByLabel('Bed width (in)').fill('30');
		await page.getByLabel('Names start with').fill('N');
		await page.getByRole('button', { name: 'Add beds' }).click();
		await expect
			.poll(async () => (await page.getByRole('status').first().textContent())?.replace(/\s+/g, ' '))
			.toContain('Added 12 beds to North: N1 … N12');
		const beds = await testDb()('beds').where({ farm_id: farmId }).orderBy('position');
		expect(beds.map((b) => b.name)).toEqual(Array.from({ length: 12 }, (_, i) => `N${i + 1}`));
		expect(beds.every((b) => Number(b.length_ft) === 100 && b.width_in === 30)).toBe(true);
		// The same names again are refused at the field, and nothing is added.
		await page.getByRole('button', { name: 'Add beds' }).click();
		await expect.poll(() => page.locator('#bulk-prefix-error').textContent()).toContain('already exist');
		expect(await testDb()('beds').where({ farm_id: farmId }).count({ n: '*' }).first()).toEqual({ n: 12 });
		await noSidewaysScroll(page);

		// 3. Crops from the starter library.
		await Promise.all([page.waitForURL('**/setup/crops'), page.getByRole('link', { name: 'Go on to crops' }).click()]);
		for (const name of ['Carrot', 'Beet', 'Lettuce, head', 'Tomato'])
			await page.getByRole('checkbox', { name: new RegExp(`^${name} \\(`) }).check();
		await page.getByRole('button', { name: 'Add ticked crops' }).click();
		await expect
			.poll(async () => (await page.getByRole('status').first().textContent())?.replace(/\s+/g, ' '))
			.toMatch(/Added 4 crops with \d+ varieties to your library\./);
		const crops = await testDb()('crops').where({ farm_id: farmId }).orderBy('name').pluck('name');
		expect(crops).toEqual(['Beet', 'Carrot', 'Lettuce, head', 'Tomato']);
		const carrot = await testDb()('varieties as v')
			.join('crops as c', 'c.id', 'v.crop_id')
			.where({ 'c.farm_id': farmId, 'v.name': 'Carrot, standard' })
			.first('v.*');
		expect(carrot.source).toContain('Extension');
		await expect.poll(() => page.getByRole('checkbox', { name: /^Carrot \(/ }).isDisabled()).toBe(true);

		// 4. The first season, then on to its demand.
		await Promise.all([
			page.waitForURL('**/setup/season'),
			page.getByRole('link', { name: 'Go on to the season' }).click()
		]);
		await page.getByLabel('Year').fill('2027');
		await page.getByLabel('Name', { exact: true }).fill('First year');
		await Promise.all([
			page.waitForURL(/\/seasons\/\d+\/demand$/),
			page.getByRole('button', { name: 'Create season and enter demand' }).click()
		]);
		const season = await testDb()('seasons').where({ farm_id: farmId }).first();
		expect(season).toMatchObject({ year: 2027, name: 'First year' });

		// 5. Demand, typed into the market stand's weekly quantities: 20 lb of carrots in W30–W33.
		await page
			.getByRole('navigation', { name: 'Which quantities' })
			.getByRole('link', { name: 'Market stand' })
			.click();
		await page.waitForURL(/grid=market/);
		await page.getByLabel('Add a crop row').selectOption({ label: 'Carrot (lb)' });
		for (const w of ['2027-W30', '2027-W31', '2027-W32', '2027-W33'])
			await page.getByLabel(new RegExp(`^New crop, ${w}`)).fill('20');
		await page.getByRole('button', { name: /^Save Market stand/ }).click();
		await expect
			.poll(async () =>
				Number(
					(
						await testDb()('channel_demand')
							.where({ farm_id: farmId, season_id: season.id })
							.sum({ q: 'quantity' })
							.first()
					)?.q
				)
			)
			.toBe(80);

		// 6. The plan: preview writes nothing, apply writes the plantings.
		await page.getByRole('navigation', { name: 'Season' }).getByRole('link', { name: 'Plan', exact: true }).click();
		await page.getByRole('button', { name: 'Preview', exact: true }).click();
		await page.getByTestId('plan-preview').waitFor();
		expect(await testDb()('plantings').where({ season_id: season.id }).count({ n: '*' }).first()).toEqual({ n: 0 });
		await page.getByRole('button', { name: 'Apply', exact: true }).click();
		await expect(page.getByTestId('plan-message').innerText()).resolves.toMatch(/^Applied: /);
		const planted = await testDb()('plantings').where({ season_id: season.id });
		expect(planted.length).toBeGreaterThan(0);

		// 7. The planting grid shows them.
		await page.getByRole('navigation', { name: 'Season' }).getByRole('link', { name: 'Planting grid' }).click();
		await page.locator('[data-row="0"]').waitFor();
		expect(await page.locator('[data-row]').count()).toBe(planted.length);

		// 8. The crew sheets open on the first week with work, and print with every page naming it.
		await page.getByRole('navigation', { name: 'Season' }).getByRole('link', { name: 'Crew sheets' }).click();
		await page.waitForURL(/\/week\/\d{4}-W\d{2}/);
		const week = /\/week\/(\d{4}-W\d{2})/.exec(page.url())![1];
		await expect(page.locator('[data-testid^="task-"]').count()).resolves.toBeGreaterThan(0);
		await page.emulateMedia({ media: 'print' });
		const pages = pdfText(await page.pdf({ format: 'Letter' }));
		expect(pages.length).toBeGreaterThan(0);
		// Source: pdftotext (poppler-utils) reads the printed PDF, page by page.
		for (const [i, text] of pages.entries()) expect(text, `page ${i + 1}`).toContain(week);
		await page.emulateMedia({ media: 'screen' });

		// The picked crops are the farm's own: the library lists them and the owner can edit them.
		await page.goto('/crops');
		await expect.poll(() => page.getByRole('link', { name: 'Carrot, standard' }).count()).toBe(1);
		await page.close();
	});

	it('lets every step be skipped and done later from its own page', async () => {
		const page = await browser.context.newPage();
		await page.setViewportSize({ width: 390, height: 844 });
		await signUp(page, uniqueEmail('setup-skip'), 'Skipping Farm (invented)');
		await noSidewaysScroll(page);
		await Promise.all([page.waitForURL('**/setup/beds'), page.getByRole('link', { name: 'Skip this step' }).click()]);
		await noSidewaysScroll(page);
		await Promise.all([page.waitForURL('**/setup/crops'), page.getByRole('link', { name: 'Skip this step' }).click()]);
		await noSidewaysScroll(page);
		await Promise.all([page.waitForURL('**/setup/season'), page.getByRole('link', { name: 'Skip this step' }).click()]);
		await noSidewaysScroll(page);
		await Promise.all([
			page.waitForURL((u) => u.pathname === '/'),
			page.getByRole('link', { name: 'Skip: finish set-up' }).click()
		]);
		// Nothing set up: "This week" says so and leads back to the set-up path.
		await expect.poll(() => page.getByTestId('setup-banner').textContent()).toContain('No season yet.');

		// Beds later, from Farm & beds.
		await page.goto('/settings');
		await page.getByLabel('Block', { exact: true }).fill('South');
		await page.getByLabel('Number of beds').fill('3');
		await page.getByRole('button', { name: 'Add beds' }).click();
		await expect
			.poll(async () => (await page.getByRole('status').first().textContent())?.replace(/\s+/g, ' '))
			.toContain('Added 3 beds to South');
		await noSidewaysScroll(page);
		// Crops later, from the crop library.
		await page.goto('/crops');
		await Promise.all([
			page.waitForURL('**/setup/crops'),
			page.getByRole('link', { name: 'Add from starter library' }).click()
		]);
		// A season later, from Seasons.
		await page.goto('/seasons');
		await page.getByLabel('Year').fill('2028');
		await page.getByRole('textbox', { name: 'Name', exact: true }).fill('Later season');
		await Promise.all([
			page.waitForURL(/\/seasons\/\d+$/),
			page.getByRole('button', { name: 'Create season' }).click()
		]);
		await page.close();
	});
});
