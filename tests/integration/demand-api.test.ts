// The demand JSON routes: who may read and write, bad input named by field (and cells by crop
// and week), nothing half-written, and the derived targets worked out by hand.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import * as XLSX from 'xlsx';
import { Client, signedIn } from '../helpers/http';
import { closeTestDb, count, testDb, uniqueEmail } from '../helpers/db';
import { demo } from '../helpers/env';
import { demandSeason, type DemandFixture } from './demand-fixture';
import { confirmedSignUp } from '../helpers/signup';

let fx: DemandFixture;
let share: Client;
let crew: Client;
let owner: Client;
let carrot: number;
let kale: number;
beforeAll(async () => {
	fx = await demandSeason(2031);
	carrot = fx.crop('Carrot'); // harvest unit lb
	kale = fx.crop('Kale'); // harvest unit bunch
	[share, crew, owner] = await Promise.all([
		signedIn(demo.share, demo.password),
		signedIn(demo.crew, demo.password),
		signedIn(demo.owner, demo.password)
	]);
});
afterAll(async () => {
	await fx.cleanup();
	await closeTestDb();
});

const base = () => `/api/seasons/${fx.seasonId}/demand`;
const full = {
	name: 'Full share',
	members: 60,
	firstWeek: '2031-W24',
	lastWeek: '2031-W30',
	pickupDays: ['Tue', 'Fri'],
	price: '720.00'
};
const half = {
	name: 'Half share',
	members: 40,
	firstWeek: '2031-W24',
	lastWeek: '2031-W30',
	pickupDays: ['Tue'],
	price: 420
};

