// GET /api/seasons/{id}/free-space: who may ask, bad weeks named by field, and the free feet
// of a farm set up by hand (tests/integration/free-space-fixture.ts works the numbers out).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, signedIn } from '../helpers/http';
import { closeTestDb, testDb } from '../helpers/db';
import { demo } from '../helpers/env';
import { makeFreeSpaceFarm, type FreeSpaceFarm } from './free-space-fixture';

afterAll(closeTestDb);

let farm: FreeSpaceFarm;
let demoSeasonId: number;
beforeAll(async () => {
	farm = await makeFreeSpaceFarm('free-api');
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	const demoFarm = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	demoSeasonId = (await testDb()('seasons').where({ farm_id: demoFarm, year: 2027 }).first('id')).id;
});

const url = (seasonId: number, q: string) => `/api/seasons/${seasonId}/free-space?${q}`;

describe('who may ask', () => {
	it('no session: 401', async () => {
		expect((await new Client().get(url(demoSeasonId, 'from=2027-W20&to=2027-W23'))).status).toBe(401);
	});
	it("another farm's season: 404", async () => {
		expect((await farm.client.get(url(demoSeasonId, 'from=2027-W20&to=2027-W23'))).status).toBe(404);
	});
	it('a season id that is not a number: 404', async () => {
		expect((await farm.client.get(url(Number.NaN, 'from=2027-W20&to=2027-W23'))).status).toBe(404);
	});
	it('every demo role may read its own season', async () => {
		for (const who of [demo.owner, demo.crew, demo.share]) {
			const client = await signedIn(who, demo.password);
			const res = await client.get(url(demoSeasonId, 'from=2027-W20&to=2027-W23'));
			expect(res.status, who).toBe(200);
			// 40 demo beds (14 North + 13 Middle + 13 South, db/seeds/demo-farm.ts).
			expect((await res.json()).bedsChecked).toBe(40);
		}
	});
});

describe('bad input names the field', () => {
	const cases: [string, string][] = [
		['to=2027-W23', 'from'],
		['from=2027-W20', 'to'],
		['from=2027-W60&to=2027-W61', 'from'],
		['from=week20&to=2027-W23', 'from'],
		['from=2027-W20&to=2027-W53', 'to'], // 2027 has 52 ISO weeks (REFERENCES.md: 2027-12-31 = 2027-W52-5)
		['from=2027-W23&to=2027-W20', 'to'],
		['from=2027-W20&to=2027-W23&minFt=-5', 'minFt'],
		['from=2027-W20&to=2027-W23&minFt=lots', 'minFt']
	];
	for (const [q, field] of cases) {
		it(`${q} -> 400 naming ${field}`, async () => {
			const res = await farm.client.get(url(farm.seasonId, q));
			expect(res.status).toBe(400);
			const out = await res.json();
			expect(Object.keys(out.errors)).toContain(field);
			expect(out.message).toContain(field);
		});
	}
});

describe('free space', () => {
	it('W20–W23: A1 free 30–60 ft, A2 free 0–50 ft, E1 full', async () => {
		const res = await farm.client.get(url(farm.seasonId, 'from=2027-W20&to=2027-W23'));
		expect(res.status).toBe(200);
		const out = await res.json();
		expect(out.fromDate).toBe('2027-05-17');
		expect(out.toDate).toBe('2027-06-13');
		expect(out.turnaroundDays).toBe(7);
		expect(out.bedsChecked).toBe(3);
		expect(out.beds.map((b: { bed: string }) => b.bed)).toEqual(['A1', 'A2']);
		expect(out.beds[0]).toMatchObject({
			bedId: farm.beds.a1,
			block: 'West',
			ranges: [{ startFt: 30, endFt: 60, lengthFt: 30 }],
			freeFt: 30,
			longestFt: 30
		});
		expect(out.beds[1]).toMatchObject({
			bedId: farm.beds.a2,
			ranges: [{ startFt: 0, endFt: 50, lengthFt: 50 }],
			freeFt: 50,
			longestFt: 50
		});
	});
	it('minFt=40 leaves only A2', async () => {
		const out = await (await farm.client.get(url(farm.seasonId, 'from=2027-W20&to=2027-W23&minFt=40'))).json();
		expect(out.minFt).toBe(40);
		expect(out.beds.map((b: { bed: string }) => b.bed)).toEqual(['A2']);
	});
	it('one week later (W21–W23, from Mon 24 May) A1 is still held at 0–30 ft until 27 May', async () => {
		// 0–30 ft: last harvest 20 May + 7 turnaround days = held through 27 May, inside W21.
		const out = await (await farm.client.get(url(farm.seasonId, 'from=2027-W21&to=2027-W23'))).json();
		expect(out.beds[0].ranges).toEqual([{ startFt: 30, endFt: 60, lengthFt: 30 }]);
	});
	it('W22 alone (31 May – 6 Jun): all of A1 is free, the planting at 60 ft only goes in on 10 Jun', async () => {
		const out = await (await farm.client.get(url(farm.seasonId, 'from=2027-W22&to=2027-W22'))).json();
		expect(out.beds[0].ranges).toEqual([{ startFt: 0, endFt: 100, lengthFt: 100 }]);
		// A1 100 ft + A2 50 ft; E1 still full (held to 1 Jul + 7 days).
		expect(out.beds.reduce((n: number, b: { freeFt: number }) => n + b.freeFt, 0)).toBe(150);
	});
	it('block=East checks E1 only, and it is full', async () => {
		const out = await (
			await farm.client.get(url(farm.seasonId, `from=2027-W20&to=2027-W23&block=${farm.blocks.east}`))
		).json();
		expect(out.bedsChecked).toBe(1);
		expect(out.beds).toEqual([]);
	});
});
