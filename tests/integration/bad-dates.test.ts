// One bad date must not break a season for everyone: dates outside 1900–2200 (or the season's
// year ± 1 for a planting), weeks outside 1900–2200, and actual dates in the future are 400s
// naming the field, and the season's pages and APIs keep answering 200.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, signedIn } from '../helpers/http';
import { closeTestDb, testDb } from '../helpers/db';
import { demo } from '../helpers/env';

afterAll(closeTestDb);

let seasonId: number;
let varietyId: number;
let owner: Client;
let crew: Client;
const ids: number[] = [];

beforeAll(async () => {
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	const farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	seasonId = (await testDb()('seasons').where({ farm_id: farmId, year: 2027 }).first('id')).id;
	varietyId = (await testDb()('varieties').where({ farm_id: farmId }).first('id')).id;
	owner = await signedIn(demo.owner, demo.password);
	crew = await signedIn(demo.crew, demo.password);
});
afterAll(async () => {
	if (ids.length) await testDb()('plantings').whereIn('id', ids).delete();
});

async function fresh(): Promise<{ id: number; version: number }> {
	const res = await owner.json(`/api/seasons/${seasonId}/plantings`, 'POST', {
		plantings: [{ varietyId, lengthFt: 10, fieldDate: '2027-05-03' }]
	});
	expect(res.status).toBe(201);
	const p = (await res.json()).plantings[0];
	ids.push(p.id);
	return { id: p.id, version: p.version };
}

async function snapshot(id: number): Promise<unknown> {
	return testDb()('plantings').where({ id }).first();
}

describe('planting dates', () => {
	for (const fieldDate of ['0999-06-01', '0000-01-01', '9999-12-31', '2030-06-01']) {
		it(`PATCH fieldDate ${fieldDate}: 400 naming fieldDate, row unchanged`, async () => {
			const p = await fresh();
			const before = await snapshot(p.id);
			const res = await owner.json(`/api/plantings/${p.id}`, 'PATCH', { version: p.version, fieldDate });
			expect(res.status).toBe(400);
			expect(Object.keys((await res.json()).errors)).toEqual(['fieldDate']);
			expect(await snapshot(p.id)).toEqual(before);
		});
	}

	it('POST fieldDate 9999-12-31: 400 naming plantings.0.fieldDate', async () => {
		const res = await owner.json(`/api/seasons/${seasonId}/plantings`, 'POST', {
			plantings: [{ varietyId, lengthFt: 10, fieldDate: '9999-12-31' }]
		});
		expect(res.status).toBe(400);
		expect(Object.keys((await res.json()).errors)).toEqual(['plantings.0.fieldDate']);
	});

	it("a crew lead's actual dates follow the crew sheet's rule: not in year 1 or 9999, not in the future", async () => {
		const p = await fresh();
		const future = new Date(Date.now() + 3 * 86_400_000).toISOString().slice(0, 10);
		for (const [field, value] of [
			['actualFieldDate', '0001-05-01'],
			['actualFieldDate', '9999-05-01'],
			['actualFirstHarvest', future],
			['actualLastHarvest', '2024-07-01']
		]) {
			const res = await crew.json(`/api/plantings/${p.id}`, 'PATCH', { version: p.version, [field]: value });
			expect(res.status, `${field} ${value}`).toBe(400);
			expect(Object.keys((await res.json()).errors), `${field} ${value}`).toEqual([field]);
		}
		// A harvest before the planting went into the field is refused too.
		const early = await crew.json(`/api/plantings/${p.id}`, 'PATCH', {
			version: p.version,
			actualFieldDate: '2026-11-20',
			actualFirstHarvest: '2026-11-10'
		});
		expect(early.status).toBe(400);
		expect(Object.keys((await early.json()).errors)).toEqual(['actualFirstHarvest']);
		const ok = await crew.json(`/api/plantings/${p.id}`, 'PATCH', {
			version: p.version,
			actualFieldDate: '2026-11-20'
		});
		expect(ok.status).toBe(200);
	});

	it("the season's pages and APIs still answer 200 for every role afterwards", async () => {
		const share = await signedIn(demo.share, demo.password);
		for (const client of [owner, crew, share]) {
			for (const path of ['forecast', 'boxes', 'export', 'harvests/results'])
				expect((await client.get(`/api/seasons/${seasonId}/${path}`)).status, path).toBe(200);
			for (const path of ['beds', 'boxes', 'results', 'forecast'])
				expect((await client.get(`/seasons/${seasonId}/${path}`)).status, path).toBe(200);
		}
	});
});

describe('weeks far away', () => {
	it('free-space to 9999-W52: 400 naming to', async () => {
		const res = await owner.get(`/api/seasons/${seasonId}/free-space?from=2027-W01&to=9999-W52`);
		expect(res.status).toBe(400);
		expect(Object.keys((await res.json()).errors)).toContain('to');
	});
	it('the overview at ?week=9999-W52 as crew lead: 400, not 500', async () => {
		const res = await crew.get('/?week=9999-W52');
		expect(res.status).toBe(400);
		expect(await res.text()).toContain('between 1900 and 2200');
	});
	it('a crew sheet of week 0999-W10: 400', async () => {
		expect((await crew.get(`/seasons/${seasonId}/week/0999-W10`)).status).toBe(400);
	});
	it('forecast to 9999-W52: 400 naming to', async () => {
		const res = await owner.get(`/api/seasons/${seasonId}/forecast?from=2027-W01&to=9999-W52`);
		expect(res.status).toBe(400);
		expect(Object.keys((await res.json()).errors)).toEqual(['to']);
	});
});
