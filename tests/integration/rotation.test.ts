// Rotation looks back the farm's set number of years (default 3), not only last season: a crop
// family that held a bed two seasons ago is kept off it in the owner's plan.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, testDb } from '../helpers/db';
import { demo } from '../helpers/env';
import { signedIn, type Client } from '../helpers/http';

interface Proposal {
	cropId: string;
	bedId: string | null;
}
interface Preview {
	plantings: Proposal[];
	warnings: { code: string; message: string }[];
}

let farmId: number;
let seasonId: number;
let owner: Client;
let familyOf: Map<string, string>;
const added: { season?: number; planting?: number } = {};

beforeAll(async () => {
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	seasonId = (await testDb()('seasons').where({ farm_id: farmId, year: 2027 }).first('id')).id;
	owner = await signedIn(demo.owner, demo.password);
	const crops: { id: number; family: string }[] = await testDb()('crops')
		.where({ farm_id: farmId })
		.select('id', 'family');
	familyOf = new Map(crops.map((c) => [String(c.id), c.family]));
});

afterAll(async () => {
	if (added.planting) await testDb()('plantings').where({ id: added.planting }).delete();
	if (added.season) await testDb()('seasons').where({ id: added.season }).delete();
	if (farmId) await testDb()('farms').where({ id: farmId }).update({ rotation_years: 3 });
	await closeTestDb();
});

async function preview(): Promise<Preview> {
	const res = await owner.json(`/api/seasons/${seasonId}/plan/preview`, 'POST', {});
	expect(res.status).toBe(200);
	return (await res.json()) as Preview;
}

const onBed = (p: Preview, bed: string, family: string) =>
	p.plantings.filter((x) => x.bedId === bed && familyOf.get(x.cropId) === family).length;

describe('rotation look-back', () => {
	it('keeps a family off a bed it held two seasons back when the look-back is 3 years, not when it is 1', async () => {
		await testDb()('farms').where({ id: farmId }).update({ rotation_years: 1 });
		const oneYear = await preview();
		// A bed the one-year plan gives the nightshades (tomatoes, peppers).
		const bed = oneYear.plantings.find((x) => x.bedId !== null && familyOf.get(x.cropId) === 'Solanaceae')?.bedId;
		expect(bed).toBeDefined();
		const before = onBed(oneYear, bed!, 'Solanaceae');
		expect(before).toBeGreaterThan(0);

		// Nightshades on that bed in 2025, two seasons before 2027: a copy of one 2027 row moved back two years.
		const [season] = await testDb()('seasons').insert({
			farm_id: farmId,
			year: 2025,
			name: '2025 (rotation test)',
			starts_on: '2025-01-01',
			ends_on: '2025-12-31'
		});
		added.season = season;
		const tomato = await testDb()('plantings as p')
			.join('varieties as v', 'v.id', 'p.variety_id')
			.join('crops as c', 'c.id', 'v.crop_id')
			.where({ 'p.farm_id': farmId, 'c.family': 'Solanaceae' })
			.first('p.*');
		const back = (d: string | null) =>
			d === null ? null : `${Number(String(d).slice(0, 4)) - 2}${String(d).slice(4, 10)}`;
		const { id: _id, version: _v, updated_at: _u, created_at: _c, ...rest } = tomato;
		const [planting] = await testDb()('plantings').insert({
			...rest,
			season_id: season,
			bed_id: Number(bed),
			status: 'finished',
			tray_sow_date: back(tomato.tray_sow_date),
			field_date: back(tomato.field_date),
			first_harvest: back(tomato.first_harvest),
			last_harvest: back(tomato.last_harvest)
		});
		added.planting = planting;

		// Still one year: 2025 is out of reach, the plan is as before.
		expect(onBed(await preview(), bed!, 'Solanaceae')).toBe(before);

		// Three years: the nightshades go elsewhere, or the plan says why they could not.
		await testDb()('farms').where({ id: farmId }).update({ rotation_years: 3 });
		const three = await preview();
		const kept = onBed(three, bed!, 'Solanaceae');
		const conflicts = three.warnings.filter((w) => w.code === 'rotation_conflict' && w.message.includes(`Bed ${bed}`));
		expect(kept === 0 || conflicts.length > 0).toBe(true);
		expect(kept).toBeLessThan(before);
	});
});
