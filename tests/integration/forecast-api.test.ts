// GET /api/seasons/{id}/forecast: who may read it, what a bad query answers, and the figures
// for a small invented farm worked out by hand (see forecast-fixture.ts for the set-up).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, signedIn } from '../helpers/http';
import { closeTestDb, testDb } from '../helpers/db';
import { demo } from '../helpers/env';
import { makeForecastFarm, type ForecastFarm } from './forecast-fixture';

afterAll(closeTestDb);

let f: ForecastFarm;
let demoSeason: number;
beforeAll(async () => {
	f = await makeForecastFarm('forecast-api');
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	const demoFarm = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	demoSeason = (await testDb()('seasons').where({ farm_id: demoFarm, year: 2027 }).first('id')).id;
});

const url = (season: number, q = ''): string => `/api/seasons/${season}/forecast${q}`;
type Row = {
	crop: string;
	week: string;
	supply: number;
	demand: number;
	shortfall: number;
	surplus: number;
	actual: boolean;
};

describe('who may read the forecast', () => {
	it('no session: 401', async () => {
		expect((await new Client().get(url(demoSeason))).status).toBe(401);
	});
	it('every role of the farm reads it, the crew lead included', async () => {
		for (const who of [demo.owner, demo.crew, demo.share]) {
			const res = await (await signedIn(who, demo.password)).get(url(demoSeason, '?from=2027-W24&to=2027-W30'));
			expect(res.status, who).toBe(200);
			expect((await res.json()).weeks).toHaveLength(7); // W24 … W30
		}
	});
	it("another farm's season, or none at all: 404", async () => {
		expect((await f.client.get(url(demoSeason))).status).toBe(404);
		expect((await f.client.get(url(999_999_999))).status).toBe(404);
		expect((await f.client.get('/api/seasons/abc/forecast')).status).toBe(404);
	});
});

describe('a bad query is a 400 naming the parameter', () => {
	const cases: [string, string][] = [
		['?crops=carrots', 'crops'],
		['?crops=1,,2', 'crops'],
		['?from=2027-24', 'from'],
		['?from=2027-W60', 'from'],
		['?to=2027-W53', 'to'], // 2027 has 52 ISO weeks
		['?from=2027-W30&to=2027-W20', 'to'],
		['?from=2020-W01&to=2027-W01', 'to'], // more than 106 weeks
		['?shape=table', 'shape']
	];
	for (const [q, field] of cases) {
		it(`${q} → 400 naming ${field}`, async () => {
			const res = await f.client.get(url(f.season2027, q));
			expect(res.status).toBe(400);
			expect(Object.keys((await res.json()).errors)).toEqual([field]);
		});
	}
	it("a crop id that is not this farm's → 400 naming crops and the id", async () => {
		const res = await f.client.get(url(f.season2027, `?crops=${f.crops.carrot},999999999`));
		expect(res.status).toBe(400);
		expect((await res.json()).errors.crops).toContain('999999999');
	});
});

