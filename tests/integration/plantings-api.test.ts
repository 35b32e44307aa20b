// The planting grid's JSON routes against the real MariaDB: list, create (one row or a paste),
// edit with a version (409 when stale), remove, the roles, and the per-user grid settings.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, signedIn } from '../helpers/http';
import { closeTestDb, testDb, uniqueEmail } from '../helpers/db';
import { demo } from '../helpers/env';
import { confirmedSignUp } from '../helpers/signup';

let seasonId: number;
let farmId: number;
let varietyId: number;
let bedId: number;
let owner: Client;
let crew: Client;
let share: Client;
const made: number[] = [];

beforeAll(async () => {
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	seasonId = (await testDb()('seasons').where({ farm_id: farmId, year: 2027 }).first('id')).id;
	// A direct-sown variety with no degree-day figure, so the dates below are calendar arithmetic.
	const v = await testDb()('varieties')
		.where({ farm_id: farmId, method: 'direct' })
		.whereNull('gdd_to_maturity')
		.first();
	varietyId = v.id;
	bedId = (await testDb()('beds').where({ farm_id: farmId }).first('id')).id;
	[owner, crew, share] = await Promise.all([
		signedIn(demo.owner, demo.password),
		signedIn(demo.crew, demo.password),
		signedIn(demo.share, demo.password)
	]);
});
afterAll(async () => {
	if (made.length) await testDb()('plantings').whereIn('id', made).delete();
	await closeTestDb();
});

const list = () => `/api/seasons/${seasonId}/plantings`;
const one = (id: number) => `/api/plantings/${id}`;

async function createOne(
	over: Record<string, unknown> = {}
): Promise<{ id: number; version: number; [k: string]: unknown }> {
	const res = await owner.json(list(), 'POST', {
		plantings: [{ varietyId, bedId, startFt: 0, lengthFt: 20, fieldDate: '2027-06-07', ...over }]
	});
	expect(res.status).toBe(201);
	const p = (await res.json()).plantings[0];
	made.push(p.id);
	return p;
}

describe('GET /api/seasons/[id]/plantings', () => {
	it("answers 401 without a session and 404 for a season that is not this farm's", async () => {
		expect((await new Client().get(list())).status).toBe(401);
		expect((await owner.get('/api/seasons/999999/plantings')).status).toBe(404);
	});
	it('keeps { season, plantings } and adds what the grid recalculates with', async () => {
		const body = await (await share.get(list())).json();
		expect(body.season.id).toBe(seasonId);
		expect(Array.isArray(body.plantings)).toBe(true);
		expect(body.varieties.length).toBeGreaterThan(0);
		expect(body.beds.length).toBeGreaterThan(0);
		expect(body.farm.lastSpringFrost).toMatch(/^\d{4}-\d{2}-\d{2}$/);
		expect(body.role).toBe('share_manager');
		expect(body.editable).toEqual([]);
	});
});

describe('POST /api/seasons/[id]/plantings', () => {
	it('creates a row and works out its dates, yield and seed on the server', async () => {
		const v = await testDb()('varieties').where({ id: varietyId }).first();
		const p = await createOne();
		// First harvest = field date + days to maturity (June at the demo latitude is long-day: no allowance).
		const fh = new Date(Date.UTC(2027, 5, 7 + v.days_to_maturity)).toISOString().slice(0, 10);
		expect(p.firstHarvest).toBe(fh);
		// Expected yield = 20 ft × yield per bed-foot, to the cent.
		expect(p.expectedYield).toBeCloseTo(20 * Number(v.yield_per_bed_foot), 2);
		expect(p.status).toBe('planned');
		expect(p.version).toBe(1);
	});
	it('names the row and column of each bad cell in a paste, and writes none of it', async () => {
		const before = (await testDb()('plantings').where({ season_id: seasonId }).count({ n: '*' }))[0].n;
		const res = await owner.json(list(), 'POST', {
			plantings: [
				{ varietyId, lengthFt: 10, fieldDate: '2027-05-03' },
				{ varietyId, lengthFt: 'lots', fieldDate: '2027-05-03' },
				{ varietyId, lengthFt: 10, fieldDate: '2027-02-30' }
			]
		});
		expect(res.status).toBe(400);
		const body = await res.json();
		expect(Object.keys(body.errors).sort()).toEqual(['plantings.1.lengthFt', 'plantings.2.fieldDate']);
		expect((await testDb()('plantings').where({ season_id: seasonId }).count({ n: '*' }))[0].n).toBe(before);
	});
	it("refuses another farm's bed as a 400 on bedId", async () => {
		const res = await owner.json(list(), 'POST', {
			plantings: [{ varietyId, bedId: 999999, lengthFt: 10, fieldDate: '2027-05-03' }]
		});
		expect(res.status).toBe(400);
		expect((await res.json()).errors).toHaveProperty(['plantings.0.bedId']);
	});
	it("is the owner's: a crew lead gets 403", async () => {
		expect(
			(await crew.json(list(), 'POST', { plantings: [{ varietyId, lengthFt: 10, fieldDate: '2027-05-03' }] })).status
		).toBe(403);
	});
});

