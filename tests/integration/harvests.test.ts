// The harvest log's routes and form actions: who may read and write, bad input named by field
// with nothing written, the audit trail of every change, and the planting's actual dates.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, html, signedIn } from '../helpers/http';
import { closeTestDb, count, testDb } from '../helpers/db';
import { demo } from '../helpers/env';
import { addPlanting, addSeason, harvestFarm, type HarvestFarm } from './harvest-fixture';

let crew: Client;
let share: Client;
let own: HarvestFarm;
let seasonId: number;
let plantingId: number;
let other: number;
let demoSeason: number;
let demoPlanting: { id: number; unit: string; restore: Record<string, unknown> };

beforeAll(async () => {
	crew = await signedIn(demo.crew, demo.password);
	share = await signedIn(demo.share, demo.password);
	own = await harvestFarm('harvest-api');
	seasonId = await addSeason(own.farmId, 2026);
	plantingId = await addPlanting(own.farmId, seasonId, {
		varietyId: own.carrot.varietyId,
		bedId: own.bedIds[0],
		lengthFt: 10,
		fieldDate: '2026-08-03',
		firstHarvest: '2026-10-02',
		lastHarvest: '2026-10-15',
		expectedYield: 20
	});
	other = await addPlanting(own.farmId, seasonId, {
		varietyId: own.basil.varietyId,
		bedId: own.bedIds[1],
		lengthFt: 10,
		fieldDate: '2026-06-01',
		firstHarvest: '2026-07-11',
		lastHarvest: '2026-08-07',
		expectedYield: 10
	});
	// The demo farm's 2026 season, for the crew lead and share manager.
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	const farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	demoSeason = (await testDb()('seasons').where({ farm_id: farmId, year: 2026 }).first('id')).id;
	const p = await testDb()('plantings as p')
		.join('varieties as v', 'v.id', 'p.variety_id')
		.join('crops as c', 'c.id', 'v.crop_id')
		.where('p.season_id', demoSeason)
		.andWhere('p.field_date', '<', '2026-11-01')
		.whereNot('p.status', 'failed')
		.orderBy('p.id')
		.first('p.*', 'c.harvest_unit');
	demoPlanting = {
		id: p.id,
		unit: p.harvest_unit,
		restore: {
			status: p.status,
			actual_first_harvest: p.actual_first_harvest,
			actual_last_harvest: p.actual_last_harvest,
			version: p.version
		}
	};
});

afterAll(async () => {
	// Leave the demo planting as the seed made it; this file's records were deleted by the tests.
	await testDb()('plantings').where({ id: demoPlanting.id }).update(demoPlanting.restore);
	await closeTestDb();
});

const api = (s: number) => `/api/seasons/${s}/harvests`;
const good = () => ({ plantingId, harvestedOn: '2026-10-05', quantity: 6.5, unit: 'lb' });

describe('who may log', () => {
	it('no session: 401 on read and write', async () => {
		expect((await new Client().get(api(seasonId))).status).toBe(401);
		expect((await new Client().json(api(seasonId), 'POST', good())).status).toBe(401);
	});
	it('share manager reads (200) but may not write (403), and nothing is written', async () => {
		expect((await share.get(api(demoSeason))).status).toBe(200);
		const before = await count('harvest_records');
		const res = await share.json(api(demoSeason), 'POST', {
			plantingId: demoPlanting.id,
			harvestedOn: '2026-11-30',
			quantity: 1,
			unit: demoPlanting.unit
		});
		expect(res.status).toBe(403);
		expect(await count('harvest_records')).toBe(before);
	});
	it("another farm's season is 404", async () => {
		expect((await crew.json(api(seasonId), 'POST', good())).status).toBe(404);
		expect((await crew.get(api(seasonId))).status).toBe(404);
	});
});

describe('bad input names the field, and writes nothing', () => {
	const cases: [Record<string, unknown>, string, RegExp][] = [
		[{ quantity: -2 }, 'quantity', /more than 0/],
		[{ quantity: 0 }, 'quantity', /more than 0/],
		// 5,000 lb is the most one record may hold (schemas/harvest.ts maxPerRecord).
		[{ quantity: 5000.5 }, 'quantity', /at most 5,000 lb/],
		[{ quantity: 'lots' }, 'quantity', /number/],
		[{ unit: 'bunch' }, 'unit', /Carrot is harvested in lb, not bunch/],
		[{ unit: 'crate' }, 'unit', /one of lb/],
		[{ harvestedOn: '2026-08-02' }, 'harvestedOn', /before this planting went into the field \(2026-08-03\)/],
		[{ harvestedOn: '2026-02-30' }, 'harvestedOn', /real calendar date/],
		[{ plantingId: 99999999 }, 'plantingId', /planting of this season/],
		[{ harvestedBy: 'nobody' }, 'harvestedBy', /member of the farm/],
		[{ colour: 'red' }, '_form', /./]
	];
	for (const [change, field, message] of cases) {
		it(`${JSON.stringify(change)} -> 400 naming ${field}`, async () => {
			const before = await count('harvest_records', { planting_id: plantingId });
			const res = await own.owner.json(api(seasonId), 'POST', { ...good(), ...change });
			expect(res.status).toBe(400);
			const out = await res.json();
			expect(out.errors[field]).toMatch(message);
			expect(await count('harvest_records', { planting_id: plantingId })).toBe(before);
		});
	}
	it("basil's unit is bunch: a record in lb is refused naming the unit", async () => {
		const res = await own.owner.json(api(seasonId), 'POST', {
			plantingId: other,
			harvestedOn: '2026-07-15',
			quantity: 3,
			unit: 'lb'
		});
		expect(res.status).toBe(400);
		expect((await res.json()).errors.unit).toBe('Basil is harvested in bunch, not lb.');
	});
	it('a batch with one bad row saves none and names the row', async () => {
		const before = await count('harvest_records');
		const res = await own.owner.json(api(seasonId), 'POST', { records: [good(), { ...good(), quantity: 99999 }] });
		expect(res.status).toBe(400);
		expect(Object.keys((await res.json()).errors)).toEqual(['records.1.quantity']);
		expect(await count('harvest_records')).toBe(before);
	});
});

