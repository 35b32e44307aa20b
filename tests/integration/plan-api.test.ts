// The plan routes: preview runs the engine and writes nothing; apply replaces the season's
// planned plantings in one transaction and keeps what is already sown.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { forecast, deriveTargets, type HarvestCurve } from '../../src/lib/planning';
import { forecastFromWeeklySupply } from '../../src/lib/planning/forecast';
import { throughStores } from '../../src/lib/planning/storage';
import { Client, signedIn } from '../helpers/http';
import { closeTestDb, count, testDb, uniqueEmail } from '../helpers/db';
import { demo } from '../helpers/env';
import { confirmedSignUp } from '../helpers/signup';

afterAll(closeTestDb);

let seasonId: number;
let farmId: number;
let owner: Client;
beforeAll(async () => {
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	seasonId = (await testDb()('seasons').where({ farm_id: farmId, year: 2027 }).first('id')).id;
	owner = await signedIn(demo.owner, demo.password);
});

const preview = () => `/api/seasons/${seasonId}/plan/preview`;
const apply = () => `/api/seasons/${seasonId}/plan/apply`;

/** Weekly targets per crop id, derived here from the season's demand rows. */
async function demandTargets() {
	const shares = await testDb()('share_sizes').where({ season_id: seasonId });
	const items = await testDb()('box_items').whereIn(
		'share_size_id',
		shares.map((s) => s.id)
	);
	const channels = await testDb()('channel_demand').where({ season_id: seasonId });
	return deriveTargets({
		shareSizes: shares.map((s) => ({
			id: String(s.id),
			members: s.members,
			firstWeek: s.first_week,
			lastWeek: s.last_week
		})),
		boxItems: items.map((i) => ({
			shareSizeId: String(i.share_size_id),
			week: i.week,
			crop: String(i.crop_id),
			quantity: Number(i.quantity)
		})),
		channelDemand: channels.map((c) => ({ crop: String(c.crop_id), week: c.week, quantity: Number(c.quantity) }))
	});
}

/** The farm's storage crops: weeks a harvest keeps and the weekly loss. */
async function cropStores() {
	return (await testDb()('crops').where({ farm_id: farmId }).where('storage_weeks', '>', 0)).map((c) => ({
		crop: String(c.id),
		keepWeeks: Number(c.storage_weeks),
		lossPerWeek: Number(c.storage_loss_per_week ?? 0)
	}));
}

describe('who may plan', () => {
	it('no session: 401', async () => {
		expect((await new Client().json(preview(), 'POST', {})).status).toBe(401);
		expect((await new Client().json(apply(), 'POST', {})).status).toBe(401);
	});
	it('crew lead and share manager: 403, and nothing changes', async () => {
		const before = await count('plantings', { season_id: seasonId });
		for (const who of [demo.crew, demo.share]) {
			const client = await signedIn(who, demo.password);
			expect((await client.json(preview(), 'POST', {})).status).toBe(403);
			expect((await client.json(apply(), 'POST', {})).status).toBe(403);
		}
		expect(await count('plantings', { season_id: seasonId })).toBe(before);
	});
	it("another farm's owner: 404 for this farm's season", async () => {
		const other = new Client();
		await confirmedSignUp(other, {
			name: 'Other',
			email: uniqueEmail('plan'),
			password: 'long-enough-pass',
			farmName: 'Elsewhere (invented)',
			latitude: '41',
			lastSpringFrost: '2027-05-01',
			firstFallFrost: '2027-10-01'
		});
		expect((await other.json(apply(), 'POST', {})).status).toBe(404);
	});
});

