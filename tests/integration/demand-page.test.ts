// The demand page and its form actions, posted the way a browser without JavaScript posts them:
// who may open and post, errors shown at the field (cells by crop and week), 303 after success.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, signedIn, html } from '../helpers/http';
import { closeTestDb, count, testDb } from '../helpers/db';
import { demo } from '../helpers/env';
import { demandSeason, type DemandFixture } from './demand-fixture';

let fx: DemandFixture;
let share: Client;
let crew: Client;
let carrot: number;
let kale: number;
beforeAll(async () => {
	fx = await demandSeason(2034);
	carrot = fx.crop('Carrot');
	kale = fx.crop('Kale');
	[share, crew] = await Promise.all([signedIn(demo.share, demo.password), signedIn(demo.crew, demo.password)]);
});
afterAll(async () => {
	await fx.cleanup();
	await closeTestDb();
});

const page = () => `/seasons/${fx.seasonId}/demand`;
const shareForm = {
	name: 'Full share',
	members: '60',
	firstWeek: '2034-W24',
	lastWeek: '2034-W27',
	pickupDays: 'Tue',
	price: '720.00'
};
let fullId = 0;

describe('opening the page', () => {
	it('no session: redirect to sign-in', async () => {
		const res = await new Client().get(page());
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toMatch(/^\/signin/);
	});
	it('the crew lead reads it without forms; the share manager gets the forms', async () => {
		const crewHtml = await html(await crew.get(page()));
		expect(crewHtml).toContain('You can read demand; the owner and the share manager keep it.');
		expect(crewHtml).not.toContain('?/saveGrid');
		expect(crewHtml).not.toContain('?/upload');
		const res = await share.get(page());
		expect(res.status).toBe(200);
		const text = await html(res);
		expect(text).toContain('?/addShare');
		expect(text).toContain('?/upload');
	});
});

describe('share size forms', () => {
	it('crew lead: 403, nothing written', async () => {
		expect((await crew.postForm(`${page()}?/addShare`, shareForm)).status).toBe(403);
		expect(await count('share_sizes', { season_id: fx.seasonId })).toBe(0);
	});
	it('bad fields: 400 with the message at the field, and what was typed kept', async () => {
		const res = await share.postForm(`${page()}?/addShare`, { ...shareForm, members: 'sixty', price: '7.123' });
		expect(res.status).toBe(400);
		const text = await html(res);
		expect(text).toContain('Members must be a number.');
		expect(text).toContain('Price must be in whole cents (at most 2 decimals)');
		expect(text).toContain('value="sixty"');
		expect(await count('share_sizes', { season_id: fx.seasonId })).toBe(0);
	});
	it('a good share size: 303 back to the page, written', async () => {
		const res = await share.postForm(`${page()}?/addShare`, shareForm);
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe(page());
		const row = await testDb()('share_sizes').where({ season_id: fx.seasonId }).first();
		fullId = row.id;
		expect(row).toMatchObject({
			members: 60,
			first_week: '2034-W24',
			last_week: '2034-W27',
			pickup_days: 'Tue',
			price_cents: 72_000
		});
	});
	it('a taken name: 400 naming name', async () => {
		const res = await share.postForm(`${page()}?/addShare`, shareForm);
		expect(res.status).toBe(400);
		expect(await html(res)).toContain('This season already has a share size named Full share.');
	});
	it('save changes it; an unknown id answers 404', async () => {
		expect((await share.postForm(`${page()}?/saveShare`, { ...shareForm, id: fullId, members: '55' })).status).toBe(
			303
		);
		expect((await testDb()('share_sizes').where({ id: fullId }).first()).members).toBe(55);
		expect((await share.postForm(`${page()}?/saveShare`, { ...shareForm, id: 999999 })).status).toBe(404);
		await share.postForm(`${page()}?/saveShare`, { ...shareForm, id: fullId });
	});
});

