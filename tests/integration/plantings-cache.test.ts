// GET /api/seasons/{id}/plantings keeps its answer in memory until the season's data changes
// (src/lib/server/plantings-cache.ts). Here: a write by each path the API and the screens offer,
// and writes straight in the database, each followed by a GET that must show it; the ETag /
// If-None-Match exchange; the compressed bytes; and that a role or another farm never gets an
// answer kept for someone else.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { brotliDecompressSync, gunzipSync } from 'node:zlib';
import { Client, signedIn } from '../helpers/http';
import { closeTestDb, testDb, uniqueEmail } from '../helpers/db';
import { demo } from '../helpers/env';
import { download, loadWorkbook, upload } from '../helpers/transfer';
import { addPlanting, addSeason, harvestFarm, type HarvestFarm } from './harvest-fixture';

interface Row {
	id: number;
	lengthFt: number;
	status: string;
	notes: string | null;
	bed: string | null;
	variety: string;
	crop: string;
	updatedBy: string | null;
	actualFirstHarvest: string | null;
	version: number;
}

let own: HarvestFarm;
let seasonId: number;
let first: number;
const url = () => `/api/seasons/${seasonId}/plantings`;

async function rows(client: Client = own.owner): Promise<Row[]> {
	const res = await client.get(url());
	expect(res.status).toBe(200);
	return (await res.json()).plantings as Row[];
}
const row = async (id: number) => (await rows()).find((r) => r.id === id);

beforeAll(async () => {
	own = await harvestFarm('answer-cache');
	seasonId = await addSeason(own.farmId, 2026);
	first = await addPlanting(own.farmId, seasonId, {
		varietyId: own.carrot.varietyId,
		bedId: own.bedIds[0],
		lengthFt: 10,
		fieldDate: '2026-08-03',
		firstHarvest: '2026-10-02',
		lastHarvest: '2026-10-15',
		expectedYield: 20
	});
	await rows(); // the answer is kept from here on
});
afterAll(closeTestDb);

describe('the kept answer', () => {
	it('answers 304 to its ETag, and the same JSON compressed as brotli or gzip', async () => {
		const a = await own.owner.get(url());
		const etag = a.headers.get('etag');
		expect(etag).toMatch(/^W\/".+"$/);
		// A farm's data is never stored by the browser (hooks.server.ts), kept answer or not.
		expect(a.headers.get('cache-control')).toBe('no-store');
		const text = await a.text();
		const again = await own.owner.get(url(), { headers: { 'if-none-match': etag! } });
		expect(again.status).toBe(304);
		expect(await again.text()).toBe('');
		// Node's fetch decompresses by itself; the raw bytes are read through node:zlib instead.
		for (const [encoding, unzip] of [
			['br', brotliDecompressSync],
			['gzip', gunzipSync]
		] as const) {
			const res = await own.owner.request(url(), { headers: { 'accept-encoding': encoding } });
			expect(res.headers.get('content-encoding')).toBe(encoding);
			expect(res.headers.get('vary')).toMatch(/Accept-Encoding/i);
			const bytes = Buffer.from(await res.arrayBuffer());
			// fetch has already undone the encoding it was told of; either way the text is the same.
			const body = bytes.toString('utf8').startsWith('{') ? bytes : unzip(bytes);
			expect(body.toString('utf8')).toBe(text);
		}
	});

	it('a stale ETag gets the whole answer again', async () => {
		const res = await own.owner.get(url(), { headers: { 'if-none-match': 'W/"not-this-one"' } });
		expect(res.status).toBe(200);
		expect((await res.json()).plantings.length).toBeGreaterThan(0);
	});
});

