// Every writing route, fed hostile input: wrong types, impossible and far-away dates, huge
// numbers, oversized bodies and other farms' ids. Each answers 4xx naming the field, and the
// tables a route could touch are byte-for-byte as before (MariaDB's CHECKSUM TABLE).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, html, signedIn } from '../helpers/http';
import { closeTestDb, testDb } from '../helpers/db';
import { baseUrl, demo } from '../helpers/env';
import { signUpFarm, writeHandPlan, type NewFarm } from '../helpers/transfer';

afterAll(closeTestDb);

// Every table a farm's writes can reach (sessions and rate-limit counters change on sign-in).
const TABLES = [
	'farms',
	'farm_weekly_temps',
	'farm_members',
	'invites',
	'password_resets',
	'users',
	'blocks',
	'beds',
	'crops',
	'varieties',
	'seasons',
	'plantings',
	'share_sizes',
	'box_items',
	'channel_demand',
	'harvest_records',
	'harvest_audit',
	'box_swaps',
	'user_grid_prefs',
	'calendar_feeds',
	'variety_figure_changes'
];

async function checksums(): Promise<Record<string, string>> {
	const [rows] = await testDb().raw(`CHECKSUM TABLE ${TABLES.map((t) => `\`${t}\``).join(', ')}`);
	return Object.fromEntries(
		(rows as { Table: string; Checksum: string | number }[]).map((r) => [
			r.Table.split('.').pop() ?? r.Table,
			String(r.Checksum)
		])
	);
}

interface Ids {
	season: number;
	planting: number;
	plantingVersion: number;
	harvestSeason: number;
	harvest: number;
	share: number;
	block: number;
	bed: number;
	crop: number;
	variety: number;
	/** Another farm's rows, named in this farm's requests. */
	otherVariety: number;
	otherBed: number;
	otherBlock: number;
	otherCrop: number;
	otherPlanting: number;
	otherShare: number;
}

type Who = 'owner' | 'crew';
interface Case {
	name: string;
	who?: Who;
	/** JSON route: method and path; form action: path with ?/name. */
	json?: [method: string, path: (i: Ids) => string, body: (i: Ids) => unknown];
	form?: [path: (i: Ids) => string, fields: (i: Ids) => Record<string, string | number>];
	raw?: [method: string, path: (i: Ids) => string, body: () => string, contentType: string];
	status: number | number[];
	/** The field the answer must name: a key of `errors` (JSON) or text of the page (forms). */
	field?: string;
}

const big = 1e308;
const cases: Case[] = [
	// Plantings
	{
		name: 'POST plantings: variety as text',
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/plantings`,
			() => ({ plantings: [{ varietyId: 'carrots', lengthFt: 10, fieldDate: '2027-05-03' }] })
		],
		status: 400,
		field: 'plantings.0.varietyId'
	},
	{
		name: 'POST plantings: 30 February',
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/plantings`,
			(i) => ({ plantings: [{ varietyId: i.variety, lengthFt: 10, fieldDate: '2027-02-30' }] })
		],
		status: 400,
		field: 'plantings.0.fieldDate'
	},
	{
		name: 'POST plantings: year 1899',
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/plantings`,
			(i) => ({ plantings: [{ varietyId: i.variety, lengthFt: 10, fieldDate: '1899-05-03' }] })
		],
		status: 400,
		field: 'plantings.0.fieldDate'
	},
	{
		name: 'POST plantings: 1e308 bed-feet',
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/plantings`,
			(i) => ({ plantings: [{ varietyId: i.variety, lengthFt: big, fieldDate: '2027-05-03' }] })
		],
		status: 400,
		field: 'plantings.0.lengthFt'
	},
	{
		name: "POST plantings: another farm's variety",
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/plantings`,
			(i) => ({ plantings: [{ varietyId: i.otherVariety, lengthFt: 10, fieldDate: '2027-05-03' }] })
		],
		status: 400,
		field: 'plantings.0.varietyId'
	},
	{
		name: "POST plantings: another farm's bed",
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/plantings`,
			(i) => ({ plantings: [{ varietyId: i.variety, bedId: i.otherBed, lengthFt: 10, fieldDate: '2027-05-03' }] })
		],
		status: 400,
		field: 'plantings.0.bedId'
	},
	{
		name: 'POST plantings: 5,001 rows',
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/plantings`,
			(i) => ({
				plantings: Array.from({ length: 5001 }, () => ({ varietyId: i.variety, lengthFt: 10, fieldDate: '2027-05-03' }))
			})
		],
		status: 400,
		field: 'plantings'
	},
	{
		name: 'POST plantings: a 7 MB body',
		raw: [
			'POST',
			(i) => `/api/seasons/${i.season}/plantings`,
			() => JSON.stringify({ plantings: [], pad: 'x'.repeat(7 * 1024 * 1024) }),
			'application/json'
		],
		status: 413
	},
	{
		name: 'POST plantings: not JSON',
		raw: ['POST', (i) => `/api/seasons/${i.season}/plantings`, () => '{"plantings": [', 'application/json'],
		status: 400,
		field: '_body'
	},
	{
		name: 'PATCH planting: version as text',
		json: ['PATCH', (i) => `/api/plantings/${i.planting}`, () => ({ version: 'one', notes: 'x' })],
		status: 400,
		field: 'version'
	},
	{
		name: 'PATCH planting: month 13',
		json: [
			'PATCH',
			(i) => `/api/plantings/${i.planting}`,
			(i) => ({ version: i.plantingVersion, fieldDate: '2027-13-01' })
		],
		status: 400,
		field: 'fieldDate'
	},
	{
		name: 'PATCH planting: 1e308 rows',
		json: ['PATCH', (i) => `/api/plantings/${i.planting}`, (i) => ({ version: i.plantingVersion, rows: big })],
		status: 400,
		field: 'rows'
	},
	{
		name: "PATCH planting: another farm's bed",
		json: ['PATCH', (i) => `/api/plantings/${i.planting}`, (i) => ({ version: i.plantingVersion, bedId: i.otherBed })],
		status: 400,
		field: 'bedId'
	},
	{
		name: 'PATCH planting: crew lead, actual date in 9999',
		who: 'crew',
		json: [
			'PATCH',
			(i) => `/api/plantings/${i.planting}`,
			(i) => ({ version: i.plantingVersion, actualFieldDate: '9999-01-01' })
		],
		status: 400,
		field: 'actualFieldDate'
	},
	{
		name: "PATCH planting: another farm's planting",
		json: ['PATCH', (i) => `/api/plantings/${i.otherPlanting}`, () => ({ version: 1, notes: 'x' })],
		status: 404
	},
	{
		name: "DELETE planting: another farm's planting",
		json: ['DELETE', (i) => `/api/plantings/${i.otherPlanting}`, () => undefined],
		status: 404
	},

	// Demand
	{
		name: 'POST share size: members -1',
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/demand/share-sizes`,
			() => ({ name: 'Bad', members: -1, firstWeek: '2027-W24', lastWeek: '2027-W30', pickupDays: ['Tue'], price: 10 })
		],
		status: 400,
		field: 'members'
	},
	{
		name: 'POST share size: week 60',
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/demand/share-sizes`,
			() => ({ name: 'Bad', members: 5, firstWeek: '2027-W60', lastWeek: '2027-W30', pickupDays: ['Tue'], price: 10 })
		],
		status: 400,
		field: 'firstWeek'
	},
	{
		name: 'POST share size: price 1e308',
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/demand/share-sizes`,
			() => ({ name: 'Bad', members: 5, firstWeek: '2027-W24', lastWeek: '2027-W30', pickupDays: ['Tue'], price: big })
		],
		status: 400,
		field: 'price'
	},
	{
		name: 'PUT share size: members as text',
		json: [
			'PUT',
			(i) => `/api/seasons/${i.season}/demand/share-sizes/${i.share}`,
			() => ({
				name: 'Bad',
				members: 'many',
				firstWeek: '2027-W24',
				lastWeek: '2027-W30',
				pickupDays: ['Tue'],
				price: 10
			})
		],
		status: 400,
		field: 'members'
	},
	{
		name: "PUT share size: another farm's share size",
		json: [
			'PUT',
			(i) => `/api/seasons/${i.season}/demand/share-sizes/${i.otherShare}`,
			() => ({ name: 'Bad', members: 5, firstWeek: '2027-W24', lastWeek: '2027-W30', pickupDays: ['Tue'], price: 10 })
		],
		status: 404
	},
	{
		name: 'PATCH demand cells: week 0999-W10',
		json: [
			'PATCH',
			(i) => `/api/seasons/${i.season}/demand/cells`,
			(i) => ({ grid: 'market', cells: [{ crop: i.crop, week: '0999-W10', quantity: 1, unit: 'lb' }] })
		],
		status: 400,
		field: 'cells.0.week'
	},
	{
		name: 'PATCH demand cells: 1e308',
		json: [
			'PATCH',
			(i) => `/api/seasons/${i.season}/demand/cells`,
			(i) => ({ grid: 'market', cells: [{ crop: i.crop, week: '2027-W24', quantity: big, unit: 'lb' }] })
		],
		status: 400,
		field: 'cells.0.quantity'
	},
	{
		name: "PATCH demand cells: another farm's crop",
		json: [
			'PATCH',
			(i) => `/api/seasons/${i.season}/demand/cells`,
			(i) => ({ grid: 'market', cells: [{ crop: i.otherCrop, week: '2027-W24', quantity: 1, unit: 'lb' }] })
		],
		status: 400,
		field: 'cells.0.crop'
	},
	{
		name: 'POST copy-week: 9999-W52',
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/demand/copy-week`,
			() => ({ grid: 'market', fromWeek: '2027-W24', toFirst: '2027-W25', toLast: '9999-W52' })
		],
		status: 400,
		field: 'toLast'
	},

	// Harvests and boxes
	{
		name: 'POST harvest: 31 April',
		who: 'crew',
		json: [
			'POST',
			(i) => `/api/seasons/${i.harvestSeason}/harvests`,
			(i) => ({ plantingId: i.planting, harvestedOn: '2026-04-31', quantity: 1, unit: 'lb' })
		],
		status: 400,
		field: 'harvestedOn'
	},
	{
		name: 'POST harvest: 1e308 lb',
		who: 'crew',
		json: [
			'POST',
			(i) => `/api/seasons/${i.harvestSeason}/harvests`,
			(i) => ({ plantingId: i.planting, harvestedOn: '2026-07-01', quantity: big, unit: 'lb' })
		],
		status: 400,
		field: 'quantity'
	},
	{
		name: "POST harvest: another farm's planting",
		who: 'crew',
		json: [
			'POST',
			(i) => `/api/seasons/${i.harvestSeason}/harvests`,
			(i) => ({ plantingId: i.otherPlanting, harvestedOn: '2026-07-01', quantity: 1, unit: 'lb' })
		],
		status: [400, 404],
		field: 'plantingId'
	},
	{
		name: 'PATCH harvest: quantity as text',
		who: 'crew',
		json: ['PATCH', (i) => `/api/seasons/${i.harvestSeason}/harvests/${i.harvest}`, () => ({ quantity: 'heaps' })],
		status: 400,
		field: 'quantity'
	},
	{
		name: 'POST swap: week 2027-W99',
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/boxes/swaps`,
			(i) => ({ shareSizeId: i.share, week: '2027-W99', fromCropId: i.crop, toCropId: i.crop + 1, quantity: 1 })
		],
		status: 400,
		field: 'week'
	},
	{
		name: "POST swap: another farm's share size",
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/boxes/swaps`,
			(i) => ({ shareSizeId: i.otherShare, week: '2027-W30', fromCropId: i.crop, toCropId: i.crop + 1, quantity: 1 })
		],
		status: 400,
		field: 'shareSizeId'
	},

	// Plan, preferences
	{
		name: 'POST plan preview: margin 5',
		json: ['POST', (i) => `/api/seasons/${i.season}/plan/preview`, () => ({ margin: 5 })],
		status: 400,
		field: 'margin'
	},
	{
		name: 'POST plan apply: intervalWeeks as text',
		json: ['POST', (i) => `/api/seasons/${i.season}/plan/apply`, () => ({ intervalWeeks: 'weekly' })],
		status: 400,
		field: 'intervalWeeks'
	},
	{
		name: 'PUT grid prefs: 1e308 px',
		json: ['PUT', () => '/api/me/prefs/grid', () => ({ widths: { crop: big }, hidden: [] })],
		status: 400,
		field: 'widths.crop'
	},

	// Form actions
	{
		name: 'settings: latitude 1000 and frost in 0999',
		form: [
			() => '/settings?/farm',
			() => ({
				name: 'Renamed',
				timeZone: 'America/New_York',
				latitude: 1000,
				unitSystem: 'imperial',
				lastSpringFrost: '0999-04-20',
				firstFallFrost: '2027-10-20',
				bedFootIncrement: 5,
				turnaroundDays: 7
			})
		],
		status: 400,
		field: 'Latitude'
	},
	{
		name: "settings: a bed in another farm's block",
		form: [
			() => '/settings?/saveBed',
			(i) => ({ name: 'Stray', blockId: i.otherBlock, lengthFt: 10, widthIn: 30, position: 0 })
		],
		status: 400,
		field: "this farm's blocks"
	},
	{
		name: 'settings: a bed 1e308 ft long',
		form: [
			() => '/settings?/saveBed',
			(i) => ({ name: 'Huge', blockId: i.block, lengthFt: '1e308', widthIn: 30, position: 0 })
		],
		status: 400,
		field: 'Length'
	},
	{
		name: 'settings: a block name of 5,000 characters',
		form: [() => '/settings?/addBlock', () => ({ name: 'B'.repeat(5000) })],
		status: 400,
		field: 'Block name'
	},
	{
		name: 'team: invite with role king',
		form: [() => '/team?/invite', () => ({ email: 'someone@example.test', role: 'king' })],
		status: 400,
		field: 'Role'
	},
	{
		name: 'harvest log form: date 9999-12-31',
		who: 'crew',
		form: [
			(i) => `/seasons/${i.harvestSeason}/harvests?/log`,
			(i) => ({ plantingId: i.planting, harvestedOn: '9999-12-31', quantity: 1, unit: 'lb' })
		],
		status: 400,
		field: 'Date must be between 1900 and 2200'
	},
	{
		name: 'crew sheet: done on 0001-01-01',
		who: 'crew',
		form: [
			(i) => `/seasons/${i.season}/week/2027-W21?/done`,
			(i) => ({ plantingId: i.planting, kind: 'harvest', date: '0001-01-01' })
		],
		status: 400,
		field: 'Actual date must be between 1900 and 2200'
	},
	{
		name: 'demand form: members sixty',
		form: [
			(i) => `/seasons/${i.season}/demand?/addShare`,
			() => ({ name: 'Sixty', members: 'sixty', firstWeek: '2027-W24', lastWeek: '2027-W30', price: '10' })
		],
		status: 400,
		field: 'Members must be a number'
	}
];

