// The crop library's form actions: add, edit and archive crops and varieties; a bad value is named
// at its field with what was typed kept, and nothing is written; deleting a variety that plantings
// use is refused with the reason. Only the owner writes; another farm's crops answer "not found".
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, html, signedIn } from '../helpers/http';
import { closeTestDb, count, testDb, uniqueEmail } from '../helpers/db';
import { demo } from '../helpers/env';
import { confirmedSignUp } from '../helpers/signup';

afterAll(closeTestDb);

let owner: Client;
let farmId: number;
async function newFarm(tag: string): Promise<{ client: Client; farmId: number }> {
	const client = new Client();
	const email = uniqueEmail(tag);
	const res = await confirmedSignUp(client, {
		name: 'Library Keeper',
		email,
		password: 'long-enough-pass',
		farmName: 'Library Farm (invented)',
		latitude: '44',
		lastSpringFrost: '2027-05-10',
		firstFallFrost: '2027-10-01'
	});
	if (res.status !== 303) throw new Error(`sign-up answered ${res.status}`);
	const u = await testDb()('users').where({ email }).first('id');
	return { client, farmId: (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id };
}

beforeAll(async () => {
	({ client: owner, farmId } = await newFarm('library'));
});

const crop = {
	name: 'Carrot',
	family: 'Apiaceae',
	harvestUnit: 'lb',
	frostTolerance: 'hardy',
	heatLimitF: '',
	baseTempF: '40',
	harvestCurve: 'flat',
	cutIntervalDays: '',
	storageWeeks: '',
	storageLossPct: '',
	price: '2.50',
	source: 'test'
};
// Figures of a direct-sown carrot. Source: University of Illinois Extension vegetable guide
// (22,000 seeds per ounce within its 18,000–25,000, 70 days within 65–75); 22,000 ÷ 28.349523125 = 776.03 seeds/g.
const variety = {
	name: 'Carrot, standard',
	method: 'direct',
	daysToMaturity: '70',
	daysInTray: '0',
	harvestWindowDays: '14',
	yieldPerBedFoot: '2.4',
	rows: '4',
	inRowSpacingIn: '1',
	seedsPerSpot: '1',
	germinationRate: '65',
	// The farm is imperial: seed is counted and priced per ounce, as catalogues there quote it.
	// Source: NIST Handbook 44, Appendix C: 1 oz = 28.349 523 125 g. 22,000 seeds/oz ÷ 28.3495 =
	// 776.03 seeds/g; $9.92/oz ÷ 28.3495 = $0.3499/g, kept as 35 ¢/g.
	seedsPerGram: '22000',
	seedPrice: '9.92',
	seedsPerPacket: '',
	cellsPerTray: '128',
	margin: '10',
	harvestCurve: '',
	gddToMaturity: '',
	source: 'test'
};

async function cropId(name: string): Promise<number> {
	return (await testDb()('crops').where({ farm_id: farmId, name }).first('id')).id;
}

describe('crops', () => {
	it('adds a crop, then goes on to its first variety', async () => {
		const res = await owner.postForm('/crops/new', crop);
		expect(res.status).toBe(303);
		const row = await testDb()('crops').where({ farm_id: farmId, name: 'Carrot' }).first();
		expect(res.headers.get('location')).toBe(`/crops/${row.id}/varieties/new?created=1`);
		expect(row.harvest_unit).toBe('lb');
		expect(row.price_cents_per_unit).toBe(250);
		expect(row.heat_limit_f).toBeNull();
	});

	const bad: [Record<string, string>, string, string][] = [
		[{ name: '' }, 'name', 'Crop name is required.'],
		[{ harvestUnit: 'bushel' }, 'harvestUnit', 'Harvest unit: choose lb or bunch or head or each.'],
		[{ baseTempF: 'warm' }, 'baseTempF', 'Base temperature must be a number.'],
		[{ heatLimitF: '300' }, 'heatLimitF', 'Heat limit must be at most 120.'],
		[{ family: '<script>' }, 'family', 'Botanical family may not contain < or >.'],
		[{ sowFrom: '13-01', sowTo: '12-15' }, 'sowFrom', 'Earliest field date must be a month and day as MM-DD'],
		[{ sowFrom: '10-01', sowTo: '02-30' }, 'sowTo', 'Latest field date must be a month and day as MM-DD'],
		[{ sowFrom: '10-01', sowTo: '' }, 'sowTo', 'Give both the earliest and the latest field date, or neither.']
	];
	for (const [change, field, message] of bad) {
		it(`names ${field} for ${JSON.stringify(change)}, keeps what was typed and writes nothing`, async () => {
			const before = await count('crops', { farm_id: farmId });
			const res = await owner.postForm('/crops/new', { ...crop, name: 'Beet', ...change });
			expect(res.status).toBe(400);
			const page = await html(res);
			expect(page).toContain(`id="crop-${field}-error"`);
			expect(page).toContain(message);
			// The other fields come back as typed.
			expect(page).toContain('value="2.50"');
			expect(await count('crops', { farm_id: farmId })).toBe(before);
		});
	}

	it('refuses a second crop of the same name at its name field (409)', async () => {
		const res = await owner.postForm('/crops/new', crop);
		expect(res.status).toBe(409);
		expect(await html(res)).toContain('The library already has a crop named "Carrot".');
		expect(await count('crops', { farm_id: farmId, name: 'Carrot' })).toBe(1);
	});

	it('edits a crop, and archives and brings it back', async () => {
		const id = await cropId('Carrot');
		const res = await owner.postForm(`/crops/${id}?/save`, {
			...crop,
			heatLimitF: '85',
			price: '3',
			harvestCurve: 'cuts',
			cutIntervalDays: '21',
			storageWeeks: '30',
			storageLossPct: '2',
			sowFrom: '03-15',
			sowTo: '07-31'
		});
		expect(res.status).toBe(200);
		const row = await testDb()('crops').where({ id }).first();
		// The crop's field dates, as typed (month-day; the planner keeps its sowings inside them).
		expect([row.sow_from, row.sow_to]).toEqual(['03-15', '07-31']);
		expect(await html(await owner.get(`/crops/${id}`))).toContain('value="07-31"');
		expect(Number(row.heat_limit_f)).toBe(85);
		expect(row.price_cents_per_unit).toBe(300);
		expect([
			row.harvest_curve,
			row.harvest_cut_interval_days,
			row.storage_weeks,
			Number(row.storage_loss_per_week)
		]).toEqual(['cuts', 21, 30, 0.02]);
		const bad = await owner.postForm(`/crops/${id}?/save`, { ...crop, harvestCurve: 'wavy' });
		expect(bad.status).toBe(400);
		expect(await html(bad)).toContain('id="crop-harvestCurve-error"');
		expect((await testDb()('crops').where({ id }).first('harvest_curve')).harvest_curve).toBe('cuts');

		expect((await owner.postForm(`/crops/${id}?/archive`, {})).status).toBe(303);
		expect((await testDb()('crops').where({ id }).first('archived_at')).archived_at).not.toBeNull();
		const list = await html(await owner.get('/crops'));
		expect(list).not.toContain(`href="/crops/${id}"`);
		expect(await html(await owner.get('/crops?archived=1'))).toContain(`href="/crops/${id}"`);
		expect((await owner.postForm(`/crops/${id}?/restore`, {})).status).toBe(303);
		expect((await testDb()('crops').where({ id }).first('archived_at')).archived_at).toBeNull();
	});
});

describe('varieties', () => {
	it('adds a variety with every figure the engine uses, stored in its canonical unit', async () => {
		const id = await cropId('Carrot');
		const res = await owner.postForm(`/crops/${id}/varieties/new`, variety);
		expect(res.status).toBe(303);
		const v = await testDb()('varieties').where({ crop_id: id, name: 'Carrot, standard' }).first();
		expect(res.headers.get('location')).toBe(`/crops/${id}/varieties/${v.id}`);
		expect(v.days_to_maturity).toBe(70);
		expect(Number(v.germination_rate)).toBeCloseTo(0.65, 6); // typed as 65 %
		expect(Number(v.margin)).toBeCloseTo(0.1, 6); // typed as 10 %
		expect(Number(v.seeds_per_gram)).toBeCloseTo(776.03, 2);
		expect(v.seed_price_cents_per_gram).toBe(35);
		expect(v.seeds_per_packet).toBeNull();
	});

	const bad: [Record<string, string>, string, string][] = [
		[{ daysToMaturity: '0' }, 'daysToMaturity', 'Days to maturity must be at least 1.'],
		[{ daysToMaturity: '70.5' }, 'daysToMaturity', 'Days to maturity must be a whole number.'],
		[{ germinationRate: '120' }, 'germinationRate', 'Germination must be at most 100.'],
		[{ inRowSpacingIn: 'close' }, 'inRowSpacingIn', 'In-row spacing must be a number.'],
		[{ method: 'broadcast' }, 'method', 'Method: choose direct or transplant.'],
		[{ daysInTray: '21' }, 'daysInTray', 'Days in tray must be 0 for a direct-sown variety.'],
		[{ yieldPerBedFoot: '' }, 'yieldPerBedFoot', 'Yield is required.']
	];
	for (const [change, field, message] of bad) {
		it(`names ${field} for ${JSON.stringify(change)} and writes nothing`, async () => {
			const id = await cropId('Carrot');
			const before = await count('varieties', { farm_id: farmId });
			const res = await owner.postForm(`/crops/${id}/varieties/new`, { ...variety, name: 'Carrot, other', ...change });
			expect(res.status).toBe(400);
			const page = await html(res);
			expect(page).toContain(`id="variety-${field}-error"`);
			expect(page).toContain(message);
			expect(page).toContain('value="Carrot, other"');
			expect(await count('varieties', { farm_id: farmId })).toBe(before);
		});
	}

	it('edits a variety; a bad edit changes nothing', async () => {
		const v = await testDb()('varieties').where({ farm_id: farmId, name: 'Carrot, standard' }).first();
		const path = `/crops/${v.crop_id}/varieties/${v.id}`;
		expect((await owner.postForm(`${path}?/save`, { ...variety, daysToMaturity: '72' })).status).toBe(200);
		expect((await testDb()('varieties').where({ id: v.id }).first('days_to_maturity')).days_to_maturity).toBe(72);
		const before = await testDb()('varieties').where({ id: v.id }).first();
		const bad = await owner.postForm(`${path}?/save`, { ...variety, rows: '0' });
		expect(bad.status).toBe(400);
		expect(await html(bad)).toContain('Rows per bed must be at least 1.');
		expect(await testDb()('varieties').where({ id: v.id }).first()).toEqual(before);
	});

	it('archives a variety: kept, but left out of new plans', async () => {
		const v = await testDb()('varieties').where({ farm_id: farmId, name: 'Carrot, standard' }).first();
		const path = `/crops/${v.crop_id}/varieties/${v.id}`;
		expect((await owner.postForm(`${path}?/archive`, {})).status).toBe(303);
		expect((await testDb()('varieties').where({ id: v.id }).first('archived_at')).archived_at).not.toBeNull();
		expect(await html(await owner.get(path))).toContain('archived: left out of new plans');
		expect((await owner.postForm(`${path}?/restore`, {})).status).toBe(303);
		expect((await testDb()('varieties').where({ id: v.id }).first('archived_at')).archived_at).toBeNull();
	});

	it('refuses to delete a variety that plantings use, saying why, and deletes one nobody uses', async () => {
		const v = await testDb()('varieties').where({ farm_id: farmId, name: 'Carrot, standard' }).first();
		const [seasonId] = await testDb()('seasons').insert({
			farm_id: farmId,
			year: 2031,
			name: 'Library test 2031',
			starts_on: '2031-01-01',
			ends_on: '2031-12-31'
		});
		await testDb()('plantings').insert({
			farm_id: farmId,
			season_id: seasonId,
			variety_id: v.id,
			length_ft: 50,
			rows: 4,
			in_row_spacing_in: 1,
			method: 'direct',
			field_date: '2031-04-20',
			first_harvest: '2031-06-29',
			last_harvest: '2031-07-12'
		});
		const res = await owner.postForm(`/crops/${v.crop_id}/varieties/${v.id}?/delete`, {});
		expect(res.status).toBe(409);
		expect(await html(res)).toContain(
			'Carrot, standard cannot be deleted: 1 planting uses it (Library test 2031). Archive it instead'
		);
		expect(await count('varieties', { id: v.id })).toBe(1);

		const id = await cropId('Carrot');
		await owner.postForm(`/crops/${id}/varieties/new`, { ...variety, name: 'Carrot, spare' });
		const spare = await testDb()('varieties').where({ crop_id: id, name: 'Carrot, spare' }).first('id');
		const del = await owner.postForm(`/crops/${id}/varieties/${spare.id}?/delete`, {});
		expect(del.status).toBe(303);
		expect(await count('varieties', { id: spare.id })).toBe(0);
	});
});

describe('who may edit', () => {
	it('lets the crew lead read the library but not write it (403), and hides the edit buttons', async () => {
		const crew = await signedIn(demo.crew, demo.password);
		const page = await html(await crew.get('/crops'));
		expect(page).toContain('Crop library');
		expect(page).not.toContain('href="/crops/new"');
		const demoCrop = await testDb()('crops as c')
			.join('farm_members as m', 'm.farm_id', 'c.farm_id')
			.join('users as u', 'u.id', 'm.user_id')
			.where('u.email', demo.crew)
			.first('c.id', 'c.farm_id');
		expect((await crew.get(`/crops/${demoCrop.id}`)).status).toBe(200);
		const before = await testDb()('crops').where({ id: demoCrop.id }).first();
		expect((await crew.postForm(`/crops/${demoCrop.id}?/save`, { ...crop, name: 'Renamed by crew' })).status).toBe(403);
		expect((await crew.postForm('/crops/new', { ...crop, name: 'Crew crop' })).status).toBe(403);
		expect((await crew.get('/crops/new')).status).toBe(403);
		expect(await testDb()('crops').where({ id: demoCrop.id }).first()).toEqual(before);
	});

	it("answers 404 for another farm's crop and variety, and changes nothing there", async () => {
		const other = await newFarm('library-other');
		const id = await cropId('Carrot');
		const v = await testDb()('varieties').where({ crop_id: id }).first('id');
		expect((await other.client.get(`/crops/${id}`)).status).toBe(404);
		expect((await other.client.postForm(`/crops/${id}?/archive`, {})).status).toBe(404);
		expect((await other.client.postForm(`/crops/${id}/varieties/${v.id}?/delete`, {})).status).toBe(404);
		expect(await count('varieties', { id: v.id })).toBe(1);
		expect((await testDb()('crops').where({ id }).first('archived_at')).archived_at).toBeNull();
	});
});
