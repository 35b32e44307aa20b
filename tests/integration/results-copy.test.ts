// Actual against plan, the variety figures the owner may take over (recorded, undoable), and
// copying a season into the next year across the ISO week-53 edge.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, html, signedIn } from '../helpers/http';
import { closeTestDb, testDb } from '../helpers/db';
import { demo } from '../helpers/env';
import { addPlanting, addSeason, harvestFarm, type HarvestFarm } from './harvest-fixture';

afterAll(closeTestDb);

let own: HarvestFarm;
let seasonId: number;
let crew: Client;
beforeAll(async () => {
	crew = await signedIn(demo.crew, demo.password);
	own = await harvestFarm('results');
	seasonId = await addSeason(own.farmId, 2026);
	// Three finished carrot plantings, 10 ft each at 2 lb/ft planned (20 lb expected each):
	// logged 25, 30 and 35 lb → Σ 90 lb ÷ Σ 30 ft = 3 lb/ft observed.
	// Days to maturity: 2026-04-06 → 06-08 = 24 + 31 + 8 = 63; 04-13 → 06-12 = 17 + 31 + 12 = 60;
	// 04-20 → 06-22 = 10 + 31 + 22 = 63; mean (63 + 60 + 63) ÷ 3 = 62 days.
	const rows: [string, string, number][] = [
		['2026-04-06', '2026-06-08', 25],
		['2026-04-13', '2026-06-12', 30],
		['2026-04-20', '2026-06-22', 35]
	];
	for (const [field, first, q] of rows) {
		const id = await addPlanting(own.farmId, seasonId, {
			varietyId: own.carrot.varietyId,
			bedId: own.bedIds[0],
			lengthFt: 10,
			fieldDate: field,
			firstHarvest: '2026-06-05',
			lastHarvest: '2026-06-18',
			expectedYield: 20,
			status: 'finished'
		});
		await testDb()('harvest_records').insert({
			farm_id: own.farmId,
			planting_id: id,
			harvested_on: first,
			quantity: q,
			unit: 'lb'
		});
		await testDb()('plantings').where({ id }).update({ actual_first_harvest: first });
	}
});

const results = () => `/seasons/${seasonId}/results`;

describe('actual against plan', () => {
	it('JSON: no session 401; another farm 404; owner 200 with the observed figures', async () => {
		expect((await new Client().get(`/api/seasons/${seasonId}/harvests/results`)).status).toBe(401);
		expect((await crew.get(`/api/seasons/${seasonId}/harvests/results`)).status).toBe(404);
		const out = await (await own.owner.get(`/api/seasons/${seasonId}/harvests/results`)).json();
		const v = out.result.varieties.find((x: { variety: string }) => x.variety === String(own.carrot.varietyId));
		expect(v).toMatchObject({ yieldPlantings: 3, observedYieldPerBedFoot: 3, dtmPlantings: 3, observedDtm: 62 });
		// All three windows are in June 2026, long before the current week: ratio = 90 ÷ 60 lb forecast = 1.5.
		expect(out.result.crops[0].ratio).toBeCloseTo(1.5, 9);
	});
	it('the page shows the figures and offers them to the owner', async () => {
		// HTML whitespace is one space to a reader, however the template wraps its text.
		const body = (await html(await own.owner.get(results()))).replace(/\s+/g, ' ');
		expect(body).toContain('Use these figures');
		expect(body).toContain('2 → 3 lb/ft (3)');
		expect(body).toContain('60 d → 62 d (3)');
	});
});

describe('use these figures', () => {
	it('crew lead may not (403); a bad variety is 400 naming it; another farm is 404', async () => {
		expect((await crew.postForm(`/seasons/1/results?/useFigures`, { varietyId: 1 })).status).toBe(403);
		expect((await own.owner.postForm(`${results()}?/useFigures`, { varietyId: 'x' })).status).toBe(400);
		expect((await crew.postForm(`${results()}?/useFigures`, { varietyId: own.carrot.varietyId })).status).toBe(404);
	});
	it('a variety with fewer than three plantings behind it is refused (400)', async () => {
		const res = await own.owner.postForm(`${results()}?/useFigures`, { varietyId: own.basil.varietyId });
		expect(res.status).toBe(400);
		expect(await html(res)).toContain('Fewer than 3 plantings');
	});
	it('the owner takes them over (303); recorded; undo puts them back; a second undo is 409', async () => {
		const res = await own.owner.postForm(`${results()}?/useFigures`, { varietyId: own.carrot.varietyId });
		expect(res.status).toBe(303);
		const v = await testDb()('varieties').where({ id: own.carrot.varietyId }).first();
		expect(Number(v.yield_per_bed_foot)).toBe(3);
		expect(v.days_to_maturity).toBe(62);
		const change = await testDb()('variety_figure_changes').where({ variety_id: own.carrot.varietyId }).first();
		expect(change).toMatchObject({
			old_days_to_maturity: 60,
			new_days_to_maturity: 62,
			yield_plantings: 3,
			dtm_plantings: 3,
			changed_by: own.userId,
			undone_at: null
		});
		expect(Number(change.old_yield_per_bed_foot)).toBe(2);
		expect((await own.owner.postForm(`${results()}?/undoFigures`, { changeId: change.id })).status).toBe(303);
		const back = await testDb()('varieties').where({ id: own.carrot.varietyId }).first();
		expect([Number(back.yield_per_bed_foot), back.days_to_maturity]).toEqual([2, 60]);
		expect((await own.owner.postForm(`${results()}?/undoFigures`, { changeId: change.id })).status).toBe(409);
	});
});

