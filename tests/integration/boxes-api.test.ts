// Box matching and swaps through the API: roles, bad input, and a worked example where one
// swap lifts the fill from 90 % to 100 % and its undo brings it back (figures by hand).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, signedIn } from '../helpers/http';
import { closeTestDb, count, testDb } from '../helpers/db';
import { demo } from '../helpers/env';
import { makeForecastFarm, type ForecastFarm } from './forecast-fixture';

afterAll(closeTestDb);

let f: ForecastFarm;
let demoSeason: number;
let demoFarm: number;
beforeAll(async () => {
	f = await makeForecastFarm('boxes-api');
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	demoFarm = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	demoSeason = (await testDb()('seasons').where({ farm_id: demoFarm, year: 2027 }).first('id')).id;
});

type Box = {
	shareSizeId: string;
	week: string;
	fill: number;
	fillable: boolean;
	items: { crop: string; fill: number; need: number }[];
	substitutes: Record<string, { crop: string; quantity: number; covers: boolean }[]>;
};
const boxesUrl = (s: number): string => `/api/seasons/${s}/boxes`;
const swapsUrl = (s: number): string => `/api/seasons/${s}/boxes/swaps`;
async function boxes(
	client: Client,
	season: number
): Promise<{ boxes: Box[]; summary: { weeks: number; weeksFilled: number; averageFill: number } }> {
	const res = await client.get(boxesUrl(season));
	expect(res.status).toBe(200);
	return res.json();
}

/** A swap the demo data allows: a box item and another crop of the same unit. */
async function demoSwap(): Promise<{
	shareSizeId: number;
	week: string;
	fromCropId: number;
	toCropId: number;
	quantity: number;
}> {
	const item = await testDb()('box_items as i')
		.join('share_sizes as s', 's.id', 'i.share_size_id')
		.join('crops as c', 'c.id', 'i.crop_id')
		.where('s.season_id', demoSeason)
		.andWhere('c.harvest_unit', 'lb')
		.first('i.share_size_id', 'i.week', 'i.crop_id', 'i.quantity', 'c.harvest_unit');
	const other = await testDb()('crops')
		.where({ farm_id: demoFarm, harvest_unit: item.harvest_unit })
		.whereNot('id', item.crop_id)
		.first('id');
	return {
		shareSizeId: item.share_size_id,
		week: item.week,
		fromCropId: item.crop_id,
		toCropId: other.id,
		quantity: Math.min(0.25, Number(item.quantity))
	};
}

describe('who may read and swap', () => {
	it('no session: 401 on read, swap and undo', async () => {
		const anon = new Client();
		expect((await anon.get(boxesUrl(demoSeason))).status).toBe(401);
		expect((await anon.json(swapsUrl(demoSeason), 'POST', {})).status).toBe(401);
		expect((await anon.json(`${swapsUrl(demoSeason)}/1`, 'DELETE')).status).toBe(401);
	});
	it('the crew lead reads the boxes but may not swap or undo (403), and nothing is written', async () => {
		const crew = await signedIn(demo.crew, demo.password);
		expect((await crew.get(boxesUrl(demoSeason))).status).toBe(200);
		const before = await count('box_swaps');
		expect((await crew.json(swapsUrl(demoSeason), 'POST', await demoSwap())).status).toBe(403);
		expect((await crew.json(`${swapsUrl(demoSeason)}/1`, 'DELETE')).status).toBe(403);
		expect(await count('box_swaps')).toBe(before);
	});
	it('the share manager swaps (201) and undoes (204) in the demo season', async () => {
		const share = await signedIn(demo.share, demo.password);
		const res = await share.json(swapsUrl(demoSeason), 'POST', await demoSwap());
		expect(res.status).toBe(201);
		const { id } = await res.json();
		const row = await testDb()('box_swaps').where({ id }).first();
		const manager = await testDb()('users').where({ email: demo.share }).first('id');
		expect(row.created_by).toBe(manager.id);
		expect((await share.json(`${swapsUrl(demoSeason)}/${id}`, 'DELETE')).status).toBe(204);
		expect((await testDb()('box_swaps').where({ id }).first()).undone_by).toBe(manager.id);
	});
	it("another farm's season and swaps answer 404", async () => {
		expect((await f.client.get(boxesUrl(demoSeason))).status).toBe(404);
		expect((await f.client.json(swapsUrl(demoSeason), 'POST', await demoSwap())).status).toBe(404);
		const share = await signedIn(demo.share, demo.password);
		const { id } = await (
			await f.client.json(swapsUrl(f.season2027), 'POST', {
				shareSizeId: f.shares.full,
				week: '2027-W24',
				fromCropId: f.crops.carrot,
				toCropId: f.crops.spinach,
				quantity: 0.25
			})
		).json();
		expect((await share.json(`${swapsUrl(demoSeason)}/${id}`, 'DELETE')).status).toBe(404);
		expect((await f.client.json(`${swapsUrl(f.season2027)}/${id}`, 'DELETE')).status).toBe(204);
		expect((await f.client.json(`${swapsUrl(f.season2027)}/999999999`, 'DELETE')).status).toBe(404);
	});
});