describe('bad input names the field', () => {
	const cases: [unknown, string][] = [
		[{ intervalWeeks: 9 }, 'intervalWeeks'],
		[{ intervalWeeks: 1.5 }, 'intervalWeeks'],
		[{ margin: 'lots' }, 'margin'],
		[{ varietyPlan: { carrots: [{ varietyId: 1 }] } }, 'varietyPlan.carrots'],
		[{ varietyPlan: { '1': [{ varietyId: 1, fraction: 2 }] } }, 'varietyPlan.1.0.fraction'],
		[{ surprise: true }, '_form']
	];
	for (const [body, field] of cases) {
		it(`${JSON.stringify(body)} -> 400 naming ${field}`, async () => {
			const res = await owner.json(preview(), 'POST', body);
			expect(res.status).toBe(400);
			const out = await res.json();
			expect(Object.keys(out.errors)).toContain(field);
		});
	}
	it('a body that is not JSON -> 400', async () => {
		const res = await owner.request(preview(), {
			method: 'POST',
			body: '{not json',
			headers: { origin: process.env.FC_BASE_URL!, 'content-type': 'application/json' }
		});
		expect(res.status).toBe(400);
	});
});

describe('preview', () => {
	it("keeps clear of another season's plantings still in their beds (the fall's garlic)", async () => {
		// Overlap worked here from the rows, as the bed timeline counts it: same bed, feet that
		// overlap, and days from field date through last harvest plus the farm's turnaround days.
		const { turnaround_days: turnaround } = await testDb()('farms').where({ id: farmId }).first('turnaround_days');
		const season = await testDb()('seasons').where({ id: seasonId }).first('starts_on', 'ends_on');
		const day = (d: string | Date): number =>
			Date.parse(`${String(d instanceof Date ? d.toISOString() : d).slice(0, 10)}T00:00:00Z`) / 86_400_000;
		const others = (
			await testDb()('plantings')
				.where({ farm_id: farmId })
				.whereNot({ season_id: seasonId })
				.whereNotNull('bed_id')
				.whereNot({ status: 'failed' })
				.select('id', 'bed_id', 'start_ft', 'length_ft', 'field_date', 'last_harvest')
		).filter(
			(o) => day(o.field_date) <= day(season.ends_on) && day(o.last_harvest) + turnaround >= day(season.starts_on)
		);
		// The invented demo's 2026 garlic is dug in July 2027.
		expect(others.length).toBeGreaterThan(0);
		const res = await owner.json(preview(), 'POST', {});
		expect(res.status).toBe(200);
		const out = await res.json();
		const placed = out.plantings.filter((p: { bedId: string | null }) => p.bedId !== null);
		expect(placed.length).toBeGreaterThan(20);
		for (const p of placed as {
			key: string;
			bedId: string;
			startFt: number;
			lengthFt: number;
			fieldDate: string;
			lastHarvest: string;
		}[]) {
			for (const o of others) {
				if (String(o.bed_id) !== p.bedId) continue;
				const feet =
					p.startFt < Number(o.start_ft) + Number(o.length_ft) && Number(o.start_ft) < p.startFt + p.lengthFt;
				const days =
					day(p.fieldDate) <= day(o.last_harvest) + turnaround && day(o.field_date) <= day(p.lastHarvest) + turnaround;
				expect(feet && days, `${p.key} in bed ${p.bedId} overlaps planting ${o.id} of another season`).toBe(false);
			}
		}
	});

	it('proposes plantings that meet every reachable target week, and writes nothing', async () => {
		const before = await testDb()('plantings').where({ season_id: seasonId }).select('id', 'version').orderBy('id');
		const res = await owner.json(preview(), 'POST', { intervalWeeks: 2 });
		expect(res.status).toBe(200);
		const out = await res.json();
		expect(out.plantings.length).toBeGreaterThan(20);
		expect(await testDb()('plantings').where({ season_id: seasonId }).select('id', 'version').orderBy('id')).toEqual(
			before
		);

		// Check the proposal independently: targets derived here from the rows in the database,
		// supply from the proposal (placed and unplaced alike), shortfall as the engine reported it.
		const targets = await demandTargets();
		// Kept: this season's plantings already under way, and other seasons' plantings harvesting
		// in this season (the garlic planted last autumn).
		const kept = await testDb()('plantings as p')
			.join('varieties as v', 'v.id', 'p.variety_id')
			.where('p.farm_id', farmId)
			.whereNot('p.status', 'failed')
			.where((q) =>
				q
					.where((q2) => q2.where('p.season_id', seasonId).whereNot('p.status', 'planned'))
					.orWhere((q2) => q2.whereNot('p.season_id', seasonId).where('p.last_harvest', '>=', '2027-01-01'))
			)
			.select('v.crop_id', 'p.first_harvest', 'p.last_harvest', 'p.length_ft', 'v.yield_per_bed_foot');
		const stores = await cropStores();
		const yieldOf = new Map(
			(await testDb()('varieties').where({ farm_id: farmId })).map((v) => [String(v.id), Number(v.yield_per_bed_foot)])
		);
		const harvested = forecast(
			[
				...out.plantings.map(
					(p: {
						cropId: string;
						varietyId: string;
						firstHarvest: string;
						lastHarvest: string;
						lengthFt: number;
						harvestWindowDays: number;
						curve?: HarvestCurve;
					}) => ({
						crop: p.cropId,
						firstHarvest: p.firstHarvest,
						lastHarvest: p.lastHarvest,
						bedFeet: p.lengthFt,
						yieldPerBedFoot: yieldOf.get(p.varietyId)!,
						// A harvest cut short at the last target week yields its share of the variety's window.
						windowDays: p.harvestWindowDays,
						curve: p.curve
					})
				),
				...kept.map((k) => ({
					crop: String(k.crop_id),
					firstHarvest: k.first_harvest,
					lastHarvest: k.last_harvest,
					bedFeet: Number(k.length_ft),
					yieldPerBedFoot: Number(k.yield_per_bed_foot)
				}))
			],
			[]
		);
		// Storage crops are sold from store, as the forecast shows them (garlic dug in July feeds the autumn).
		const supply = forecastFromWeeklySupply(
			throughStores(
				harvested.map((r) => ({ crop: r.crop, week: r.week, quantity: r.supply })),
				targets,
				stores
			),
			targets
		);
		const reported = new Map<string, number>(
			out.shortfall.map((s: { crop: string; week: string; quantity: number }) => [`${s.crop} ${s.week}`, s.quantity])
		);
		let weeksChecked = 0;
		for (const row of supply) {
			if (row.demand === 0) continue;
			weeksChecked++;
			const allowed = reported.get(`${row.crop} ${row.week}`) ?? 0;
			expect(row.shortfall, `${row.crop} ${row.week}`).toBeLessThanOrEqual(allowed + 1e-6);
		}
		expect(weeksChecked).toBeGreaterThan(100);
	});
});

