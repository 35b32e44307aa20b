// A storage crop feeds the weeks after it is dug: its harvest goes into store and each week's
// demand is taken from it (planning/storage.ts). The Forecast page's figures and the workbook's
// Forecast sheet agree. Checked by hand on a small invented plan.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, testDb } from '../helpers/db';
import { download, loadWorkbook, signUpFarm, writeHandPlan, type NewFarm } from '../helpers/transfer';

afterAll(closeTestDb);

let farm: NewFarm;
let seasonId: number;
let garlicId: number;
beforeAll(async () => {
	farm = await signUpFarm('storage');
	const hand = await writeHandPlan(farm.farmId);
	seasonId = hand.seasonId;
	garlicId = hand.cropIds.garlic;
	const db = testDb();
	// Invented figures: kept 10 weeks with no loss, so the arithmetic is plain.
	await db('crops').where({ id: garlicId }).update({ storage_weeks: 10, storage_loss_per_week: 0 });
	const [variety] = await db('varieties').insert({
		farm_id: farm.farmId,
		crop_id: garlicId,
		name: 'Test Keeper',
		method: 'direct',
		days_to_maturity: 240,
		days_in_tray: 0,
		harvest_window_days: 7,
		yield_per_bed_foot: 2,
		rows_per_bed: 4,
		in_row_spacing_in: 6,
		seeds_per_spot: 1,
		germination_rate: 0.95,
		seeds_per_gram: 0.2,
		seed_price_cents_per_gram: 3,
		seeds_per_packet: null,
		cells_per_tray: 128,
		margin: 0.05,
		gdd_to_maturity: null
	});
	const bed = await db('beds').where({ farm_id: farm.farmId, name: 'W1' }).first('id');
	// 50 ft × 2 heads = 100 heads, dug Mon 12 – Sun 18 Jul 2027 (ISO 2027-W28).
	await db('plantings').insert({
		farm_id: farm.farmId,
		season_id: seasonId,
		variety_id: variety,
		bed_id: bed.id,
		start_ft: 0,
		length_ft: 50,
		rows: 4,
		in_row_spacing_in: 6,
		seeds_per_spot: 1,
		method: 'direct',
		field_date: '2027-01-20',
		first_harvest: '2027-07-12',
		last_harvest: '2027-07-18',
		expected_yield: 100,
		seeds_needed: 440,
		status: 'planned'
	});
	// The market takes 30 heads a week in W30–W33: 120 asked for, 100 in store.
	for (const week of ['2027-W30', '2027-W31', '2027-W32', '2027-W33'])
		await db('channel_demand').insert({
			farm_id: farm.farmId,
			season_id: seasonId,
			channel: 'market',
			crop_id: garlicId,
			week,
			quantity: 30
		});
});

// Source: arithmetic by hand: 100 heads in store from W28; W30, W31, W32 take 30 each (10 left);
// W33 gets the last 10 and is 20 short; nothing is left over for W28 itself.
const want: [string, number, number][] = [
	['2027-W30', 30, 0],
	['2027-W31', 30, 0],
	['2027-W32', 30, 0],
	['2027-W33', 10, 20]
];

describe('a storage crop', () => {
	it('the forecast gives the dug garlic to the weeks after, oldest first, and is short only at the end', async () => {
		const api = await (await farm.client.get(`/api/seasons/${seasonId}/forecast`)).json();
		const rows = api.rows.filter((r: { crop: string }) => r.crop === String(garlicId));
		const at = (w: string) => rows.find((r: { week: string }) => r.week === w);
		expect(at('2027-W28')?.supply ?? 0).toBe(0);
		for (const [week, supply, shortfall] of want) expect(at(week), week).toMatchObject({ supply, shortfall });
	});

	it('says the weeks after the dig are sold from store, not from the field, in both answer shapes', async () => {
		// Dug in W28 and wanted from W30: every head those weeks get comes out of store.
		const api = await (await farm.client.get(`/api/seasons/${seasonId}/forecast`)).json();
		const rows = api.rows.filter((r: { crop: string }) => r.crop === String(garlicId));
		for (const [week, supply] of want)
			expect(rows.find((r: { week: string }) => r.week === week)?.fromStore, week).toBe(supply);
		const series = await (await farm.client.get(`/api/seasons/${seasonId}/forecast?shape=series`)).json();
		const garlic = series.series.find((s: { crop: string }) => s.crop === String(garlicId));
		const fromStore = want.map(([week]) => garlic.fromStore[series.weeks.indexOf(week)]);
		expect(fromStore).toEqual(want.map(([, supply]) => supply));
		// A crop that is not kept in store carries no such figures.
		const other = series.series.find((s: { crop: string }) => s.crop !== String(garlicId));
		expect(other).toBeDefined();
		expect(other.fromStore).toBeUndefined();
	});

	it("the workbook's Forecast sheet says the same", async () => {
		const wb = await loadWorkbook((await download(farm.client, seasonId)).bytes);
		const ws = wb.getWorksheet('Forecast')!;
		const head = (ws.getRow(1).values as unknown[]).slice(1).map(String);
		const cell = (n: number, h: string) => ws.getRow(n).getCell(head.indexOf(h) + 1).value;
		const garlic: [string, number, number][] = [];
		ws.eachRow((_, n) => {
			if (n > 1 && cell(n, 'Crop') === 'Garlic')
				garlic.push([String(cell(n, 'Week (ISO)')), Number(cell(n, 'Planned harvest')), Number(cell(n, 'Shortfall'))]);
		});
		expect(garlic).toEqual(want);
	});
});