describe('a bad swap is a 400 naming the field, and writes nothing', () => {
	const good = (): Record<string, unknown> => ({
		shareSizeId: f.shares.full,
		week: '2027-W24',
		fromCropId: f.crops.carrot,
		toCropId: f.crops.spinach,
		quantity: 0.5
	});
	const cases: [string, (b: Record<string, unknown>) => void, string][] = [
		['quantity not a number', (b) => (b.quantity = 'lots'), 'quantity'],
		['quantity zero', (b) => (b.quantity = 0), 'quantity'],
		['more than the box holds (2 lb)', (b) => (b.quantity = 3), 'quantity'],
		['a week outside the share', (b) => (b.week = '2027-W30'), 'week'],
		['not a week', (b) => (b.week = 'June'), 'week'],
		[
			'a crop in another unit (kale, bunches) without its confirmed quantity',
			(b) => (b.toCropId = f.crops.kale),
			'toQuantity'
		],
		['a confirmed quantity of 0', (b) => ((b.toCropId = f.crops.kale), (b.toQuantity = 0)), 'toQuantity'],
		['the same crop', (b) => (b.toCropId = f.crops.carrot), 'toCropId'],
		['a crop not in the box', (b) => ((b.fromCropId = f.crops.spinach), (b.toCropId = f.crops.carrot)), 'fromCropId'],
		['another farm’s share size', (b) => (b.shareSizeId = 1), 'shareSizeId'],
		['an unknown field', (b) => (b.note = 'x'), '_form']
	];
	for (const [what, change, field] of cases) {
		it(`${what} → ${field}`, async () => {
			const body = good();
			change(body);
			const before = await count('box_swaps', { season_id: f.season2027 });
			const res = await f.client.json(swapsUrl(f.season2027), 'POST', body);
			expect(res.status).toBe(400);
			expect(Object.keys((await res.json()).errors)).toEqual([field]);
			expect(await count('box_swaps', { season_id: f.season2027 })).toBe(before);
		});
	}
});

describe('worked example: one swap and its undo', () => {
	it('moves the fill as computed by hand', async () => {
		const before = await boxes(f.client, f.season2027);
		const full = (b: Box[]): Box => b.find((x) => x.shareSizeId === String(f.shares.full) && x.week === '2027-W24')!;
		const half = (b: Box[]): Box => b.find((x) => x.shareSizeId === String(f.shares.half) && x.week === '2027-W24')!;
		// Carrot: supply 20 lb, demand 10 × 2 + 5 × 1 = 25 lb → 80 %. Kale 12 ≥ 10 → 100 %.
		// Full box = (80 + 100) / 2 = 90 %; half box (carrot only) = 80 %; season average (90 + 80) / 2 = 85 %.
		expect(full(before.boxes).fill).toBeCloseTo(0.9, 9);
		expect(half(before.boxes).fill).toBeCloseTo(0.8, 9);
		expect(before.summary).toMatchObject({ weeks: 1, weeksFilled: 0 });
		expect(before.summary.averageFill).toBeCloseTo(0.85, 9);
		// Suggested: short 5 lb ÷ 10 members = 0.5 lb a box of spinach (surplus 10 lb ≥ 10 × 0.5).
		expect(full(before.boxes).substitutes[String(f.crops.carrot)]).toEqual([
			expect.objectContaining({ crop: String(f.crops.spinach), quantity: 0.5, covers: true })
		]);

		const res = await f.client.json(swapsUrl(f.season2027), 'POST', {
			shareSizeId: f.shares.full,
			week: '2027-W24',
			fromCropId: f.crops.carrot,
			toCropId: f.crops.spinach,
			quantity: 0.5
		});
		expect(res.status).toBe(201);
		const { id } = await res.json();
		const row = await testDb()('box_swaps').where({ id }).first();
		expect([row.week, row.from_crop_id, row.to_crop_id, Number(row.quantity), row.created_by, row.undone_at]).toEqual([
			'2027-W24',
			f.crops.carrot,
			f.crops.spinach,
			0.5,
			f.userId,
			null
		]);

		const after = await boxes(f.client, f.season2027);
		// Carrot demand 10 × 1.5 + 5 × 1 = 20 lb = supply → 100 %; spinach 10 × 0.5 = 5 ≤ 10 lb → 100 %.
		expect(full(after.boxes).fill).toBe(1);
		expect(
			full(after.boxes)
				.items.map((i) => i.crop)
				.sort()
		).toEqual([f.crops.carrot, f.crops.kale, f.crops.spinach].map(String).sort());
		expect(half(after.boxes).fill).toBe(1);
		expect(after.summary).toMatchObject({ weeks: 1, weeksFilled: 1, averageFill: 1 });
		// The planned box contents themselves are untouched: the swap is an overlay.
		expect(
			Number(
				(await testDb()('box_items').where({ share_size_id: f.shares.full, crop_id: f.crops.carrot }).first('quantity'))
					.quantity
			)
		).toBe(2);

		expect((await f.client.json(`${swapsUrl(f.season2027)}/${id}`, 'DELETE')).status).toBe(204);
		expect((await f.client.json(`${swapsUrl(f.season2027)}/${id}`, 'DELETE')).status).toBe(409);
		const undone = await boxes(f.client, f.season2027);
		expect(full(undone.boxes).fill).toBeCloseTo(0.9, 9);
		// The forecast sees the same demand: carrot W24 back to 25 lb.
		const fc = await (
			await f.client.get(`/api/seasons/${f.season2027}/forecast?crops=${f.crops.carrot}&from=2027-W24&to=2027-W24`)
		).json();
		expect(fc.rows[0].demand).toBe(25);
	});
});
