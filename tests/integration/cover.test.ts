// Who covers a planting's weeks: GET /api/plantings/{id}/cover (the grid's explain panel) and the
// plan preview's `cover`, on the small invented farm of forecast-fixture.ts plus one carrot planting
// of the 2026 season harvesting in 2027's weeks. The figures are worked out by hand below.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, signedIn } from '../helpers/http';
import { closeTestDb, testDb } from '../helpers/db';
import { demo } from '../helpers/env';
import { addCarryOverCarrot, makeForecastFarm, type ForecastFarm } from './forecast-fixture';
import type { PlantingCoverAnswer } from '$lib/server/cover';
import type { PreviewCover } from '$lib/server/plan-cover';
import { successionCover } from '$lib/planning/cover';

afterAll(closeTestDb);

let f: ForecastFarm;
let carryOver: number;
beforeAll(async () => {
	f = await makeForecastFarm('cover');
	// 8 lb in 2027-W24 and 6 lb in W25 (worked out beside addCarryOverCarrot).
	carryOver = await addCarryOverCarrot(f, { bedId: null, startFt: 0 });
});

describe('GET /api/plantings/{id}/cover', () => {
	it("gives each harvest week's need, this planting's share and the others'", async () => {
		const res = await f.client.get(`/api/plantings/${f.plantings.carrot}/cover`);
		expect(res.status).toBe(200);
		const a = (await res.json()) as PlantingCoverAnswer;
		expect(a.crop).toMatchObject({ id: f.crops.carrot, unit: 'lb', stored: false });
		expect(a.season.id).toBe(f.season2027);
		// Planting A: 10 ft × 2 lb/ft over its 7 days, 14 – 20 Jun = 20 lb, all in W24.
		// W24's need: Full 10 members × 2 lb + Half 5 × 1 lb = 25 lb. Others: the 2026 planting's 8 lb;
		// the failed 100-ft planting gives nothing. 20 + 8 = 28 lb, 3 lb over.
		expect(a.weeks).toHaveLength(1);
		const [w] = a.weeks;
		expect(w.week).toBe('2027-W24');
		expect(w.target).toBeCloseTo(25, 9);
		expect(w.own).toBeCloseTo(20, 9);
		expect(w.others).toHaveLength(1);
		expect(w.others[0].id).toBe(carryOver);
		expect(w.others[0].quantity).toBeCloseTo(8, 9);
		expect(w.supply).toBeCloseTo(28, 9);
		expect(w.surplus).toBeCloseTo(3, 9);
		expect(w.gap).toBe(0);
		expect(a.plantings).toEqual([
			expect.objectContaining({ id: carryOver, otherSeason: '2026 test season', fieldDate: '2026-10-01' })
		]);
	});

	it("last season's planting is weighed against the season it harvests in", async () => {
		// Its harvest falls in 2027: 2027's need and plantings. W24: its 8 lb beside planting A's 20 lb
		// against 25 lb (3 over); W25: its 6 lb, no need that week (the shares run W24 – W25 only).
		const a = (await (await f.client.get(`/api/plantings/${carryOver}/cover`)).json()) as PlantingCoverAnswer;
		expect(a.season.id).toBe(f.season2027);
		expect(a.weeks.map((w) => w.week)).toEqual(['2027-W24', '2027-W25']);
		expect(a.weeks[0].own).toBeCloseTo(8, 9);
		expect(a.weeks[0].others).toEqual([{ id: f.plantings.carrot, quantity: expect.closeTo(20, 9) }]);
		expect(a.weeks[0].surplus).toBeCloseTo(3, 9);
		expect(a.weeks[1]).toMatchObject({ target: 0, others: [] });
		expect(a.weeks[1].surplus).toBeCloseTo(6, 9);
		expect(a.plantings[0]).toMatchObject({ id: f.plantings.carrot, otherSeason: null });
	});

	it('the crew lead of the demo farm reads it; a stranger, another farm or a bad id gets 401 or 404', async () => {
		const u = await testDb()('users').where({ email: demo.owner }).first('id');
		const farm = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
		const p = await testDb()('plantings').where({ farm_id: farm }).first('id');
		const crew = await signedIn(demo.crew, demo.password);
		const res = await crew.get(`/api/plantings/${p.id}/cover`);
		expect(res.status).toBe(200);
		expect(Array.isArray(((await res.json()) as PlantingCoverAnswer).weeks)).toBe(true);
		expect((await new Client().get(`/api/plantings/${p.id}/cover`)).status).toBe(401);
		expect((await f.client.get(`/api/plantings/${p.id}/cover`)).status).toBe(404);
		expect((await f.client.get('/api/plantings/abc/cover')).status).toBe(404);
		expect((await f.client.get('/api/plantings/99999999999999999999/cover')).status).toBe(404);
	});
});