describe('PATCH /api/plantings/[id]', () => {
	it('saves an edit on the current version, recomputes the derived columns and bumps the version', async () => {
		const p = await createOne();
		const res = await owner.json(one(p.id), 'PATCH', { version: 1, lengthFt: 40 });
		expect(res.status).toBe(200);
		const q = (await res.json()).planting;
		expect(q.version).toBe(2);
		expect(q.expectedYield).toBeCloseTo((p.expectedYield as number) * 2, 2);
		expect(typeof q.updatedBy).toBe('string');
	});
	it('answers 409 on a stale version with the current row and who changed it', async () => {
		const p = await createOne();
		expect((await owner.json(one(p.id), 'PATCH', { version: 1, notes: 'first' })).status).toBe(200);
		const res = await crew.json(one(p.id), 'PATCH', { version: 1, notes: 'second' });
		expect(res.status).toBe(409);
		const body = await res.json();
		expect(body.current.version).toBe(2);
		expect(body.current.notes).toBe('first');
		expect(typeof body.changedBy).toBe('string');
		expect((await testDb()('plantings').where({ id: p.id }).first('notes')).notes).toBe('first');
	});
	it('lets a crew lead set status, actual dates and notes, but not bed-feet or crop', async () => {
		const p = await createOne();
		const ok = await crew.json(one(p.id), 'PATCH', {
			version: 1,
			status: 'sown',
			actualFieldDate: '2026-11-30',
			notes: 'sown early'
		});
		expect(ok.status).toBe(200);
		const no = await crew.json(one(p.id), 'PATCH', { version: 2, lengthFt: 5, varietyId });
		expect(no.status).toBe(403);
		expect((await no.json()).fields.sort()).toEqual(['lengthFt', 'varietyId']);
	});
	it('is read-only for the share manager (403)', async () => {
		const p = await createOne();
		expect((await share.json(one(p.id), 'PATCH', { version: 1, notes: 'x' })).status).toBe(403);
	});
	it('answers 400 naming the field, and 404 for a row of no farm of yours', async () => {
		const p = await createOne();
		const bad = await owner.json(one(p.id), 'PATCH', { version: 1, rows: 0 });
		expect(bad.status).toBe(400);
		expect((await bad.json()).errors).toHaveProperty('rows');
		const noVersion = await owner.json(one(p.id), 'PATCH', { notes: 'x' });
		expect((await noVersion.json()).errors).toHaveProperty('version');
		expect((await owner.json(one(999999999), 'PATCH', { version: 1, notes: 'x' })).status).toBe(404);
		expect((await new Client().json(one(p.id), 'PATCH', { version: 1 })).status).toBe(401);
	});
	it("answers 404 to another farm's owner", async () => {
		const p = await createOne();
		const other = new Client();
		await confirmedSignUp(other, {
			name: 'Grid Tenant',
			email: uniqueEmail('grid'),
			password: 'long-enough-pass',
			farmName: 'Grid Farm (invented)',
			latitude: '40',
			lastSpringFrost: '2027-04-20',
			firstFallFrost: '2027-10-20'
		});
		expect((await other.json(one(p.id), 'PATCH', { version: 1, notes: 'x' })).status).toBe(404);
		expect((await other.json(one(p.id), 'DELETE')).status).toBe(404);
	});
});

describe('DELETE /api/plantings/[id]', () => {
	it('removes the row (204) for the owner only', async () => {
		const p = await createOne();
		expect((await crew.json(one(p.id), 'DELETE')).status).toBe(403);
		expect((await owner.json(one(p.id), 'DELETE')).status).toBe(204);
		expect(await testDb()('plantings').where({ id: p.id }).first()).toBeUndefined();
		expect((await owner.json(one(p.id), 'DELETE')).status).toBe(404);
	});
});

describe('/api/me/prefs/grid', () => {
	it("keeps each user's column widths and hidden columns, and refuses a bad width", async () => {
		expect((await new Client().get('/api/me/prefs/grid')).status).toBe(401);
		expect((await crew.json('/api/me/prefs/grid', 'PUT', { widths: { notes: 320 }, hidden: ['trays'] })).status).toBe(
			204
		);
		expect(await (await crew.get('/api/me/prefs/grid')).json()).toEqual({ widths: { notes: 320 }, hidden: ['trays'] });
		expect(await (await share.get('/api/me/prefs/grid')).json()).toEqual({ widths: {}, hidden: [] });
		const bad = await crew.json('/api/me/prefs/grid', 'PUT', { widths: { notes: 5 }, hidden: [] });
		expect(bad.status).toBe(400);
		expect((await bad.json()).errors).toHaveProperty(['widths.notes']);
	});
});