describe('copy a season into the next year', () => {
	let copyFarm: HarvestFarm;
	let src: number;
	let w53: number;
	let frosty: number;
	beforeAll(async () => {
		copyFarm = await harvestFarm('copy');
		// Tender crops out on the frost date itself (the farm setting; a new farm waits 7 days).
		await testDb()('farms').where({ id: copyFarm.farmId }).update({ tender_days_after_frost: 0 });
		src = await addSeason(copyFarm.farmId, 2026);
		// Carrots (Apiaceae) held bed N1 all year.
		await addPlanting(copyFarm.farmId, src, {
			varietyId: copyFarm.carrot.varietyId,
			bedId: copyFarm.bedIds[0],
			lengthFt: 50,
			fieldDate: '2026-04-20',
			firstHarvest: '2026-06-19',
			lastHarvest: '2026-07-02',
			expectedYield: 100,
			status: 'finished'
		});
		// A planting in week 53: Tue 2026-12-29 = 2026-W53-2.
		w53 = await addPlanting(copyFarm.farmId, src, {
			varietyId: copyFarm.carrot.varietyId,
			bedId: copyFarm.bedIds[0],
			lengthFt: 50,
			fieldDate: '2026-12-29',
			firstHarvest: '2027-02-27',
			lastHarvest: '2027-03-12',
			expectedYield: 100
		});
		// Frost-tender basil sown Tue 2026-05-05, before the 10 May frost date.
		frosty = await addPlanting(copyFarm.farmId, src, {
			varietyId: copyFarm.basil.varietyId,
			bedId: copyFarm.bedIds[1],
			lengthFt: 20,
			fieldDate: '2026-05-05',
			firstHarvest: '2026-06-14',
			lastHarvest: '2026-07-11',
			expectedYield: 20,
			status: 'harvesting'
		});
		await testDb()('plantings')
			.where({ id: frosty })
			.update({ actual_field_date: '2026-05-06', actual_first_harvest: '2026-06-15' });
		const [share] = await testDb()('share_sizes').insert({
			farm_id: copyFarm.farmId,
			season_id: src,
			name: 'Full',
			members: 10,
			first_week: '2026-W24',
			last_week: '2026-W53'
		});
		await testDb()('box_items').insert([
			{ share_size_id: share, week: '2026-W52', crop_id: copyFarm.carrot.cropId, quantity: 1, unit: 'lb' },
			{ share_size_id: share, week: '2026-W53', crop_id: copyFarm.carrot.cropId, quantity: 2, unit: 'lb' }
		]);
		await testDb()('channel_demand').insert({
			farm_id: copyFarm.farmId,
			season_id: src,
			channel: 'market',
			crop_id: copyFarm.carrot.cropId,
			week: '2026-W30',
			quantity: 15
		});
	});
	const api = () => `/api/seasons/${src}/copy`;

	it('401 without a session, 403 for the crew lead, 404 for another farm, 400 for a stray field', async () => {
		expect((await new Client().json(api(), 'POST', {})).status).toBe(401);
		expect((await crew.json(`/api/seasons/1/copy`, 'POST', {})).status).toBe(403);
		expect((await own.owner.json(api(), 'POST', {})).status).toBe(404);
		const bad = await copyFarm.owner.json(api(), 'POST', { year: 2030 });
		expect(bad.status).toBe(400);
	});
	it('the demo 2026 season cannot be copied: 2027 exists (409)', async () => {
		const owner = await signedIn(demo.owner, demo.password);
		const res = await owner.postForm(`/seasons/1/results?/copySeason`, {});
		expect(res.status).toBe(409);
	});
	it('copies: same ISO week and weekday, W53 → W52, actuals cleared, demand shifted, families moved', async () => {
		const res = await copyFarm.owner.json(api(), 'POST', {});
		expect(res.status).toBe(201);
		const { report } = await res.json();
		expect(report.season).toMatchObject({ year: 2027, startsOn: '2027-01-01', endsOn: '2027-12-31' });
		expect(report.plantings).toBe(3);
		expect(report.week53).toBe(1);
		const rows = await testDb()('plantings').where({ season_id: report.season.id }).orderBy('field_date');
		// 2026-04-20 (W17-1) → 2027-W17-1 = 2027-04-26; harvest keeps its 60 days: 2027-06-25.
		// 2026-05-05 (W19-2) → 2027-05-11; 2026-12-29 (W53-2) → 2027-W52-2 = 2027-12-28.
		expect(rows.map((r) => r.field_date)).toEqual(['2027-04-26', '2027-05-11', '2027-12-28']);
		expect(rows[0].first_harvest).toBe('2027-06-25');
		for (const r of rows) {
			expect(r.status).toBe('planned');
			expect([r.actual_field_date, r.actual_first_harvest, r.actual_last_harvest, r.actual_tray_sow_date]).toEqual([
				null,
				null,
				null,
				null
			]);
		}
		// Apiaceae held N1 and basil (Lamiaceae) N2: next year each goes elsewhere, with room to spare.
		const carrots = rows.filter((r) => r.variety_id === copyFarm.carrot.varietyId);
		expect(carrots.every((r) => r.bed_id !== copyFarm.bedIds[0])).toBe(true);
		expect(rows.find((r) => r.variety_id === copyFarm.basil.varietyId)!.bed_id).not.toBe(copyFarm.bedIds[1]);
		expect(report.rotation).toEqual([]);
		// The basil's frost warning clears: 11 May 2027 is after the 10 May frost date.
		const change = report.checkChanges.find((c: { crop: string }) => c.crop === 'Basil');
		expect(change.cleared.map((w: { code: string }) => w.code)).toEqual(['frost_before_last_spring']);
		// Demand: W24…W53 → W24…W52; box W52 and W53 both land in W52, the W52 quantity stands.
		const share = await testDb()('share_sizes').where({ season_id: report.season.id }).first();
		expect([share.first_week, share.last_week]).toEqual(['2027-W24', '2027-W52']);
		const items = await testDb()('box_items').where({ share_size_id: share.id });
		expect(items.map((i) => [i.week, Number(i.quantity)])).toEqual([['2027-W52', 1]]);
		expect(report.demand).toMatchObject({ shareSizes: 1, boxItems: 1, channelDemand: 1, droppedWeek53: 1 });
		expect((await testDb()('channel_demand').where({ season_id: report.season.id }).first()).week).toBe('2027-W30');
		// Copying again: 2027 exists now.
		expect((await copyFarm.owner.json(api(), 'POST', {})).status).toBe(409);
		expect(w53).toBeGreaterThan(0);
	});
});