describe('every write shows in the next GET', () => {
	it('a new row through POST, an edit through PATCH, a removal through DELETE', async () => {
		const post = await own.owner.json(url(), 'POST', {
			plantings: [
				{ varietyId: own.basil.varietyId, bedId: own.bedIds[1], startFt: 0, lengthFt: 20, fieldDate: '2026-06-01' }
			]
		});
		expect(post.status).toBe(201);
		const made = (await post.json()).plantings[0] as Row;
		expect((await row(made.id))?.lengthFt).toBe(20);

		const patch = await own.owner.json(`/api/plantings/${made.id}`, 'PATCH', { version: made.version, lengthFt: 30 });
		expect(patch.status).toBe(200);
		expect((await row(made.id))?.lengthFt).toBe(30);

		const del = await own.owner.json(`/api/plantings/${made.id}`, 'DELETE');
		expect(del.status).toBeLessThan(300);
		expect(await row(made.id)).toBeUndefined();
	});

	it('a harvest logged: the planting starts harvesting', async () => {
		expect((await row(first))?.status).toBe('planned');
		const res = await own.owner.json(`/api/seasons/${seasonId}/harvests`, 'POST', {
			plantingId: first,
			harvestedOn: '2026-10-03',
			quantity: 4,
			unit: 'lb'
		});
		expect(res.status).toBe(201);
		const after = await row(first);
		expect(after?.status).toBe('harvesting');
		expect(after?.actualFirstHarvest).toBe('2026-10-03');
	});

	it('a bed renamed on the settings screen: the rows on it show the new name', async () => {
		const bed = await testDb()('beds').where({ id: own.bedIds[0] }).first();
		const res = await own.owner.postForm('/settings?/saveBed', {
			id: bed.id,
			name: 'N1 renamed',
			blockId: bed.block_id,
			lengthFt: '100',
			widthIn: String(bed.width_in ?? 30),
			position: String(bed.position)
		});
		expect(res.status).toBe(303);
		expect((await row(first))?.bed).toBe('N1 renamed');
	});

	it('a plan applied takes the planned rows off, and its undo brings them back', async () => {
		const planned = await addPlanting(own.farmId, seasonId, {
			varietyId: own.basil.varietyId,
			bedId: own.bedIds[2],
			lengthFt: 10,
			fieldDate: '2026-05-20',
			firstHarvest: '2026-07-01',
			lastHarvest: '2026-07-20',
			expectedYield: 5
		});
		expect(await row(planned)).toBeDefined();
		// This farm asks for nothing (no demand): the plan has no rows, so the planned one goes.
		const apply = await own.owner.json(`/api/seasons/${seasonId}/plan/apply`, 'POST', {});
		expect(apply.status).toBe(200);
		const now = await rows();
		expect(now.find((r) => r.id === planned)).toBeUndefined();
		expect(now.find((r) => r.id === first)).toBeDefined(); // harvesting: kept
		const undo = await own.owner.json(`/api/seasons/${seasonId}/plan/undo`, 'POST', {});
		expect(undo.status).toBe(200);
		const back = await rows();
		expect(back.length).toBe(now.length + 1);
	});

	it('a workbook imported over the season: the changed notes show', async () => {
		const wb = await loadWorkbook((await download(own.owner, seasonId)).bytes);
		const sheet = wb.getWorksheet('Plantings')!;
		const notes = (sheet.getRow(1).values as unknown[]).findIndex((v) => v === 'Notes');
		expect(notes).toBeGreaterThan(0);
		for (let r = 2; r <= sheet.rowCount; r++)
			if (sheet.getRow(r).getCell(1).value) sheet.getRow(r).getCell(notes).value = 'from the workbook';
		const file = Buffer.from(await wb.xlsx.writeBuffer());
		const preview = await upload(own.owner, 'plan.xlsx', file, { seasonId: String(seasonId) });
		const body = await preview.json();
		expect(preview.status, JSON.stringify(body)).toBe(200);
		const apply = await own.owner.json('/api/import/apply', 'POST', { token: body.preview.token });
		expect(apply.status, await apply.clone().text()).toBe(200);
		const now = await rows();
		expect(now.length).toBeGreaterThan(0);
		expect(now.map((r) => r.notes)).toEqual(now.map(() => 'from the workbook'));
	});

	it('a season copied into the next year: its list is the copy', async () => {
		expect((await own.owner.json(`/api/seasons/${seasonId}/copy`, 'POST', {})).status).toBe(201);
		const next = (await testDb()('seasons').where({ farm_id: own.farmId, year: 2027 }).first('id')).id;
		const copied = await testDb()('plantings').where({ season_id: next }).pluck('id');
		const res = await own.owner.get(`/api/seasons/${next}/plantings`);
		expect(res.status).toBe(200);
		expect(((await res.json()).plantings as Row[]).map((r) => r.id).sort()).toEqual(copied.sort());
		expect(copied.length).toBeGreaterThan(0);
	});

	it('writes straight in the database, by any tool: update, insert, names, cascades', async () => {
		const db = testDb();
		await db('plantings').where({ id: first }).update({ notes: 'written at the SQL prompt' });
		expect((await row(first))?.notes).toBe('written at the SQL prompt');

		await db('varieties').where({ id: own.carrot.varietyId }).update({ name: 'Renamed Nantes' });
		expect((await row(first))?.variety).toBe('Renamed Nantes');
		await db('crops').where({ id: own.carrot.cropId }).update({ name: 'Renamed carrot' });
		expect((await row(first))?.crop).toBe('Renamed carrot');

		await db('users').where({ id: own.userId }).update({ name: 'Renamed Owner' });
		await db('plantings').where({ id: first }).update({ updated_by: own.userId });
		expect((await row(first))?.updatedBy).toBe('Renamed Owner');
		await db('users').where({ id: own.userId }).update({ name: 'Owner Again' });
		expect((await row(first))?.updatedBy).toBe('Owner Again');

		// A user who goes: the foreign key clears the name, the next GET shows it cleared.
		const gone = uniqueEmail('answer-cache-gone');
		await db('users').insert({ id: `gone-${Date.now()}`, email: gone, name: 'Leaving Soon', password_hash: 'x' });
		const goneId = (await db('users').where({ email: gone }).first('id')).id;
		await db('plantings').where({ id: first }).update({ updated_by: goneId });
		expect((await row(first))?.updatedBy).toBe('Leaving Soon');
		await db('users').where({ id: goneId }).delete();
		expect((await row(first))?.updatedBy).toBe(null);

		// A bed deleted with its plantings by the foreign key's cascade (which fires no trigger).
		const spare = await addPlanting(own.farmId, seasonId, {
			varietyId: own.carrot.varietyId,
			bedId: own.bedIds[2],
			lengthFt: 5,
			fieldDate: '2026-04-01',
			firstHarvest: '2026-06-01',
			lastHarvest: '2026-06-10',
			expectedYield: 1
		});
		expect(await row(spare)).toBeDefined();
		await db('beds').where({ id: own.bedIds[2] }).delete();
		expect(await row(spare)).toBeUndefined();
	});
});

describe('who gets which answer', () => {
	it('each role its own: the crew lead of the demo farm is told crew, after its owner asked', async () => {
		const u = await testDb()('users').where({ email: demo.owner }).first('id');
		const farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
		const demoSeason = (await testDb()('seasons').where({ farm_id: farmId, year: 2027 }).first('id')).id;
		const path = `/api/seasons/${demoSeason}/plantings`;
		const owner = await signedIn(demo.owner, demo.password);
		const crew = await signedIn(demo.crew, demo.password);
		const a = await (await owner.get(path)).json();
		const b = await (await crew.get(path)).json();
		expect(a.role).toBe('owner');
		expect(b.role).not.toBe('owner');
		expect(b.editable).not.toEqual(a.editable);
		// Another farm's owner, with this farm's answer kept: still 404, and no ETag trick gets past.
		const res = await own.owner.get(path, { headers: { 'if-none-match': '*' } });
		expect(res.status).toBe(404);
	});
});