describe('the grid form', () => {
	const grid = () => `share:${fullId}`;
	it('crew lead: 403', async () => {
		expect(
			(
				await crew.postForm(`${page()}?/saveGrid`, {
					grid: grid(),
					[`q.${carrot}.2034-W24`]: '1',
					[`u.${carrot}`]: 'lb'
				})
			).status
		).toBe(403);
	});
	it('bad cells: 400 naming each by crop and week; nothing written', async () => {
		const res = await share.postForm(`${page()}?/saveGrid`, {
			grid: grid(),
			[`u.${carrot}`]: 'lb',
			[`q.${carrot}.2034-W24`]: '1.5',
			[`q.${carrot}.2034-W25`]: 'a lot',
			// The add-a-crop row: Kale in a week after the share ends
			newCrop: kale,
			'n.2034-W30': '1'
		});
		expect(res.status).toBe(400);
		const text = await html(res);
		expect(text).toContain('Nothing was saved: 2 cells need fixing.');
		expect(text).toContain('Carrot, 2034-W25: Quantity must be a number.');
		expect(text).toContain("Kale, 2034-W30: outside Full share's distribution weeks 2034-W24–2034-W27.");
		expect(await count('box_items', { share_size_id: fullId })).toBe(0);
	});
	it('good cells: 303 back to the grid; the add row and an emptied cell work too', async () => {
		let res = await share.postForm(`${page()}?/saveGrid`, {
			grid: grid(),
			[`u.${carrot}`]: 'lb',
			[`q.${carrot}.2034-W24`]: '1.5',
			[`q.${carrot}.2034-W25`]: '',
			newCrop: kale,
			'n.2034-W24': '1'
		});
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe(`${page()}?grid=${encodeURIComponent(grid())}`);
		const rows = await testDb()('box_items')
			.where({ share_size_id: fullId })
			.orderBy('crop_id')
			.select('crop_id', 'week', 'quantity', 'unit');
		expect(rows.map((r) => ({ ...r, quantity: Number(r.quantity) }))).toEqual(
			[
				{ crop_id: carrot, week: '2034-W24', quantity: 1.5, unit: 'lb' },
				{ crop_id: kale, week: '2034-W24', quantity: 1, unit: 'bunch' }
			].sort((a, b) => a.crop_id - b.crop_id)
		);
		res = await share.postForm(`${page()}?/saveGrid`, {
			grid: 'market',
			[`u.${carrot}`]: 'lb',
			[`q.${carrot}.2034-W24`]: '20'
		});
		expect(res.status).toBe(303);
		// The targets table, Carrot W24: 60 full × 1.5 lb + 20 lb market = 90 + 20 = 110 lb
		const text = await html(await crew.get(page()));
		expect(text).toMatch(new RegExp(`data-testid="target-${carrot}-2034-W24"[^>]*>[\\s\\S]{0,400}?>110`));
	});
	it("a save writes only the cells its editor changed, so a save from an older page keeps another's change", async () => {
		// The market grid now holds Carrot W24 = 20 lb (above) and nothing in W25; the page draws
		// each cell with what it held, for the save to compare against.
		const drawn = await html(await share.get(`${page()}?grid=market`));
		expect(drawn).toContain(`name="was.${carrot}.2034-W24" value="20"`);
		expect(drawn).toContain(`name="was.${carrot}.2034-W25" value=""`);
		const form = (w24: string, w25: string): Record<string, string | number> => ({
			grid: 'market',
			[`u.${carrot}`]: 'lb',
			[`q.${carrot}.2034-W24`]: w24,
			[`was.${carrot}.2034-W24`]: '20',
			[`q.${carrot}.2034-W25`]: w25,
			[`was.${carrot}.2034-W25`]: ''
		});
		// One editor types 15 into W25 and saves.
		expect((await share.postForm(`${page()}?/saveGrid`, form('20', '15'))).status).toBe(303);
		// A second editor, on a page drawn before that save (W25 still empty there), changes W24 to 25.
		expect((await share.postForm(`${page()}?/saveGrid`, form('25', ''))).status).toBe(303);
		const rows = await testDb()('channel_demand')
			.where({ season_id: fx.seasonId, channel: 'market', crop_id: carrot })
			.orderBy('week')
			.select('week', 'quantity');
		// W24 carries the second editor's change, W25 the first one's: neither save undid the other.
		expect(rows.map((r) => [r.week, Number(r.quantity)])).toEqual([
			['2034-W24', 25],
			['2034-W25', 15]
		]);
	});
	it('copy a week: bad range 400 naming the field, good range 303', async () => {
		const bad = await share.postForm(`${page()}?/copyWeek`, {
			grid: grid(),
			fromWeek: '2034-W24',
			toFirst: '2034-W25',
			toLast: '2034-W40'
		});
		expect(bad.status).toBe(400);
		expect(await html(bad)).toContain("2034-W40 is outside Full share's distribution weeks 2034-W24–2034-W27.");
		expect(
			(
				await crew.postForm(`${page()}?/copyWeek`, {
					grid: grid(),
					fromWeek: '2034-W24',
					toFirst: '2034-W25',
					toLast: '2034-W27'
				})
			).status
		).toBe(403);
		const res = await share.postForm(`${page()}?/copyWeek`, {
			grid: grid(),
			fromWeek: '2034-W24',
			toFirst: '2034-W25',
			toLast: '2034-W27'
		});
		expect(res.status).toBe(303);
		// 2 crops × (W24 + 3 copied weeks) = 8 cells
		expect(await count('box_items', { share_size_id: fullId })).toBe(8);
	});
	it('remove the share size: crew 403, then 303 with its boxes gone', async () => {
		expect((await crew.postForm(`${page()}?/deleteShare`, { id: fullId })).status).toBe(403);
		expect((await share.postForm(`${page()}?/deleteShare`, { id: fullId })).status).toBe(303);
		expect(await count('box_items', { share_size_id: fullId })).toBe(0);
		expect((await share.postForm(`${page()}?/deleteShare`, { id: fullId })).status).toBe(404);
	});
});