describe('the figures', () => {
	it('supply from the plantings (failed left out) against box demand, by hand', async () => {
		const res = await f.client.get(url(f.season2027));
		expect(res.status).toBe(200);
		const out = await res.json();
		// The season 2027-01-01 … 2027-12-31 spans 2026-W53 (1 Jan 2027 is a Friday) to 2027-W52: 53 weeks.
		expect(out.weeks).toHaveLength(53);
		expect(out.weeks[0]).toBe('2026-W53');
		expect(out.crops.map((c: { id: string }) => Number(c.id)).sort()).toEqual(Object.values(f.crops).sort());
		const at = (crop: number, week: string): Row =>
			out.rows.find((r: Row) => r.crop === String(crop) && r.week === week);
		// Carrot W24: 10 ft × 2 lb = 20 lb (the failed 100 ft adds nothing); demand 10 × 2 + 5 × 1 = 25 → 5 short.
		expect(at(f.crops.carrot, '2027-W24')).toMatchObject({ demand: 25, actual: false });
		expect(at(f.crops.carrot, '2027-W24').supply).toBeCloseTo(20, 9);
		expect(at(f.crops.carrot, '2027-W24').shortfall).toBeCloseTo(5, 9);
		// Kale: 12 ft × 1 bunch = 12 against 10 × 1 = 10 → 2 over. Spinach 5 × 2 = 10 lb, no demand.
		expect(at(f.crops.kale, '2027-W24').surplus).toBeCloseTo(2, 9);
		expect(at(f.crops.spinach, '2027-W24').surplus).toBeCloseTo(10, 9);
		expect(out.rows).toHaveLength(4);
	});

	it('picks crops and weeks', async () => {
		const res = await f.client.get(url(f.season2027, `?crops=${f.crops.carrot}&from=2027-W24&to=2027-W25`));
		const out = await res.json();
		expect(out.weeks).toEqual(['2027-W24', '2027-W25']);
		expect(out.crops.map((c: { name: string; unit: string }) => [c.name, c.unit])).toEqual([['Carrot (test)', 'lb']]);
		expect(out.rows.map((r: Row) => [r.crop, r.week])).toEqual([[String(f.crops.carrot), '2027-W24']]);
	});

	it('logged harvests replace the forecast for past weeks', async () => {
		const out = await (
			await f.client.get(url(f.season2026, `?crops=${f.crops.carrot}&from=2026-W47&to=2026-W48`))
		).json();
		// 50 ft × 2 lb = 100 lb over 14 days → 50 lb a week. W47 (16–22 Nov) had 31 lb logged: 31 replaces 50.
		// W48 (23–29 Nov) is past too but has nothing logged, so it keeps the 50 lb forecast.
		expect(out.rows.map((r: Row) => [r.week, Math.round(r.supply * 1e6) / 1e6, r.actual])).toEqual([
			['2026-W47', 31, true],
			['2026-W48', 50, false]
		]);
	});

	it('shape=series: the same figures per crop in arrays across the weeks', async () => {
		const q = `?from=2027-W23&to=2027-W25`;
		const rows = (await (await f.client.get(url(f.season2027, q))).json()).rows as Row[];
		const out = await (await f.client.get(url(f.season2027, `${q}&shape=series`))).json();
		expect(out.rows).toBeUndefined();
		expect(out.weeks).toEqual(['2027-W23', '2027-W24', '2027-W25']);
		type S = { crop: string; supply: (number | null)[]; demand: number[]; actual: number[] };
		const carrot = out.series.find((s: S) => s.crop === String(f.crops.carrot));
		// Carrot has figures in W24 only (20 lb against 25 lb, as above): null where there is no row.
		expect(carrot.supply[0]).toBeNull();
		expect(carrot.supply[1]).toBeCloseTo(20, 9);
		expect(carrot.supply[2]).toBeNull();
		expect(carrot.demand).toEqual([0, 25, 0]);
		expect(carrot.actual).toEqual([]);
		// Every row of the rows shape is one non-null entry, with the same supply and demand.
		const back = out.series.flatMap((s: S) =>
			out.weeks.flatMap((w: string, i: number) => (s.supply[i] === null ? [] : [[s.crop, w, s.supply[i], s.demand[i]]]))
		);
		expect(back).toEqual(rows.map((r) => [r.crop, r.week, r.supply, r.demand]));
	});

	it('shape=series marks logged weeks by index', async () => {
		const out = await (
			await f.client.get(url(f.season2026, `?crops=${f.crops.carrot}&from=2026-W47&to=2026-W48&shape=series`))
		).json();
		// W47 (index 0) had 31 lb logged; W48 (index 1) keeps the 50 lb forecast.
		expect(out.series).toHaveLength(1);
		expect(out.series[0].supply.map((x: number) => Math.round(x * 1e6) / 1e6)).toEqual([31, 50]);
		expect(out.series[0].actual).toEqual([0]);
	});
});