describe('share sizes', () => {
	let fullId: number;
	let halfId: number;
	it('no session: 401 on read and write', async () => {
		expect((await new Client().get(base())).status).toBe(401);
		expect((await new Client().json(`${base()}/share-sizes`, 'POST', full)).status).toBe(401);
	});
	it('crew lead: 403 on write, and nothing is written', async () => {
		const res = await crew.json(`${base()}/share-sizes`, 'POST', full);
		expect(res.status).toBe(403);
		expect(await count('share_sizes', { season_id: fx.seasonId })).toBe(0);
	});
	it('share manager adds one: 201, price kept in cents', async () => {
		const res = await share.json(`${base()}/share-sizes`, 'POST', full);
		expect(res.status).toBe(201);
		const body = await res.json();
		fullId = body.id;
		// 720.00 dollars = 72,000 cents
		expect(body).toMatchObject({
			name: 'Full share',
			members: 60,
			firstWeek: '2031-W24',
			lastWeek: '2031-W30',
			pickupDays: ['Tue', 'Fri'],
			priceCents: 72_000
		});
	});
	it('the owner adds another (price as a number of dollars)', async () => {
		const res = await owner.json(`${base()}/share-sizes`, 'POST', half);
		expect(res.status).toBe(201);
		const body = await res.json();
		halfId = body.id;
		expect(body.priceCents).toBe(42_000);
	});
	it('a name already used in the season: 409 naming name', async () => {
		const res = await share.json(`${base()}/share-sizes`, 'POST', full);
		expect(res.status).toBe(409);
		expect(Object.keys((await res.json()).errors)).toEqual(['name']);
	});
	const bad: [Record<string, unknown>, string][] = [
		[{ ...full, name: '' }, 'name'],
		[{ ...full, members: -1 }, 'members'],
		[{ ...full, members: 2.5 }, 'members'],
		[{ ...full, firstWeek: 'W24' }, 'firstWeek'],
		[{ ...full, firstWeek: '2031-W54' }, 'firstWeek'],
		[{ ...full, lastWeek: '2031-W20' }, 'lastWeek'],
		[{ ...full, firstWeek: '2030-W40', name: 'Early' }, 'firstWeek'],
		[{ ...full, price: '12.345' }, 'price'],
		[{ ...full, pickupDays: ['Funday'] }, 'pickupDays.0'],
		[{ ...full, colour: 'green' }, '_form']
	];
	for (const [body, field] of bad) {
		it(`${JSON.stringify(body).slice(0, 90)} → 400 naming ${field}`, async () => {
			const before = await count('share_sizes', { season_id: fx.seasonId });
			const res = await share.json(`${base()}/share-sizes`, 'POST', body);
			expect(res.status).toBe(400);
			expect(Object.keys((await res.json()).errors)).toContain(field);
			expect(await count('share_sizes', { season_id: fx.seasonId })).toBe(before);
		});
	}
	it('PUT changes it; crew 403; 400 names the field; unknown id 404', async () => {
		const path = `${base()}/share-sizes/${fullId}`;
		expect((await crew.json(path, 'PUT', { ...full, members: 1 })).status).toBe(403);
		const badRes = await share.json(path, 'PUT', { ...full, members: 'many' });
		expect(badRes.status).toBe(400);
		expect((await badRes.json()).errors.members).toMatch(/number/);
		expect((await share.json(`${base()}/share-sizes/999999`, 'PUT', full)).status).toBe(404);
		const res = await share.json(path, 'PUT', { ...full, pickupDays: 'Sat, Wed', price: '0.29' });
		expect(res.status).toBe(200);
		// Days come back in week order; 0.29 dollars is 29 cents exactly (no float drift to 28).
		expect(await res.json()).toMatchObject({ pickupDays: ['Wed', 'Sat'], priceCents: 29 });
		expect((await testDb()('share_sizes').where({ id: fullId }).first()).pickup_days).toBe('Wed, Sat');
	});
	it('crew lead reads the list', async () => {
		const res = await crew.get(`${base()}/share-sizes`);
		expect(res.status).toBe(200);
		expect((await res.json()).map((s: { name: string }) => s.name)).toEqual(['Full share', 'Half share']);
	});

	describe('box contents and channel demand', () => {
		it('crew lead: 403 on cells and copy-week', async () => {
			expect((await crew.json(`${base()}/cells`, 'PATCH', { grid: `share:${fullId}`, cells: [] })).status).toBe(403);
			expect(
				(
					await crew.json(`${base()}/copy-week`, 'POST', {
						grid: 'market',
						fromWeek: '2031-W24',
						toFirst: '2031-W25',
						toLast: '2031-W26'
					})
				).status
			).toBe(403);
		});
		it('bad cells are each named by crop and week, and nothing is written', async () => {
			const res = await share.json(`${base()}/cells`, 'PATCH', {
				grid: `share:${fullId}`,
				cells: [
					{ crop: carrot, week: '2031-W24', quantity: 1.5, unit: 'lb' }, // good, but the call is refused whole
					{ crop: kale, week: '2031-W24', quantity: 1, unit: 'lb' }, // Kale is counted in bunches
					{ crop: carrot, week: '2031-W31', quantity: 1, unit: 'lb' }, // after the share's last week
					{ crop: carrot, week: '2031-W25', quantity: 'lots', unit: 'lb' },
					{ crop: 999999, week: '2031-W25', quantity: 1, unit: 'lb' }
				]
			});
			expect(res.status).toBe(400);
			const { errors } = await res.json();
			expect(errors['cells.1.unit']).toBe("Kale, 2031-W24: unit must be bunch, Kale's harvest unit (got lb).");
			expect(errors['cells.2.week']).toMatch(
				/^Carrot, 2031-W31: outside Full share's distribution weeks 2031-W24–2031-W30/
			);
			expect(errors['cells.3.quantity']).toMatch(/^Carrot, 2031-W25: Quantity must be a number/);
			expect(errors['cells.4.crop']).toMatch(/no such crop/);
			expect(errors['cells.0.quantity']).toBeUndefined();
			expect(await count('box_items', { share_size_id: fullId })).toBe(0);
		});
		it('an unknown grid: 404; a malformed one: 400', async () => {
			expect((await share.json(`${base()}/cells`, 'PATCH', { grid: 'share:999999', cells: [] })).status).toBe(404);
			const res = await share.json(`${base()}/cells`, 'PATCH', { grid: 'stall', cells: [] });
			expect(res.status).toBe(400);
			expect(Object.keys((await res.json()).errors)).toContain('grid');
		});
		it('sets box contents and market demand; targets come out as worked by hand', async () => {
			let res = await share.json(`${base()}/cells`, 'PATCH', {
				grid: `share:${fullId}`,
				cells: [
					{ crop: carrot, week: '2031-W24', quantity: 1.5, unit: 'lb' },
					{ crop: kale, week: '2031-W24', quantity: 1, unit: 'bunch' }
				]
			});
			expect(res.status).toBe(200);
			expect(await res.json()).toEqual({ set: 2, cleared: 0 });
			res = await share.json(`${base()}/cells`, 'PATCH', {
				grid: `share:${halfId}`,
				cells: [{ crop: carrot, week: '2031-W24', quantity: 0.75, unit: 'lb' }]
			});
			expect(res.status).toBe(200);
			res = await share.json(`${base()}/cells`, 'PATCH', {
				grid: 'market',
				cells: [{ crop: carrot, week: '2031-W24', quantity: 20, unit: 'lb' }]
			});
			expect(res.status).toBe(200);
			res = await owner.json(`${base()}/cells`, 'PATCH', {
				grid: 'restaurant',
				cells: [{ crop: kale, week: '2031-W40', quantity: 12, unit: 'bunch' }]
			});
			expect(res.status).toBe(200);

			const demand = await (await crew.get(base())).json();
			const target = (crop: number, week: string) =>
				demand.targets.find((t: { crop: number; week: string }) => t.crop === crop && t.week === week)?.quantity;
			// Carrot W24: 60 full × 1.5 lb + 40 half × 0.75 lb + 20 lb market = 90 + 30 + 20 = 140 lb
			expect(target(carrot, '2031-W24')).toBe(140);
			// Kale W24: 60 full × 1 bunch = 60 bunches (the half box has no kale)
			expect(target(kale, '2031-W24')).toBe(60);
			// Kale W40: restaurants only, after the shares end = 12 bunches
			expect(target(kale, '2031-W40')).toBe(12);
			expect(demand.targets).toHaveLength(3);
			expect((await testDb()('box_items').where({ share_size_id: fullId, crop_id: kale }).first()).unit).toBe('bunch');
		});
		it('copy a week to a range, then clear a cell with an empty quantity', async () => {
			const bad = await share.json(`${base()}/copy-week`, 'POST', {
				grid: `share:${fullId}`,
				fromWeek: '2031-W24',
				toFirst: '2031-W26',
				toLast: '2031-W25'
			});
			expect(bad.status).toBe(400);
			expect(Object.keys((await bad.json()).errors)).toEqual(['toLast']);
			const outside = await share.json(`${base()}/copy-week`, 'POST', {
				grid: `share:${fullId}`,
				fromWeek: '2031-W24',
				toFirst: '2031-W25',
				toLast: '2031-W35'
			});
			expect(outside.status).toBe(400);
			expect((await outside.json()).errors.toLast).toMatch(/outside Full share's distribution weeks/);

			const res = await share.json(`${base()}/copy-week`, 'POST', {
				grid: `share:${fullId}`,
				fromWeek: '2031-W24',
				toFirst: '2031-W24',
				toLast: '2031-W27'
			});
			expect(res.status).toBe(200);
			// W25, W26, W27 (W24 is the source) × 2 crops = 6 cells
			expect(await res.json()).toEqual({ weeks: 3, cells: 6 });
			expect(await count('box_items', { share_size_id: fullId })).toBe(8);

			const clear = await share.json(`${base()}/cells`, 'PATCH', {
				grid: `share:${fullId}`,
				cells: [
					{ crop: kale, week: '2031-W27', quantity: null, unit: 'bunch' },
					{ crop: carrot, week: '2031-W27', quantity: 0, unit: 'lb' }
				]
			});
			expect(await clear.json()).toEqual({ set: 0, cleared: 2 });
			expect(await count('box_items', { share_size_id: fullId })).toBe(6);
			const demand = await (await share.get(base())).json();
			// Carrot W26 after the copy: 60 full × 1.5 lb = 90 lb (the half box and the market only have W24)
			expect(
				demand.targets.find((t: { crop: number; week: string }) => t.crop === carrot && t.week === '2031-W26').quantity
			).toBe(90);
		});
		it('the template downloads in the upload layout, as CSV and as .xlsx', async () => {
			const csv = await crew.get(`${base()}/file?format=csv`);
			expect(csv.status).toBe(200);
			expect(csv.headers.get('content-type')).toMatch(/text\/csv/);
			const lines = (await csv.text()).trim().split(/\r\n/);
			expect(lines[0]).toBe('channel,crop,week,quantity,unit');
			expect(lines).toContain('Full share,Carrot,2031-W24,1.5,lb');
			expect(lines).toContain('market,Carrot,2031-W24,20,lb');
			expect(lines).toContain('restaurant,Kale,2031-W40,12,bunch');
			const xlsx = await crew.get(`${base()}/file?format=xlsx`);
			expect(xlsx.status).toBe(200);
			// Read back with SheetJS, a second reader independent of the exceljs writer.
			const book = XLSX.read(new Uint8Array(await xlsx.arrayBuffer()), { type: 'array' });
			const rows = XLSX.utils.sheet_to_json<Record<string, unknown>>(book.Sheets[book.SheetNames[0]]);
			expect(rows).toContainEqual({
				channel: 'Half share',
				crop: 'Carrot',
				week: '2031-W24',
				quantity: 0.75,
				unit: 'lb'
			});
			expect(rows).toHaveLength(lines.length - 1);
			expect((await crew.get(`${base()}/file?format=pdf`)).status).toBe(400);
			expect((await new Client().get(`${base()}/file`)).status).toBe(401);
		});
	});

	it("another farm's owner gets 404 for this season's demand", async () => {
		const other = new Client();
		await confirmedSignUp(other, {
			name: 'Other',
			email: uniqueEmail('demand'),
			password: 'long-enough-pass',
			farmName: 'Elsewhere (invented)',
			latitude: '41',
			lastSpringFrost: '2031-05-01',
			firstFallFrost: '2031-10-01'
		});
		expect((await other.get(base())).status).toBe(404);
		expect((await other.json(`${base()}/share-sizes`, 'POST', full)).status).toBe(404);
		expect((await other.json(`${base()}/cells`, 'PATCH', { grid: 'market', cells: [] })).status).toBe(404);
	});

	it('DELETE removes a share size with its box contents: crew 403, unknown 404, then 204', async () => {
		expect(
			(
				await crew.request(`${base()}/share-sizes/${fullId}`, {
					method: 'DELETE',
					headers: { origin: process.env.FC_BASE_URL! }
				})
			).status
		).toBe(403);
		expect(
			(
				await share.request(`${base()}/share-sizes/999999`, {
					method: 'DELETE',
					headers: { origin: process.env.FC_BASE_URL! }
				})
			).status
		).toBe(404);
		const res = await share.request(`${base()}/share-sizes/${fullId}`, {
			method: 'DELETE',
			headers: { origin: process.env.FC_BASE_URL! }
		});
		expect(res.status).toBe(204);
		expect(await count('box_items', { share_size_id: fullId })).toBe(0);
		expect(await count('share_sizes', { season_id: fx.seasonId })).toBe(1);
	});
});
