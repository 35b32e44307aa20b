// The forecast tells a storage crop's weeks sold from store apart from its harvest from the field,
// as the share manager reads it: the invented demo's garlic, planted the autumn before and dug in
// July, feeds later weeks' boxes from store.
import { afterAll, beforeAll, expect, it } from 'vitest';
import { launch, signIn, type BrowserSession } from '../helpers/browser';
import { closeTestDb, testDb } from '../helpers/db';
import { demo } from '../helpers/env';

let browser: BrowserSession;
let seasonId: number;
let garlicId: number;
beforeAll(async () => {
	browser = await launch({ viewport: { width: 390, height: 844 } });
	const u = await testDb()('users').where({ email: demo.share }).first('id');
	const farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	seasonId = (await testDb()('seasons').where({ farm_id: farmId, year: 2027 }).first('id')).id;
	garlicId = (await testDb()('crops').where({ farm_id: farmId, name: 'Garlic' }).first('id')).id;
});
afterAll(async () => {
	await browser.close();
	await closeTestDb();
});

it('lists the garlic sold from store beside what comes from the field, on a phone', async () => {
	const page = await browser.context.newPage();
	await signIn(page, demo.share, demo.password);
	const api = await (await page.request.get(`/api/seasons/${seasonId}/forecast?crops=${garlicId}`)).json();
	const stored = api.rows.filter((r: { fromStore: number }) => r.fromStore > 0);
	// The demo's garlic is dug in July and feeds the boxes from store into September.
	expect(stored.length).toBeGreaterThan(3);

	await page.goto(`/seasons/${seasonId}/forecast?view=table&crops=${garlicId}`);
	const table = page.getByTestId('forecast-table');
	await table.waitFor();
	const head = await table.locator('thead th').allInnerTexts();
	expect(head).toEqual(expect.arrayContaining(['From the field', 'From store']));
	const fromStore = head.indexOf('From store');
	const fromField = head.indexOf('From the field');
	const supply = head.indexOf('Supply');
	const cells = await table
		.locator('tbody tr')
		.evaluateAll((trs) => trs.map((tr) => [...tr.querySelectorAll('td')].map((td) => td.textContent?.trim() ?? '')));
	const num = (s: string) => Number(s.replace(/,/g, ''));
	const storeWeeks = cells.filter((c) => num(c[fromStore]) > 0);
	expect(storeWeeks.length).toBe(stored.length);
	for (const c of cells) expect(num(c[fromField]) + num(c[fromStore])).toBeCloseTo(num(c[supply]), 1);
	await page.close();
});
