// The invented demo farm, seeded into the scratch database after a fresh migrate.
import { execFileSync } from 'node:child_process';
import knex, { type Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { knexConfig } from '../../knexfile';
import { verifyPassword } from '../../src/lib/server/password';
import { seedNeed } from '../../src/lib/planning/index';
import {
	DEMO_FALL_PLANTINGS_2026,
	DEMO_FARM,
	DEMO_PASSWORD,
	DEMO_USERS,
	DEMO_VARIETIES,
	ensureDemoFarm,
	findDemoFarm,
	planDemoSeason
} from '../../db/seeds/demo-farm';

const DATABASE = process.env.FC_DB_SCRATCH_NAME ?? 'furrowcast_scratch';

let db: Knex;
let farmId: number;

interface PlantingRow {
	id: number;
	farm_id: number;
	season_id: number;
	bed_id: number | null;
	start_ft: string;
	length_ft: string;
	field_date: string;
	first_harvest: string;
	last_harvest: string;
	status: string;
	notes: string | null;
	expected_yield: string;
	seeds_needed: number;
}

async function count(q: Knex.QueryBuilder): Promise<number> {
	return Number((await q.count<{ n: number }[]>({ n: '*' }))[0].n);
}

async function seasonId(year: number): Promise<number> {
	const row = await db('seasons').where({ farm_id: farmId, year }).first<{ id: number }>('id');
	return Number(row.id);
}

beforeAll(async () => {
	db = knex(knexConfig(DATABASE));
	await db.migrate.rollback(undefined, true);
	await db.migrate.latest();
	({ farmId } = await ensureDemoFarm(db));
});

afterAll(async () => {
	await db?.destroy();
});

describe('demo farm seed', () => {
	it('creates a farm marked as invented, with a smooth weekly temperature normal for weeks 1–53', async () => {
		const farm = await db('farms').where({ id: farmId }).first();
		expect(farm.name).toMatch(/invented/i);
		expect(farm.last_spring_frost).toBe('2027-05-10');
		expect(farm.first_fall_frost).toBe('2027-10-05');
		expect(Number(farm.bed_foot_increment)).toBe(1);
		expect(Number(farm.turnaround_days)).toBe(7);
		const temps = (await db('farm_weekly_temps').where({ farm_id: farmId }).orderBy('week_number')).map((t) =>
			Number(t.mean_temp_f)
		);
		expect(temps).toHaveLength(53);
		expect(Math.min(...temps)).toBeCloseTo(22, 0);
		expect(Math.max(...temps)).toBeCloseTo(72, 0);
		expect(temps.indexOf(Math.max(...temps)) + 1).toBe(30);
		for (let i = 1; i < temps.length; i++) expect(Math.abs(temps[i] - temps[i - 1])).toBeLessThan(3.5);
	});

	it('lays out about 40 beds of 100 ft × 30 in in 3 blocks', async () => {
		const beds = await db('beds').where({ farm_id: farmId });
		expect(beds.length).toBeGreaterThanOrEqual(38);
		expect(beds.length).toBeLessThanOrEqual(42);
		expect(beds.every((b) => Number(b.length_ft) === 100 && Number(b.width_in) === 30)).toBe(true);
		expect(new Set(beds.map((b) => b.block_id)).size).toBe(3);
		expect(await count(db('blocks').where({ farm_id: farmId }))).toBe(3);
	});

	it('has about 20 crops and 30 varieties with plausible figures', async () => {
		const crops = await db('crops').where({ farm_id: farmId });
		expect(crops.length).toBeGreaterThanOrEqual(18);
		expect(crops.length).toBeLessThanOrEqual(22);
		const byName = new Map(crops.map((c) => [c.name, c]));
		for (const name of ['Carrot', 'Beet', 'Radish', 'Spinach', 'Kale', 'Tomato', 'Basil'])
			expect(byName.has(name)).toBe(true);
		for (const name of ['Spinach', 'Radish', 'Cilantro']) {
			expect(Number(byName.get(name).heat_limit_f)).toBeGreaterThanOrEqual(70);
			expect(Number(byName.get(name).heat_limit_f)).toBeLessThanOrEqual(75);
		}
		for (const c of crops) expect(Number(c.base_temp_f)).toBe(c.frost_tolerance === 'tender' ? 50 : 40);
		const varieties = await db('varieties').where({ farm_id: farmId });
		expect(varieties).toHaveLength(30);
		expect(new Set(varieties.map((v) => v.crop_id)).size).toBe(crops.length);
		for (const v of varieties) {
			expect(Number(v.germination_rate)).toBeGreaterThan(0.5);
			expect(Number(v.margin)).toBeGreaterThanOrEqual(0.1);
			expect(Number(v.margin)).toBeLessThanOrEqual(0.2);
			if (v.method === 'transplant') {
				expect(v.days_in_tray).toBeGreaterThan(0);
				expect([72, 128, 200]).toContain(v.cells_per_tray);
			}
		}
	});

	it('has three users, one per role, who can sign in with the demo password', async () => {
		const members = await db('farm_members as m')
			.join('users as u', 'u.id', 'm.user_id')
			.where('m.farm_id', farmId)
			.select('u.email', 'u.password_hash', 'm.role');
		expect(members).toHaveLength(3);
		expect(members.map((m) => m.role).sort()).toEqual(['crew_lead', 'owner', 'share_manager']);
		expect(members.map((m) => m.email).sort()).toEqual(DEMO_USERS.map((u) => u.email).sort());
		expect(await verifyPassword(members[0].password_hash, DEMO_PASSWORD)).toBe(true);
	});

	it('has two share sizes with members, weekly box items in the crop unit, and market and restaurant demand', async () => {
		const season = await seasonId(2027);
		const shares = await db('share_sizes').where({ season_id: season }).orderBy('members', 'desc');
		expect(shares.map((s) => s.name)).toEqual(['Full share', 'Half share']);
		expect(shares.map((s) => s.members)).toEqual([60, 40]);
		expect(shares.every((s) => s.first_week === '2027-W24' && s.last_week === '2027-W43')).toBe(true);
		const items = await db('box_items as b')
			.join('crops as c', 'c.id', 'b.crop_id')
			.join('share_sizes as s', 's.id', 'b.share_size_id')
			.where('s.season_id', season)
			.select('b.*', 'c.harvest_unit', 's.name as share');
		expect(items.length).toBeGreaterThan(100);
		expect(items.every((i) => i.unit === i.harvest_unit)).toBe(true);
		expect(items.every((i) => i.week >= '2027-W24' && i.week <= '2027-W43')).toBe(true);
		expect(new Set(items.filter((i) => i.share === 'Half share').map((i) => i.week)).size).toBe(20);
		// Contents change as crops come in: more distinct crops over the season than in any one box.
		const firstWeek = new Set(items.filter((i) => i.week === '2027-W24').map((i) => i.crop_id));
		const late = new Set(items.filter((i) => i.week === '2027-W36').map((i) => i.crop_id));
		expect([...late].some((c) => !firstWeek.has(c))).toBe(true);
		expect(await count(db('channel_demand').where({ season_id: season, channel: 'market' }))).toBeGreaterThan(50);
		expect(await count(db('channel_demand').where({ season_id: season, channel: 'restaurant' }))).toBeGreaterThan(20);
	});

	it('plans a couple of hundred 2027 plantings from the engine, placed in beds within their length', async () => {
		const rows = await db<PlantingRow>('plantings').where({ season_id: await seasonId(2027) });
		expect(rows.length).toBeGreaterThanOrEqual(150);
		expect(rows.every((p) => p.status === 'planned')).toBe(true);
		const placed = rows.filter((p) => p.bed_id !== null);
		// Demand slightly exceeds 40 beds in midsummer; the few left over are kept, with the reason.
		expect(placed.length / rows.length).toBeGreaterThan(0.95);
		expect(rows.filter((p) => p.bed_id === null).every((p) => (p.notes ?? '').startsWith('Not placed'))).toBe(true);
		for (const p of placed) {
			expect(Number(p.start_ft)).toBeGreaterThanOrEqual(0);
			expect(Number(p.start_ft) + Number(p.length_ft)).toBeLessThanOrEqual(100);
			expect(Number.isInteger(Number(p.length_ft))).toBe(true);
			expect(p.field_date < p.first_harvest && p.first_harvest <= p.last_harvest).toBe(true);
			expect(Number(p.expected_yield)).toBeGreaterThan(0);
			expect(p.seeds_needed).toBeGreaterThan(0);
		}
	});

	it('writes the planSeason result as it stands: one row per placed piece, seed sized to that piece', async () => {
		const season = await seasonId(2027);
		const rows = await db('plantings as p')
			.join('varieties as v', 'v.id', 'p.variety_id')
			.leftJoin('beds as b', 'b.id', 'p.bed_id')
			.where('p.season_id', season)
			.select('p.length_ft', 'p.seeds_needed', 'p.bed_id', 'v.name as variety', 'b.name as bed');
		const plan = planDemoSeason();
		expect(rows).toHaveLength(plan.plantings.length);
		expect(rows.filter((r) => r.bed_id === null)).toHaveLength(plan.plantings.filter((p) => p.bedId === null).length);
		// The same bed-feet per variety and bed as the engine proposed: the seed adds and drops nothing.
		const tally = (list: { variety: string; bed: string | null; feet: number }[]): Record<string, number> => {
			const out: Record<string, number> = {};
			for (const r of list) out[`${r.variety}|${r.bed}`] = (out[`${r.variety}|${r.bed}`] ?? 0) + r.feet;
			return out;
		};
		expect(tally(rows.map((r) => ({ variety: r.variety, bed: r.bed, feet: Number(r.length_ft) })))).toEqual(
			tally(plan.plantings.map((p) => ({ variety: p.varietyId, bed: p.bedId, feet: p.lengthFt })))
		);
		// A succession split across beds needs seed for each piece, not the whole length on every row.
		const byName = new Map(DEMO_VARIETIES.map((v) => [v.name, v]));
		for (const r of rows) {
			const v = byName.get(r.variety)!;
			const expected = seedNeed({
				method: v.method,
				bedFeet: Number(r.length_ft),
				rows: v.rows_per_bed,
				inRowSpacingIn: v.in_row_spacing_in,
				seedsPerSpot: v.seeds_per_spot,
				germinationRate: v.germination_rate,
				seedsPerGram: v.seeds_per_gram,
				margin: v.margin,
				cellsPerTray: v.cells_per_tray
			}).seeds;
			expect(r.seeds_needed).toBe(expected);
		}
	});

	it('plans around the garlic already in the ground, and reports the garlic weeks it cannot supply', async () => {
		const garlic = DEMO_FALL_PLANTINGS_2026.filter((p) => p.variety === 'Hardneck Blush');
		expect(garlic.map((g) => g.bed).sort()).toEqual(['S12', 'S13']);
		// Garlic is dug by 25 July; with the farm's 7 turnaround days its beds are free from 2 August.
		const onGarlicBeds = await db('plantings as p')
			.join('beds as b', 'b.id', 'p.bed_id')
			.where('p.season_id', await seasonId(2027))
			.whereIn('b.name', ['S12', 'S13'])
			.select<{ field_date: string }[]>('p.field_date');
		expect(onGarlicBeds.every((p) => p.field_date >= '2027-08-02')).toBe(true);
		const plan = planDemoSeason();
		expect(plan.plantings.some((p) => p.cropId === 'Garlic')).toBe(false);
		// The garlic harvest (W28–W29) comes before the boxes take it (W30 on); those weeks stay short, with a warning.
		const garlicShort = plan.shortfall.filter((s) => s.crop === 'Garlic');
		expect(garlicShort.length).toBeGreaterThan(0);
		expect(garlicShort.every((s) => s.week >= '2027-W30')).toBe(true);
		expect(plan.warnings).toContainEqual(expect.objectContaining({ code: 'unreachable_week', cropId: 'Garlic' }));
		// Every other crop's targets are met, but for early weeks the plan reports out of reach (some
		// plantings may still wait for a bed): a sowing for them would go into April weeks colder than
		// the crop's base temperature.
		const unreachable = new Set(
			plan.warnings
				.filter((w) => w.code === 'unreachable_week')
				.flatMap((w) => (w.weeks ?? []).map((wk) => `${w.cropId}|${wk}`))
		);
		const short = plan.shortfall.filter((s) => s.crop !== 'Garlic' && !unreachable.has(`${s.crop}|${s.week}`));
		expect(short).toEqual([]);
		expect(plan.shortfall.filter((s) => s.crop !== 'Garlic').every((s) => s.week < '2027-W24')).toBe(true);
	});

	it('never puts two plantings on the same bed-feet at the same time (turnaround included)', async () => {
		const rows = await db<PlantingRow>('plantings').where({ farm_id: farmId }).whereNotNull('bed_id');
		const addDays = (d: string, n: number): string =>
			new Date(Date.parse(`${d}T00:00:00Z`) + n * 86_400_000).toISOString().slice(0, 10);
		const clashes: string[] = [];
		const byBed = new Map<number | null, PlantingRow[]>();
		for (const p of rows) byBed.set(p.bed_id, [...(byBed.get(p.bed_id) ?? []), p]);
		for (const list of byBed.values()) {
			for (let i = 0; i < list.length; i++) {
				for (let j = i + 1; j < list.length; j++) {
					const a = list[i];
					const b = list[j];
					const feet =
						Number(a.start_ft) < Number(b.start_ft) + Number(b.length_ft) &&
						Number(b.start_ft) < Number(a.start_ft) + Number(a.length_ft);
					const time = a.field_date <= addDays(b.last_harvest, 7) && b.field_date <= addDays(a.last_harvest, 7);
					if (feet && time) clashes.push(`${a.id}×${b.id}`);
				}
			}
		}
		expect(clashes).toEqual([]);
	});

	it('gives the week of 2026-12-02 (2026-W49) field work and harvests from the short 2026 season', async () => {
		const rows = await db<PlantingRow>('plantings').where({ season_id: await seasonId(2026) });
		expect(rows.length).toBeGreaterThanOrEqual(4);
		const inWeeks = (d: string): boolean => d >= '2026-11-23' && d <= '2026-12-20';
		expect(rows.some((p) => inWeeks(p.field_date))).toBe(true);
		expect(rows.some((p) => p.first_harvest <= '2026-12-06' && p.last_harvest >= '2026-11-30')).toBe(true);
		const harvests = await db('harvest_records').where({ farm_id: farmId });
		expect(harvests.length).toBeGreaterThan(3);
		expect(harvests.every((h) => h.harvested_on >= '2026-11-01' && h.harvested_on <= '2026-12-02')).toBe(true);
	});

	it('reuses the farm when seeded again, so one demo farm remains', async () => {
		const again = await ensureDemoFarm(db);
		expect(again).toEqual({ farmId, created: false });
		const out = execFileSync('npx', ['tsx', 'scripts/seed.ts', DATABASE], { encoding: 'utf8', env: process.env });
		expect(out).toMatch(/reused existing demo farm/);
		expect(await count(db('farms').where({ name: DEMO_FARM.name }))).toBe(1);
		expect(
			await count(
				db('users').whereIn(
					'email',
					DEMO_USERS.map((u) => u.email)
				)
			)
		).toBe(3);
	});

	it('--reset replaces the demo farm with a fresh one, still only one', async () => {
		const out = execFileSync('npx', ['tsx', 'scripts/seed.ts', DATABASE, '--reset'], {
			encoding: 'utf8',
			env: process.env
		});
		expect(out).toMatch(/reset and seeded/);
		const fresh = await findDemoFarm(db);
		expect(fresh).not.toBe(farmId);
		expect(await count(db('farms').where({ name: DEMO_FARM.name }))).toBe(1);
		expect(await count(db('farms'))).toBe(1);
		expect(await count(db('users'))).toBe(3);
	});
});