let ids: Ids;
let clients: Record<Who, Client>;
let other: NewFarm;

beforeAll(async () => {
	const db = testDb();
	const u = await db('users').where({ email: demo.owner }).first('id');
	const farmId = (await db('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	const season = (await db('seasons').where({ farm_id: farmId, year: 2027 }).first('id')).id;
	const harvest = await db('harvest_records as h')
		.join('plantings as p', 'p.id', 'h.planting_id')
		.where({ 'h.farm_id': farmId })
		.first('h.id', 'p.season_id');
	const planting = await db('plantings').where({ farm_id: farmId, season_id: season }).first('id', 'version');
	const bed = await db('beds').where({ farm_id: farmId }).first('id', 'block_id');
	const variety = await db('varieties').where({ farm_id: farmId }).first('id', 'crop_id');
	const share = await db('share_sizes').where({ season_id: season }).first('id');
	other = await signUpFarm('bad-input');
	const hand = await writeHandPlan(other.farmId);
	const [otherShare] = await db('share_sizes').insert({
		farm_id: other.farmId,
		season_id: hand.seasonId,
		name: 'Theirs',
		members: 3,
		first_week: '2027-W24',
		last_week: '2027-W30'
	});
	ids = {
		season,
		planting: planting.id,
		plantingVersion: planting.version,
		harvestSeason: harvest.season_id,
		harvest: harvest.id,
		share: share.id,
		block: bed.block_id,
		bed: bed.id,
		crop: variety.crop_id,
		variety: variety.id,
		otherVariety: (await db('varieties').where({ farm_id: other.farmId }).first('id')).id,
		otherBed: (await db('beds').where({ farm_id: other.farmId }).first('id')).id,
		otherBlock: (await db('blocks').where({ farm_id: other.farmId }).first('id')).id,
		otherCrop: hand.cropIds.carrot,
		otherPlanting: (await db('plantings').where({ farm_id: other.farmId }).first('id')).id,
		otherShare
	};
	clients = { owner: await signedIn(demo.owner, demo.password), crew: await signedIn(demo.crew, demo.password) };
});

describe('hostile input to every writing route', () => {
	for (const c of cases) {
		it(c.name, async () => {
			const before = await checksums();
			const client = clients[c.who ?? 'owner'];
			let res: Response;
			if (c.json) {
				const [method, path, body] = c.json;
				res = await client.json(path(ids), method, body(ids));
			} else if (c.form) {
				const [path, fields] = c.form;
				res = await client.postForm(path(ids), fields(ids));
			} else {
				const [method, path, body, type] = c.raw!;
				res = await client.request(path(ids), {
					method,
					body: body(),
					headers: { origin: baseUrl(), 'content-type': type, accept: 'application/json' }
				});
			}
			const wanted = Array.isArray(c.status) ? c.status : [c.status];
			const text = c.form ? await html(res) : await res.text();
			expect(wanted, `${c.name}: answered ${res.status} ${text.slice(0, 300)}`).toContain(res.status);
			if (c.field) {
				if (c.form) expect(text).toContain(c.field);
				else expect(Object.keys(JSON.parse(text).errors ?? {}), text.slice(0, 300)).toContain(c.field);
			}
			expect(await checksums()).toEqual(before);
		});
	}
});

it('the checksums do see a change (control)', async () => {
	const before = await checksums();
	const row = await testDb()('plantings').where({ id: ids.planting }).first();
	await testDb()('plantings')
		.where({ id: ids.planting })
		.update({ notes: `${row.notes ?? ''} control` });
	const changed = await checksums();
	await testDb()('plantings').where({ id: ids.planting }).update({ notes: row.notes });
	expect(changed.plantings).not.toBe(before.plantings);
	// Put back as it was, but for its change stamp: any write moves that (the answer cache's
	// migration, 20261203_11d_change_stamps.ts), so a write that puts back the same values is seen too.
	expect({ ...(await checksums()), plantings: 'the row below' }).toEqual({ ...before, plantings: 'the row below' });
	const { change_seq: was, ...rest } = row;
	const { change_seq: now, ...restNow } = await testDb()('plantings').where({ id: ids.planting }).first();
	expect(restNow).toEqual(rest);
	expect(now).not.toBe(was);
});