describe('apply', () => {
	it("the owner's plan of the demo season fits its demand: supply ÷ demand median ≤ 1.15, max ≤ 1.30, no reachable week short", async () => {
		// The acceptance figures of the plan, measured on what apply wrote: per crop, the season
		// year's harvest from every planting harvesting in it (this season's and last autumn's),
		// each spread by its variety's curve (the crop's unless the variety overrides it), against
		// the weekly targets derived here from the demand rows. A week is short when what it gets
		// (from store for a storage crop) is under demand × 1.1 and the plan did not report it out of
		// reach. Source of the figures: the plan-quality acceptance (common practice: a 10 % margin).
		const res = await owner.json(apply(), 'POST', {});
		expect(res.status).toBe(200);
		const out = await res.json();
		const unreachable = new Set<string>(
			(out.warnings as { code: string; cropId: string; weeks?: string[] }[])
				.filter((w) => w.code === 'unreachable_week')
				.flatMap((w) => (w.weeks ?? []).map((week) => `${w.cropId} ${week}`))
		);
		const targets = await demandTargets();
		const rows = await testDb()('plantings as p')
			.join('varieties as v', 'v.id', 'p.variety_id')
			.join('crops as c', 'c.id', 'v.crop_id')
			.where('p.farm_id', farmId)
			.whereNot('p.status', 'failed')
			.where('p.last_harvest', '>=', '2027-01-01')
			.where('p.first_harvest', '<=', '2027-12-31')
			.select(
				'v.crop_id',
				'p.first_harvest',
				'p.last_harvest',
				'p.length_ft',
				'v.yield_per_bed_foot',
				'v.harvest_window_days',
				'v.harvest_curve as variety_curve',
				'c.harvest_curve as crop_curve',
				'c.harvest_cut_interval_days'
			);
		const iso = (d: string | Date): string => (d instanceof Date ? d.toISOString() : String(d)).slice(0, 10);
		const harvested = forecast(
			rows.map((r) => {
				const shape = (r.variety_curve ?? r.crop_curve) as HarvestCurve['shape'];
				const curve: HarvestCurve = { shape };
				if (shape === 'cuts' && r.harvest_cut_interval_days !== null) curve.intervalDays = r.harvest_cut_interval_days;
				return {
					crop: String(r.crop_id),
					firstHarvest: iso(r.first_harvest),
					lastHarvest: iso(r.last_harvest),
					bedFeet: Number(r.length_ft),
					yieldPerBedFoot: Number(r.yield_per_bed_foot),
					windowDays: Number(r.harvest_window_days),
					curve
				};
			}),
			targets
		).filter((r) => r.week.startsWith('2027-'));
		// A store gives a week at most what it asks; asked demand × 1.1, it gives that where it can.
		const wanted = targets.map((t) => ({ ...t, quantity: t.quantity * 1.1 }));
		const given = forecastFromWeeklySupply(
			throughStores(
				harvested.map((r) => ({ crop: r.crop, week: r.week, quantity: r.supply })),
				wanted,
				await cropStores()
			),
			wanted
		);
		const supply = new Map<string, number>();
		const demand = new Map<string, number>();
		for (const r of harvested) {
			supply.set(r.crop, (supply.get(r.crop) ?? 0) + r.supply);
			demand.set(r.crop, (demand.get(r.crop) ?? 0) + r.demand);
		}
		const ratios = [...demand.entries()]
			.filter(([, d]) => d > 0)
			.map(([crop, d]) => (supply.get(crop) ?? 0) / d)
			.sort((a, b) => a - b);
		expect(ratios.length).toBeGreaterThanOrEqual(15);
		const mid = ratios.length >> 1;
		const median = ratios.length % 2 ? ratios[mid] : (ratios[mid - 1] + ratios[mid]) / 2;
		expect(median).toBeLessThanOrEqual(1.15);
		expect(ratios[ratios.length - 1]).toBeLessThanOrEqual(1.3);
		const short = given
			.filter((r) => r.week.startsWith('2027-') && r.demand > 0 && r.supply < r.demand * (1 - 1e-9))
			.map((r) => `${r.crop} ${r.week}`)
			.filter((k) => !unreachable.has(k));
		expect(short).toEqual([]);
	});

	it('keeps a sown planting untouched, replaces the planned ones, and reports what changed', async () => {
		const sown = await testDb()('plantings')
			.where({ season_id: seasonId, status: 'planned' })
			.whereNotNull('bed_id')
			.orderBy('field_date')
			.first();
		await testDb()('plantings').where({ id: sown.id }).update({ status: 'sown', actual_field_date: sown.field_date });
		const keptBefore =
			(await count('plantings', { season_id: seasonId })) -
			(await count('plantings', { season_id: seasonId, status: 'planned' }));
		const plannedBefore = await testDb()('plantings').where({ season_id: seasonId, status: 'planned' }).pluck('id');

		const res = await owner.json(apply(), 'POST', {});
		expect(res.status).toBe(200);
		const out = await res.json();
		expect(out.kept).toBe(keptBefore);
		expect(out.removed).toBe(plannedBefore.length);

		const after = await testDb()('plantings').where({ season_id: seasonId });
		expect(after.length).toBe(out.kept + out.added);
		expect(after.find((p) => p.id === sown.id)).toMatchObject({
			status: 'sown',
			bed_id: sown.bed_id,
			start_ft: sown.start_ft,
			version: sown.version
		});
		expect(after.some((p) => plannedBefore.includes(p.id))).toBe(false);
		// The new plan works around the kept planting: no new planting shares its bed-feet and dates.
		const clash = after.filter(
			(p) =>
				p.id !== sown.id &&
				p.bed_id === sown.bed_id &&
				p.field_date <= sown.last_harvest &&
				p.last_harvest >= sown.field_date &&
				Number(p.start_ft) < Number(sown.start_ft) + Number(sown.length_ft) &&
				Number(p.start_ft) + Number(p.length_ft) > Number(sown.start_ft)
		);
		expect(clash).toEqual([]);
	});
});