describe("next season works around last fall's plantings still in the beds", () => {
	it('a moved spring planting finds every bed held and stays unplaced, with the reason', async () => {
		// Invented: three 100-ft beds, each holding carrots sown 20 Oct 2026 and dug by 15 Jul 2027
		// (busy through 22 Jul with the 7 turnaround days), and one spring basil of 2026.
		const farm = await harvestFarm('copy-held');
		const src = await addSeason(farm.farmId, 2026);
		for (const bedId of farm.bedIds) {
			await addPlanting(farm.farmId, src, {
				varietyId: farm.carrot.varietyId,
				bedId,
				lengthFt: 100,
				fieldDate: '2026-10-20',
				firstHarvest: '2027-06-01',
				lastHarvest: '2027-07-15',
				expectedYield: 200,
				status: 'sown'
			});
		}
		// Tue 21 Apr 2026 (W17-2) moves to W17-2 of 2027, Tue 27 Apr, harvesting into June 2027:
		// every bed is still under the fall carrots then.
		await addPlanting(farm.farmId, src, {
			varietyId: farm.basil.varietyId,
			bedId: farm.bedIds[0],
			lengthFt: 20,
			fieldDate: '2026-04-21',
			firstHarvest: '2026-06-01',
			lastHarvest: '2026-06-28',
			expectedYield: 20,
			status: 'finished'
		});
		const res = await farm.owner.json(`/api/seasons/${src}/copy`, 'POST', {});
		expect(res.status).toBe(201);
		const { report } = await res.json();
		const rows = await testDb()('plantings').where({ season_id: report.season.id }).orderBy('field_date');
		const basil = rows.find((r) => r.variety_id === farm.basil.varietyId)!;
		expect(basil.field_date).toBe('2027-04-27');
		expect(basil.bed_id).toBeNull();
		expect(report.unplaced).toEqual([expect.objectContaining({ crop: 'Basil' })]);
		// Tue 20 Oct 2026 is W43-2; 2027-W43 starts Mon 25 Oct (W1 starts Mon 4 Jan 2027, + 42 weeks),
		// so the carrots move to Tue 26 Oct 2027, after their own 2026 selves are dug: placed, each
		// back on a bed carrots held (there is no other), with a rotation note.
		const carrots = rows.filter((r) => r.variety_id === farm.carrot.varietyId);
		expect(carrots.map((r) => r.field_date)).toEqual(['2027-10-26', '2027-10-26', '2027-10-26']);
		expect(carrots.every((r) => r.bed_id !== null)).toBe(true);
		expect(report.rotation).toHaveLength(3);
	});
});
