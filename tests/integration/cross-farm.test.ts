// One farm's rows can never land in another farm's season, bed or library: the import page
// action checks the form's seasonId like the JSON route, and the schema refuses any row whose
// farm_id differs from its parent's (composite keys (farm_id, parent_id)).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, count, testDb } from '../helpers/db';
import { baseUrl, demo } from '../helpers/env';
import { html } from '../helpers/http';
import { signUpFarm, writeHandPlan, type NewFarm } from '../helpers/transfer';

afterAll(closeTestDb);

let demoFarmId: number;
let demoSeasonId: number;
let other: NewFarm;

beforeAll(async () => {
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	demoFarmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	demoSeasonId = (await testDb()('seasons').where({ farm_id: demoFarmId, year: 2027 }).first('id')).id;
	other = await signUpFarm('cross-farm');
	await writeHandPlan(other.farmId);
});

const plan =
	'Crop,Variety,Bed,Start (ft),Length (ft),Rows,In-row spacing (in),Method,Field date,First harvest (date),Last harvest (date)\n' +
	'Carrot,Test Amber,E1,0,50,4,1,direct,2027-04-10,2027-06-20,2027-07-10\n';

describe('the import page action', () => {
	it("refuses another farm's season with 404 naming seasonId, and writes nothing", async () => {
		const before = await count('plantings', { season_id: demoSeasonId });
		const form = new FormData();
		form.set('file', new Blob([plan]), 'plan.csv');
		form.set('sheet', 'Plantings');
		form.set('seasonId', String(demoSeasonId));
		const res = await other.client.request('/import?/import', {
			method: 'POST',
			body: form,
			headers: { origin: baseUrl(), accept: 'text/html' }
		});
		expect(res.status).toBe(404);
		expect(await html(res)).toContain('seasonId');
		expect(await count('plantings', { season_id: demoSeasonId })).toBe(before);
		const stray = await testDb()('plantings as p')
			.join('seasons as s', 's.id', 'p.season_id')
			.whereRaw('s.farm_id <> p.farm_id')
			.count({ n: '*' });
		expect(Number(stray[0].n)).toBe(0);
	});

	it('still imports into a season of its own farm', async () => {
		const [own] = await testDb()('seasons').insert({
			farm_id: other.farmId,
			year: 2029,
			name: 'Own season',
			starts_on: '2029-01-01',
			ends_on: '2029-12-31'
		});
		const form = new FormData();
		form.set('file', new Blob([plan.replaceAll('2027', '2029')]), 'plan.csv');
		form.set('sheet', 'Plantings');
		form.set('seasonId', String(own));
		const res = await other.client.request('/import?/import', {
			method: 'POST',
			body: form,
			headers: { origin: baseUrl(), accept: 'text/html' }
		});
		expect(res.status).toBe(303);
		expect(await count('plantings', { season_id: own, farm_id: other.farmId })).toBe(1);
	});
});

describe('the schema refuses rows that point across farms', () => {
	// errno 1452: "Cannot add or update a child row: a foreign key constraint fails".
	const refused = async (write: Promise<unknown>) => {
		await expect(write).rejects.toMatchObject({ errno: 1452 });
	};

	it('plantings, harvests, demand, swaps, varieties and beds', async () => {
		const db = testDb();
		const mine = await db('varieties').where({ farm_id: other.farmId }).first('id', 'crop_id');
		const myBed = await db('beds').where({ farm_id: other.farmId }).first('id', 'block_id');
		const mySeason = await db('seasons').where({ farm_id: other.farmId }).first('id');
		const theirs = await db('varieties').where({ farm_id: demoFarmId }).first('id', 'crop_id');
		const theirBed = await db('beds').where({ farm_id: demoFarmId }).first('id', 'block_id');
		const theirPlanting = await db('plantings').where({ farm_id: demoFarmId }).first('id');
		const theirShare = await db('share_sizes').where({ farm_id: demoFarmId }).first('id');
		const planting = (over: Record<string, unknown>) => ({
			farm_id: other.farmId,
			season_id: mySeason.id,
			variety_id: mine.id,
			bed_id: myBed.id,
			start_ft: 0,
			length_ft: 10,
			rows: 2,
			in_row_spacing_in: 6,
			method: 'direct',
			field_date: '2027-05-01',
			first_harvest: '2027-07-01',
			last_harvest: '2027-07-14',
			...over
		});
		// The well-formed row goes in, so each refusal below is the farm mismatch alone.
		const [okId] = await db('plantings').insert(planting({}));
		await db('plantings').where({ id: okId }).delete();

		await refused(db('plantings').insert(planting({ season_id: demoSeasonId })));
		await refused(db('plantings').insert(planting({ variety_id: theirs.id })));
		await refused(db('plantings').insert(planting({ bed_id: theirBed.id })));
		await refused(
			db('harvest_records').insert({
				farm_id: other.farmId,
				planting_id: theirPlanting.id,
				harvested_on: '2027-07-02',
				quantity: 1,
				unit: 'lb'
			})
		);
		await refused(
			db('share_sizes').insert({
				farm_id: other.farmId,
				season_id: demoSeasonId,
				name: 'Stray',
				members: 1,
				first_week: '2027-W20',
				last_week: '2027-W30'
			})
		);
		await refused(
			db('channel_demand').insert({
				farm_id: other.farmId,
				season_id: mySeason.id,
				channel: 'market',
				crop_id: theirs.crop_id,
				week: '2027-W22',
				quantity: 1
			})
		);
		await refused(
			db('box_swaps').insert({
				farm_id: other.farmId,
				season_id: mySeason.id,
				share_size_id: theirShare.id,
				week: '2027-W22',
				from_crop_id: mine.crop_id,
				to_crop_id: mine.crop_id,
				quantity: 1
			})
		);
		await refused(
			db('varieties').insert({
				farm_id: other.farmId,
				crop_id: theirs.crop_id,
				name: 'Stray',
				method: 'direct',
				days_to_maturity: 50,
				harvest_window_days: 14,
				yield_per_bed_foot: 1,
				rows_per_bed: 2,
				in_row_spacing_in: 2,
				germination_rate: 0.8,
				seeds_per_gram: 100
			})
		);
		await refused(
			db('beds').insert({ farm_id: other.farmId, block_id: theirBed.block_id, name: 'Stray', length_ft: 10 })
		);
		// And an existing row cannot be moved across either.
		await refused(
			db('plantings').where({ farm_id: demoFarmId, id: theirPlanting.id }).update({ season_id: mySeason.id })
		);
	});

	it('removing a bed keeps its plantings, off any bed', async () => {
		const db = testDb();
		const bed = await db('beds').where({ farm_id: other.farmId, name: 'E1' }).first('id');
		const on = await db('plantings').where({ farm_id: other.farmId, bed_id: bed.id }).select('id');
		expect(on.length).toBeGreaterThan(0);
		const res = await other.client.postForm('/settings?/deleteBed', { id: bed.id });
		expect(res.status).toBeLessThan(400);
		expect(await count('beds', { id: bed.id })).toBe(0);
		const after = await db('plantings')
			.whereIn(
				'id',
				on.map((r) => r.id)
			)
			.select('bed_id');
		expect(after.map((r) => r.bed_id)).toEqual(on.map(() => null));
	});
});
