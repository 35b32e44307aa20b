// Every writer of a season's plantings queues on the one season lock plan apply takes: harvest
// logging (which moves a planting to harvesting) and an import's season update race a plan apply
// here. Each answer is 2xx or a refusal (4xx), never 500, and nothing is planted twice or lost.
// Several trials each, started at a different point, on a small invented plan of the test's own.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, testDb } from '../helpers/db';
import { download, loadWorkbook, signUpFarm, upload, writeHandPlan, type NewFarm } from '../helpers/transfer';

afterAll(closeTestDb);

async function farmWithDemand(tag: string): Promise<{ farm: NewFarm; seasonId: number }> {
	const farm = await signUpFarm(tag);
	const { seasonId } = await writeHandPlan(farm.farmId);
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
	return { farm, seasonId };
}

/** Groups of plantings that are the same planting twice: same variety, dates and bed range. */
async function duplicates(farmId: number, seasonId: number): Promise<string[]> {
	const rows: Record<string, unknown>[] = await testDb()('plantings')
		.where({ farm_id: farmId, season_id: seasonId })
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

const addDays = (iso: string, n: number): string =>
	new Date(Date.parse(`${iso}T00:00:00Z`) + n * 86_400_000).toISOString().slice(0, 10);

describe('harvest logging against plan apply', () => {
	let farm: NewFarm;
	let seasonId: number;
	beforeAll(async () => {
		({ farm, seasonId } = await farmWithDemand('lock-harvest'));
	});

	it('answers 2xx or 4xx, never 500; every logged harvest keeps its planting, none is planted twice', async () => {
		const apply = () => farm.client.json(`/api/seasons/${seasonId}/plan/apply`, 'POST', {});
		const today: string = (await (await farm.client.get(`/api/seasons/${seasonId}/harvests`)).json()).today;
		let logged = 0;
		for (let trial = 0; trial < 8; trial++) {
			expect((await apply()).status).toBe(200);
			// The planned plantings went in the field ten days ago, so a harvest can be logged today.
			const planned: { id: number; unit: string }[] = await testDb()('plantings as p')
				.join('varieties as v', 'v.id', 'p.variety_id')
				.join('crops as c', 'c.id', 'v.crop_id')
				.where({ 'p.farm_id': farm.farmId, 'p.season_id': seasonId, 'p.status': 'planned' })
				.select('p.id', 'c.harvest_unit as unit');
			expect(planned.length).toBeGreaterThan(2);
			await testDb()('plantings')
				.whereIn(
					'id',
					planned.map((p) => p.id)
				)
				.update({ tray_sow_date: null, field_date: addDays(today, -10) });
			const before = await testDb()('harvest_records').where({ farm_id: farm.farmId }).count({ n: '*' }).first();
			const logs = planned.map(
				(p) => () =>
					farm.client.json(`/api/seasons/${seasonId}/harvests`, 'POST', {
						plantingId: p.id,
						harvestedOn: today,
						quantity: 3,
						unit: p.unit
					})
			);
			const at = trial % (planned.length + 1);
			const results = await Promise.all([
				...logs.slice(0, at).map((f) => f()),
				apply(),
				...logs.slice(at).map((f) => f())
			]);
			const statuses = results.map((r) => r.status);
			for (const s of statuses) expect([200, 201, 400, 404, 409], statuses.join(',')).toContain(s);
			const made = results.filter((r) => r.url.endsWith('/harvests') && r.status === 201).length;
			logged += made;
			// Every 201 is one record, on a planting still there and now harvesting; no refused one wrote.
			const after: { id: number; planting_id: number }[] = await testDb()('harvest_records')
				.where({ farm_id: farm.farmId })
				.select('id', 'planting_id');
			expect(after.length).toBe(Number(before?.n ?? 0) + made);
			const harvested = await testDb()('plantings')
				.whereIn(
					'id',
					after.map((h) => h.planting_id)
				)
				.select('id', 'status');
			expect(new Set(harvested.map((p) => p.id)).size).toBe(new Set(after.map((h) => h.planting_id)).size);
			for (const p of harvested) expect(p.status).toBe('harvesting');
			expect(await duplicates(farm.farmId, seasonId)).toEqual([]);
			// Back to a clean slate for the next trial: no records, every planting planned again.
			await testDb()('harvest_records').where({ farm_id: farm.farmId }).delete();
			await testDb()('plantings')
				.where({ farm_id: farm.farmId, season_id: seasonId, status: 'harvesting' })
				.update({ status: 'planned', actual_first_harvest: null });
		}
		// The race happened: some harvests got in around the applies.
		expect(logged).toBeGreaterThan(0);
	});
});

describe('an import season update against plan apply', () => {
	let farm: NewFarm;
	let seasonId: number;
	beforeAll(async () => {
		({ farm, seasonId } = await farmWithDemand('lock-import'));
	});

	it('answers 200 or 409, never 500, and leaves one whole write', async () => {
		let imported = 0;
		for (let trial = 0; trial < 6; trial++) {
			const apply = () => farm.client.json(`/api/seasons/${seasonId}/plan/apply`, 'POST', {});
			expect((await apply()).status).toBe(200);
			// The season's own workbook with a note changed on every planting: a preview of changes.
			const wb = await loadWorkbook((await download(farm.client, seasonId)).bytes);
			const sheet = wb.getWorksheet('Plantings')!;
			const notes = (sheet.getRow(1).values as unknown[]).findIndex((v) => v === 'Notes');
			expect(notes).toBeGreaterThan(0);
			for (let r = 2; r <= sheet.rowCount; r++)
				if (sheet.getRow(r).getCell(1).value) sheet.getRow(r).getCell(notes).value = `trial ${trial}`;
			const file = Buffer.from(await wb.xlsx.writeBuffer());
			const preview = await upload(farm.client, 'plan.xlsx', file, { seasonId: String(seasonId) });
			const body = await preview.json();
			expect(preview.status, JSON.stringify(body)).toBe(200);
			const token: string = body.preview.token;
			expect(token).toBeTruthy();
			const importApply = () => farm.client.json('/api/import/apply', 'POST', { token });
			const [a, b] =
				trial % 2 ? await Promise.all([importApply(), apply()]) : await Promise.all([apply(), importApply()]);
			const ia = trial % 2 ? a : b;
			const pa = trial % 2 ? b : a;
			expect([200, 409], `import ${ia.status}: ${await ia.clone().text()}`).toContain(ia.status);
			expect([200, 409], `apply ${pa.status}: ${await pa.clone().text()}`).toContain(pa.status);
			expect(await duplicates(farm.farmId, seasonId)).toEqual([]);
			const rows: { notes: string | null; status: string }[] = await testDb()('plantings')
				.where({ farm_id: farm.farmId, season_id: seasonId })
				.select('notes', 'status');
			const noted = rows.filter((r) => r.notes === `trial ${trial}`).length;
			if (ia.status === 200) {
				imported++;
				// Whole or none: the import's notes are on every kept planting, or the apply replaced them all.
				expect([0, rows.filter((r) => r.status !== 'planned').length, rows.length]).toContain(noted);
			} else expect(noted).toBe(0);
		}
		expect(imported).toBeGreaterThan(0);
	});
});
