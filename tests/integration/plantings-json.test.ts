// The grid's list of a season's plantings is written as JSON by the database (plantings-json.ts),
// while a single planting (the PATCH answer) is built in Node (plantings.ts toView). The two must
// give the same value for the same row, every field: a field added to one and not the other fails here.
// Source for the text cases: RFC 8259 §7 (strings: quotes, backslash and control characters escaped).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signedIn, type Client } from '../helpers/http';
import { closeTestDb, testDb } from '../helpers/db';
import { demo } from '../helpers/env';

let owner: Client;
let farmId: number;
let seasonId: number;
const ids: number[] = [];
beforeAll(async () => {
	owner = await signedIn(demo.owner, demo.password);
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id as number;
	await testDb()('seasons').where({ farm_id: farmId, year: 2034 }).delete();
	[seasonId] = await testDb()('seasons').insert({
		farm_id: farmId,
		year: 2034,
		name: '2034 JSON test season (invented)',
		starts_on: '2034-01-01',
		ends_on: '2034-12-31'
	});
	const variety = await testDb()('varieties').where({ farm_id: farmId }).first('id');
	const bed = await testDb()('beds').where({ farm_id: farmId }).first('id');
	const row = {
		farm_id: farmId,
		season_id: seasonId,
		variety_id: variety.id,
		length_ft: 30,
		rows: 3,
		in_row_spacing_in: 2.5,
		method: 'direct',
		first_harvest: '2034-07-01',
		last_harvest: '2034-07-14',
		expected_yield: 12.25,
		seeds_needed: 800
	};
	ids.push(
		(await testDb()('plantings').insert({ ...row, bed_id: bed.id, start_ft: 12.5, field_date: '2034-05-02' }))[0]
	);
	ids.push((await testDb()('plantings').insert({ ...row, bed_id: null, field_date: '2034-05-01', notes: null }))[0]);
	ids.push(
		(
			await testDb()('plantings').insert({
				...row,
				bed_id: bed.id,
				start_ft: 60,
				field_date: '2034-05-03',
				status: 'sown',
				actual_field_date: '2034-05-04'
			})
		)[0]
	);
});
afterAll(async () => {
	await testDb()('plantings').whereIn('id', ids).delete();
	await testDb()('seasons').where({ id: seasonId }).delete();
	await closeTestDb();
});

type Row = Record<string, unknown>;
async function list(): Promise<Row[]> {
	const res = await owner.request(`/api/seasons/${seasonId}/plantings`);
	expect(res.status).toBe(200);
	return (await res.json()).plantings as Row[];
}

describe('GET /api/seasons/{id}/plantings', () => {
	it('gives every planting exactly as a PATCH answer gives it, tricky text and empty fields included', async () => {
		const notes = ['He said "thin to 2\\"" \\ then <b>water</b>', 'tab\there\nnew line ☃ é 🥕', ''];
		const patched: Row[] = [];
		for (const [i, id] of ids.entries()) {
			const version = (await testDb()('plantings').where({ id }).first('version')).version as number;
			const res = await owner.json(`/api/plantings/${id}`, 'PATCH', { version, notes: notes[i] });
			expect(res.status).toBe(200);
			patched.push((await res.json()).planting as Row);
		}
		const rows = await list();
		// Field-date order, as the grid expects: the unplaced one (1 May) first.
		expect(rows.map((r) => r.id)).toEqual([ids[1], ids[0], ids[2]]);
		for (const p of patched) {
			const r = rows.find((x) => x.id === p.id)!;
			expect(Object.keys(r).sort()).toEqual(Object.keys(p).sort());
			expect(r).toEqual(p);
		}
		const placed = rows.find((r) => r.id === ids[0])!;
		// Decimals come as JSON numbers, not strings (the PATCH worked expected yield out again).
		expect(typeof placed.expectedYield).toBe('number');
		expect(placed).toMatchObject({
			startFt: 12.5,
			lengthFt: 30,
			inRowSpacingIn: 2.5,
			fieldDate: '2034-05-02',
			notes: notes[0]
		});
		expect(typeof placed.bed).toBe('string');
		expect(rows.find((r) => r.id === ids[1])).toMatchObject({ bedId: null, bed: null, block: null, notes: notes[1] });
		expect(rows.find((r) => r.id === ids[2])).toMatchObject({ status: 'sown', actualFieldDate: '2034-05-04' });
		expect(String(placed.updatedAt)).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.000Z$/);
		expect(Math.abs(Date.parse(String(placed.updatedAt)) - Date.now())).toBeLessThan(5 * 60_000);
	});
});
