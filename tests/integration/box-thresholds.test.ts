// Share boxes: an item is flagged short only under the fill the share manager sets (default 95 %),
// and a short item can be swapped for a crop of another unit, sized by value from each crop's price
// per harvest unit, at the quantity the share manager confirms. Figures by hand from the fixture
// (see forecast-fixture.ts): W24 carrot supply 20 lb against 25 lb demand → 80 % fill.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { html, signedIn } from '../helpers/http';
import { closeTestDb, count, testDb } from '../helpers/db';
import { demo } from '../helpers/env';
import { makeForecastFarm, type ForecastFarm } from './forecast-fixture';

afterAll(closeTestDb);

let f: ForecastFarm;
beforeAll(async () => {
	f = await makeForecastFarm('box-thresholds');
});

type Sub = { crop: string; quantity: number; fromQuantity: number; byValue: boolean; covers: boolean };
type Box = {
	shareSizeId: string;
	week: string;
	fillable: boolean;
	items: { crop: string; short: boolean; perBox: number }[];
	substitutes: Record<string, Sub[]>;
};
async function box(share: number): Promise<Box> {
	const res = await f.client.get(`/api/seasons/${f.season2027}/boxes`);
	expect(res.status).toBe(200);
	return ((await res.json()).boxes as Box[]).find((b) => b.shareSizeId === String(share) && b.week === '2027-W24')!;
}
const shortFill = async (): Promise<number> =>
	(await testDb()('farms').where({ id: f.farmId }).first('box_short_fill_pct')).box_short_fill_pct;

describe('short threshold', () => {
	it('starts at 95 %, where an 80 % carrot is short', async () => {
		expect(await shortFill()).toBe(95);
		expect((await box(f.shares.full)).items.find((i) => i.crop === String(f.crops.carrot))!.short).toBe(true);
	});

	it('moves with the setting: at 80 % the same carrot is no longer short', async () => {
		const res = await f.client.postForm(`/seasons/${f.season2027}/boxes?/shortFill`, { shortFillPct: '80' });
		expect(res.status).toBe(303);
		expect(await shortFill()).toBe(80);
		const full = await box(f.shares.full);
		expect(full.items.find((i) => i.crop === String(f.crops.carrot))!.short).toBe(false);
		expect(full.fillable).toBe(true);
		expect(await html(await f.client.get(`/seasons/${f.season2027}/boxes`))).toContain(
			'flagged short under 80 % filled'
		);
		await f.client.postForm(`/seasons/${f.season2027}/boxes?/shortFill`, { shortFillPct: '95' });
	});

	it('names a bad value at its field and keeps the setting', async () => {
		for (const bad of ['120', 'most', '40', '90.5']) {
			const res = await f.client.postForm(`/seasons/${f.season2027}/boxes?/shortFill`, { shortFillPct: bad });
			expect(res.status).toBe(400);
			expect(await html(res)).toContain('id="short-fill-error"');
			expect(await shortFill()).toBe(95);
		}
	});

	it("is the share manager's and owner's to set, not the crew lead's", async () => {
		const crew = await signedIn(demo.crew, demo.password);
		const season = await testDb()('seasons as s')
			.join('farm_members as m', 'm.farm_id', 's.farm_id')
			.join('users as u', 'u.id', 'm.user_id')
			.where('u.email', demo.crew)
			.first('s.id', 's.farm_id');
		expect((await crew.postForm(`/seasons/${season.id}/boxes?/shortFill`, { shortFillPct: '60' })).status).toBe(403);
		expect((await testDb()('farms').where({ id: season.farm_id }).first('box_short_fill_pct')).box_short_fill_pct).toBe(
			95
		);
		const share = await signedIn(demo.share, demo.password);
		expect((await share.postForm(`/seasons/${season.id}/boxes?/shortFill`, { shortFillPct: '90' })).status).toBe(303);
		expect((await testDb()('farms').where({ id: season.farm_id }).first('box_short_fill_pct')).box_short_fill_pct).toBe(
			90
		);
		await share.postForm(`/seasons/${season.id}/boxes?/shortFill`, { shortFillPct: '95' });
	});
});

describe('swaps across units, by value', () => {
	it('offers chard (bunches) for short carrot (lb) only once both have a price', async () => {
		const half = await box(f.shares.half);
		expect(half.substitutes[String(f.crops.carrot)].some((s) => s.crop === String(f.crops.chard))).toBe(false);
		// Invented prices: carrot $2.00 per lb, chard $3.00 per bunch.
		await testDb()('crops').where({ id: f.crops.carrot }).update({ price_cents_per_unit: 200 });
		await testDb()('crops').where({ id: f.crops.chard }).update({ price_cents_per_unit: 300 });
		// Half share, 5 members: carrot short 5 lb → 1 lb a box wanted = $2.00 → 0.67 bunch → 1 bunch (whole bunches);
		// chard surplus 8 bunches ÷ 5 = 1 a box at most. One bunch = $3.00 = 1.5 lb, capped at the 1 lb the box holds.
		const priced = await box(f.shares.half);
		expect(priced.substitutes[String(f.crops.carrot)].find((s) => s.crop === String(f.crops.chard))).toMatchObject({
			quantity: 1,
			fromQuantity: 1,
			byValue: true,
			covers: true
		});
	});

	it('records the confirmed quantity and puts it in the box', async () => {
		const res = await f.client.json(`/api/seasons/${f.season2027}/boxes/swaps`, 'POST', {
			shareSizeId: f.shares.half,
			week: '2027-W24',
			fromCropId: f.crops.carrot,
			toCropId: f.crops.chard,
			quantity: 1,
			toQuantity: 2
		});
		expect(res.status).toBe(201);
		const { id } = await res.json();
		const row = await testDb()('box_swaps').where({ id }).first();
		expect([Number(row.quantity), Number(row.to_quantity)]).toEqual([1, 2]);
		const half = await box(f.shares.half);
		// 1 lb carrot out (the whole item), 2 bunches chard in, as confirmed.
		expect(half.items.map((i) => [i.crop, i.perBox])).toEqual([[String(f.crops.chard), 2]]);
		expect(await count('box_swaps', { season_id: f.season2027, undone_at: null })).toBe(1);
		expect((await f.client.json(`/api/seasons/${f.season2027}/boxes/swaps/${id}`, 'DELETE')).status).toBe(204);
	});
});
