// Plan apply computes and writes under one lock on the season: racing it with status changes must
// never plant a kept planting twice. Several trials, each on a fresh copy of a small invented plan.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, testDb } from '../helpers/db';
import { signUpFarm, writeHandPlan, type NewFarm } from '../helpers/transfer';

afterAll(closeTestDb);

let farm: NewFarm;
let seasonId: number;
beforeAll(async () => {
	farm = await signUpFarm('plan-race');
	({ seasonId } = await writeHandPlan(farm.farmId));
	// More demand, so the plan has several plantings to race over.
	const crops: { id: number; name: string }[] = await testDb()('crops')
		.where({ farm_id: farm.farmId })
		.select('id', 'name');
	const lettuce = crops.find((c) => c.name === 'Head lettuce')!.id;
	const carrot = crops.find((c) => c.name === 'Carrot')!.id;
	const rows = [];
	for (let w = 22; w <= 36; w++) {
		const week = `2027-W${w}`;
		rows.push({ farm_id: farm.farmId, season_id: seasonId, channel: 'market', crop_id: lettuce, week, quantity: 40 });
		rows.push({
			farm_id: farm.farmId,
			season_id: seasonId,
			channel: 'restaurant',
			crop_id: carrot,
			week,
			quantity: 25
		});
	}
	await testDb()('channel_demand').insert(rows);
});

/** Groups of plantings that are the same planting twice: same variety, dates and bed range. */
async function duplicates(): Promise<string[]> {
	const rows: Record<string, unknown>[] = await testDb()('plantings')
		.where({ farm_id: farm.farmId, season_id: seasonId })
		.whereNot({ status: 'failed' })
		.select('variety_id', 'field_date', 'first_harvest', 'bed_id', 'start_ft', 'length_ft');
	const seen = new Map<string, number>();
	for (const r of rows) {
		const key = JSON.stringify([
			r.variety_id,
			r.field_date,
			r.first_harvest,
			r.bed_id,
			Number(r.start_ft),
			Number(r.length_ft)
		]);
		seen.set(key, (seen.get(key) ?? 0) + 1);
	}
	return [...seen].filter(([, n]) => n > 1).map(([k]) => k);
}

describe('plan apply against concurrent status changes', () => {
	it('never duplicates a planting, in any of 6 trials', async () => {
		const apply = () => farm.client.json(`/api/seasons/${seasonId}/plan/apply`, 'POST', {});
		let raced = 0;
		for (let trial = 0; trial < 6; trial++) {
			const first = await apply();
			expect(first.status).toBe(200);
			const planned: { id: number; version: number }[] = await testDb()('plantings')
				.where({ farm_id: farm.farmId, season_id: seasonId, status: 'planned' })
				.select('id', 'version');
			expect(planned.length).toBeGreaterThan(2);
			// Mark every planned planting sown while a second apply runs; start the apply at a different
			// point among the PATCHes in each trial.
			const patches = planned.map(
				(p) => () => farm.client.json(`/api/plantings/${p.id}`, 'PATCH', { version: p.version, status: 'sown' })
			);
			const at = trial % (planned.length + 1);
			const results = await Promise.all([
				...patches.slice(0, at).map((f) => f()),
				apply(),
				...patches.slice(at).map((f) => f())
			]);
			for (const r of results) expect([200, 404, 409]).toContain(r.status);
			const sown = results.filter((r) => r.url.includes('/api/plantings/') && r.status === 200).length;
			if (sown > 0) raced++;
			expect(await duplicates()).toEqual([]);
			// Back to a clean slate for the next trial.
			await testDb()('plantings')
				.where({ farm_id: farm.farmId, season_id: seasonId })
				.whereIn('status', ['sown'])
				.update({ status: 'planned' });
		}
		// The race happened: some status changes got in around the applies.
		expect(raced).toBeGreaterThan(0);
	});
});