describe("the plan preview's cover", () => {
	it('names every succession of a crop-week, the other season included, and their shares add up', async () => {
		const res = await f.client.json(`/api/seasons/${f.season2027}/plan/preview`, 'POST', {});
		expect(res.status).toBe(200);
		const body = (await res.json()) as {
			cover: Omit<PreviewCover, 'balance'>;
			plantings: { cropId: string; firstHarvest: string }[];
			changes: {
				added: { key?: string; cropId: number }[];
				balance: { cropId: number; weeks: string[]; demand: number[]; before: number[]; after: number[] }[];
			};
		};
		const carrot = body.cover.crops.find((c) => c.crop === String(f.crops.carrot));
		expect(carrot).toBeDefined();
		// The need the plan sizes for: 25 lb in W24 (no box swaps here).
		expect(carrot!.target[carrot!.weeks.indexOf('2027-W24')]).toBeCloseTo(25, 9);
		// The 2026 planting stays (it is another season's) and gives its 8 lb in W24 and 6 in W25.
		const kept = carrot!.plantings.find((p) => p.key === `p${carryOver}`)!;
		expect(kept.share[carrot!.weeks.indexOf('2027-W24')]).toBeCloseTo(8, 9);
		expect(kept.share[carrot!.weeks.indexOf('2027-W25')]).toBeCloseTo(6, 9);
		expect(body.cover.labels[`p${carryOver}`]).toMatchObject({ otherSeason: '2026 test season' });
		// The planned carrot planting A is replaced: only proposed (n…) and kept (p…) keys remain.
		expect(carrot!.plantings.some((p) => p.key === `p${f.plantings.carrot}`)).toBe(false);
		// Every added carrot succession is explained: its weeks, the others', and they sum to the week's supply.
		const added = body.changes.added.filter((r) => r.cropId === f.crops.carrot);
		expect(added.length).toBeGreaterThan(0);
		for (const r of added) {
			const weeks = successionCover(carrot!, r.key!);
			expect(weeks.length).toBeGreaterThan(0);
			for (const w of weeks) {
				const i = carrot!.weeks.indexOf(w.week);
				const all = carrot!.plantings.reduce((s, p) => s + p.share[i], 0);
				expect(w.own + w.others.reduce((s, o) => s + o.quantity, 0)).toBeCloseTo(all, 9);
				expect(w.target).toBe(carrot!.target[i]);
			}
		}
		// The plan covers W24's 25 lb + 10 % margin with the 8 lb already there: no shortfall that week.
		const i24 = carrot!.weeks.indexOf('2027-W24');
		const after24 = carrot!.plantings.reduce((s, p) => s + p.share[i24], 0);
		expect(after24).toBeGreaterThanOrEqual(25 * 1.1 - 1e-9);
		// The preview's chart says the same: now, planting A's 20 lb + the 2026 planting's 8 lb = 28 lb
		// (the failed 100-ft planting gives nothing); after, the cover's sum.
		const chart = body.changes.balance.find((b) => b.cropId === f.crops.carrot)!;
		const c24 = chart.weeks.indexOf('2027-W24');
		expect(chart.demand[c24]).toBeCloseTo(25, 9);
		expect(chart.before[c24]).toBeCloseTo(28, 9);
		expect(chart.after[c24]).toBeCloseTo(after24, 9);
	});
});