describe('logging, editing and deleting', () => {
	let id: number;
	it('the owner logs a record (201); the planting gets its first harvest and status', async () => {
		const res = await own.owner.json(api(seasonId), 'POST', { ...good(), notes: 'first pull' });
		expect(res.status).toBe(201);
		id = (await res.json()).harvest.id;
		const p = await testDb()('plantings').where({ id: plantingId }).first();
		expect(p.actual_first_harvest).toBe('2026-10-05');
		expect(p.status).toBe('harvesting');
		const audit = await testDb()('harvest_audit').where({ harvest_id: id });
		expect(audit.map((a) => a.action)).toEqual(['create']);
		expect(JSON.parse(audit[0].new_values)).toMatchObject({
			quantity: 6.5,
			unit: 'lb',
			harvestedOn: '2026-10-05',
			harvestedBy: own.userId
		});
	});
	it('an earlier record moves the first harvest back', async () => {
		const res = await own.owner.json(api(seasonId), 'POST', { ...good(), harvestedOn: '2026-10-03', quantity: 2 });
		expect(res.status).toBe(201);
		expect((await testDb()('plantings').where({ id: plantingId }).first()).actual_first_harvest).toBe('2026-10-03');
	});
	it('PATCH keeps old and new values in the audit trail', async () => {
		const res = await own.owner.json(`${api(seasonId)}/${id}`, 'PATCH', {
			harvestedOn: '2026-10-06',
			quantity: 7.25,
			unit: 'lb',
			notes: 'reweighed'
		});
		expect(res.status).toBe(200);
		expect((await res.json()).harvest.quantity).toBe(7.25);
		const row = await testDb()('harvest_audit').where({ harvest_id: id, action: 'update' }).first();
		expect(JSON.parse(row.old_values)).toMatchObject({ quantity: 6.5, harvestedOn: '2026-10-05', notes: 'first pull' });
		expect(JSON.parse(row.new_values)).toMatchObject({ quantity: 7.25, harvestedOn: '2026-10-06', notes: 'reweighed' });
		expect(row.changed_by).toBe(own.userId);
	});
	it('PATCH with a bad unit is 400 naming it; an unknown id is 404', async () => {
		const bad = await own.owner.json(`${api(seasonId)}/${id}`, 'PATCH', {
			harvestedOn: '2026-10-06',
			quantity: 7,
			unit: 'head'
		});
		expect(bad.status).toBe(400);
		expect((await bad.json()).errors.unit).toMatch(/harvested in lb/);
		expect(
			(
				await own.owner.json(`${api(seasonId)}/99999999`, 'PATCH', {
					harvestedOn: '2026-10-06',
					quantity: 7,
					unit: 'lb'
				})
			).status
		).toBe(404);
		expect((await own.owner.get(`${api(seasonId)}/${id}`)).status).toBe(200);
	});
	it('DELETE is 204, keeps the record in the trail, then 404', async () => {
		expect(
			(
				await own.owner.request(`${api(seasonId)}/${id}`, {
					method: 'DELETE',
					headers: { origin: process.env.FC_BASE_URL! }
				})
			).status
		).toBe(204);
		expect(await count('harvest_records', { id })).toBe(0);
		const row = await testDb()('harvest_audit').where({ harvest_id: id, action: 'delete' }).first();
		expect(JSON.parse(row.old_values)).toMatchObject({ quantity: 7.25 });
		expect(
			(
				await own.owner.request(`${api(seasonId)}/${id}`, {
					method: 'DELETE',
					headers: { origin: process.env.FC_BASE_URL! }
				})
			).status
		).toBe(404);
		const audit = await (await own.owner.get(`${api(seasonId)}/audit`)).json();
		expect(
			audit.audit.filter((a: { harvestId: number }) => a.harvestId === id).map((a: { action: string }) => a.action)
		).toEqual(['delete', 'update', 'create']);
	});
	it('a batch marked finished closes the planting: last harvest and status', async () => {
		const res = await own.owner.json(api(seasonId), 'POST', {
			records: [
				{ ...good(), harvestedOn: '2026-10-10', quantity: 3 },
				{ ...good(), harvestedOn: '2026-10-14', quantity: 4, finished: true }
			]
		});
		expect(res.status).toBe(201);
		expect((await res.json()).harvests).toHaveLength(2);
		const p = await testDb()('plantings').where({ id: plantingId }).first();
		expect(p.status).toBe('finished');
		expect(p.actual_last_harvest).toBe('2026-10-14');
		expect(p.actual_first_harvest).toBe('2026-10-03');
	});
});

describe('the page and its form actions', () => {
	const page = () => `/seasons/${demoSeason}/harvests`;
	it('everyone reads the page; the share manager sees no forms', async () => {
		expect((await crew.get(page())).status).toBe(200);
		const res = await share.get(page());
		expect(res.status).toBe(200);
		const body = await html(res);
		expect(body).toContain('Harvest log');
		expect(body).not.toContain('Log harvest</button>');
	});
	it('share manager posting the form gets 403', async () => {
		const res = await share.postForm(`${page()}?/log`, {
			plantingId: demoPlanting.id,
			harvestedOn: '2026-11-30',
			quantity: 1,
			unit: demoPlanting.unit
		});
		expect(res.status).toBe(403);
	});
	it('crew lead logs by form (303) and a bad quantity is shown at its field (400)', async () => {
		const ok = await crew.postForm(`${page()}?/log`, {
			plantingId: demoPlanting.id,
			harvestedOn: '2026-11-30',
			quantity: '2.5',
			unit: demoPlanting.unit,
			notes: ''
		});
		expect(ok.status).toBe(303);
		expect(await count('harvest_records', { planting_id: demoPlanting.id, harvested_on: '2026-11-30' })).toBe(1);
		const bad = await crew.postForm(`${page()}?/log`, {
			plantingId: demoPlanting.id,
			harvestedOn: '2026-11-30',
			quantity: '-1',
			unit: demoPlanting.unit
		});
		expect(bad.status).toBe(400);
		expect(await html(bad)).toContain('Quantity must be more than 0.');
	});
	it('crew lead saves a sheet (303); a bad row is named by its row, nothing saved', async () => {
		const before = await count('harvest_records', { planting_id: demoPlanting.id });
		const bad = await crew.postForm(`${page()}?/sheet`, {
			harvestedOn: '2026-11-29',
			'rows.0.plantingId': demoPlanting.id,
			'rows.0.quantity': '1',
			'rows.0.unit': demoPlanting.unit,
			'rows.1.plantingId': '',
			'rows.1.quantity': '',
			'rows.2.plantingId': demoPlanting.id,
			'rows.2.quantity': '1',
			'rows.2.unit': 'crate'
		});
		expect(bad.status).toBe(400);
		expect(await html(bad)).toContain('Unit must be one of lb, bunch, head or each.');
		expect(await count('harvest_records', { planting_id: demoPlanting.id })).toBe(before);
		const ok = await crew.postForm(`${page()}?/sheet`, {
			harvestedOn: '2026-11-29',
			'rows.0.plantingId': demoPlanting.id,
			'rows.0.quantity': '1',
			'rows.0.unit': demoPlanting.unit,
			'rows.1.plantingId': demoPlanting.id,
			'rows.1.quantity': '2',
			'rows.1.unit': demoPlanting.unit
		});
		expect(ok.status).toBe(303);
		expect(await count('harvest_records', { planting_id: demoPlanting.id })).toBe(before + 2);
	});
	it('crew lead edits and deletes by form; each leaves an audit row', async () => {
		const rec = await testDb()('harvest_records')
			.where({ planting_id: demoPlanting.id, harvested_on: '2026-11-30' })
			.first('id');
		const edit = await crew.postForm(`${page()}?/edit`, {
			id: rec.id,
			harvestedOn: '2026-11-30',
			quantity: '3',
			unit: demoPlanting.unit
		});
		expect(edit.status).toBe(303);
		const del = await crew.postForm(`${page()}?/delete`, { id: rec.id });
		expect(del.status).toBe(303);
		expect((await testDb()('harvest_audit').where({ harvest_id: rec.id }).orderBy('id')).map((a) => a.action)).toEqual([
			'create',
			'update',
			'delete'
		]);
		expect((await crew.postForm(`${page()}?/delete`, { id: rec.id })).status).toBe(404);
		for (const r of await testDb()('harvest_records').where({
			planting_id: demoPlanting.id,
			harvested_on: '2026-11-29'
		})) {
			expect(
				(
					await crew.request(`${api(demoSeason)}/${r.id}`, {
						method: 'DELETE',
						headers: { origin: process.env.FC_BASE_URL! }
					})
				).status
			).toBe(204);
		}
	});
});
