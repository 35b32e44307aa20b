// What a metric farm types is read in its units and kept in the canonical ones: crop and variety
// figures, beds, a logged harvest, demand cells and a box swap. Every expected figure is worked out
// by hand from the exact constants. Source: NIST Handbook 44, Appendix C (1 ft = 0.3048 m,
// 1 in = 2.54 cm, 1 lb = 0.453 592 37 kg, °F = °C × 9/5 + 32).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type Client, html } from '../helpers/http';
import { closeTestDb, testDb } from '../helpers/db';
import { signUpFarm } from '../helpers/transfer';

afterAll(closeTestDb);

let owner: Client;
let farmId: number;
let seasonId: number;
let cropId: number;
let varietyId: number;

beforeAll(async () => {
	({ client: owner, farmId } = await signUpFarm('metric-input'));
	// The farm chose metric (the set-up path's first step offers it; here it is set directly).
	await testDb()('farms').where({ id: farmId }).update({ unit_system: 'metric' });
	[seasonId] = await testDb()('seasons').insert({
		farm_id: farmId,
		year: 2026,
		name: '2026',
		starts_on: '2026-01-01',
		ends_on: '2026-12-31'
	});
});

describe('a metric farm types in metric', () => {
	it('keeps a crop typed in °C and per kg in °F and per lb', async () => {
		const res = await owner.postForm('/crops/new', {
			name: 'Spinach',
			family: 'Amaranthaceae',
			harvestUnit: 'lb',
			frostTolerance: 'hardy',
			heatLimitF: '24', // °C: 24 × 9/5 + 32 = 75.2 °F
			baseTempF: '4.5', // °C: 4.5 × 9/5 + 32 = 40.1 °F
			harvestCurve: 'flat',
			cutIntervalDays: '',
			storageWeeks: '',
			storageLossPct: '',
			price: '6.60', // USD per kg: 6.60 × 0.45359237 = 2.9937 per lb → 299 ¢
			source: 'test'
		});
		expect(res.status).toBe(303);
		const row = await testDb()('crops').where({ farm_id: farmId, name: 'Spinach' }).first();
		cropId = row.id;
		expect(Number(row.heat_limit_f)).toBeCloseTo(75.2, 6);
		expect(Number(row.base_temp_f)).toBeCloseTo(40.1, 6);
		expect(row.price_cents_per_unit).toBe(299);
		// Shown back as typed: 75.2 °F = 24 °C.
		const page = await html(await owner.get(`/crops/${cropId}`));
		expect(page).toContain('Heat limit');
		expect(page).toMatch(/id="crop-heatLimitF"[^>]*value="24"/);
	});

	it('keeps a variety typed in kg per bed-metre, cm and per gram in lb per foot, inches and per gram', async () => {
		const res = await owner.postForm(`/crops/${cropId}/varieties/new`, {
			name: 'Broadleaf',
			method: 'direct',
			daysToMaturity: '40',
			daysInTray: '0',
			harvestWindowDays: '14',
			yieldPerBedFoot: '1.2', // kg/m: 1.2 × 0.3048 ÷ 0.45359237 = 0.80637 lb/ft
			rows: '5',
			inRowSpacingIn: '3.81', // cm: 3.81 ÷ 2.54 = 1.5 in
			seedsPerSpot: '1',
			germinationRate: '85',
			seedsPerGram: '100', // grams on a metric farm: kept as typed
			seedPrice: '0.12', // USD per gram: 12 ¢
			seedsPerPacket: '',
			cellsPerTray: '128',
			margin: '10',
			harvestCurve: '',
			gddToMaturity: '',
			source: 'test'
		});
		expect(res.status).toBe(303);
		const v = await testDb()('varieties').where({ crop_id: cropId, name: 'Broadleaf' }).first();
		varietyId = v.id;
		expect(Number(v.yield_per_bed_foot)).toBeCloseTo(0.806, 3);
		expect(Number(v.in_row_spacing_in)).toBeCloseTo(1.5, 6);
		expect(Number(v.seeds_per_gram)).toBe(100);
		expect(v.seed_price_cents_per_gram).toBe(12);
	});

	it('names a bad metric figure at its field, with bounds in metric, and writes nothing', async () => {
		const before = await testDb()('varieties').where({ crop_id: cropId }).count({ n: '*' });
		const res = await owner.postForm(`/crops/${cropId}/varieties/new`, {
			name: 'Too close',
			method: 'direct',
			daysToMaturity: '40',
			daysInTray: '0',
			harvestWindowDays: '14',
			yieldPerBedFoot: '1',
			rows: '5',
			inRowSpacingIn: '0.1', // cm: below the 0.1 in (0.254 cm) the library allows
			seedsPerSpot: '1',
			germinationRate: '85',
			seedsPerGram: '100',
			seedPrice: '0',
			seedsPerPacket: '',
			cellsPerTray: '128',
			margin: '10',
			harvestCurve: '',
			gddToMaturity: '',
			source: ''
		});
		expect(res.status).toBe(400);
		expect(await html(res)).toContain('In-row spacing must be at least 0.254.');
		expect(await testDb()('varieties').where({ crop_id: cropId }).count({ n: '*' })).toEqual(before);
	});

	it('keeps beds typed in metres and centimetres in feet and whole inches', async () => {
		const block = await owner.postForm('/settings?/addBlock', { name: 'Terrace' });
		expect(block.status).toBe(303);
		const blockId = (await testDb()('blocks').where({ farm_id: farmId, name: 'Terrace' }).first('id')).id;
		const one = await owner.postForm('/settings?/saveBed', {
			name: 'T1',
			blockId,
			lengthFt: '30', // m: 30 ÷ 0.3048 = 98.43 ft, kept to the tenth: 98.4
			widthIn: '76', // cm: 76 ÷ 2.54 = 29.92 in, kept whole: 30
			position: '1'
		});
		expect(one.status).toBe(303);
		const t1 = await testDb()('beds').where({ farm_id: farmId, name: 'T1' }).first();
		expect([Number(t1.length_ft), t1.width_in]).toEqual([98.4, 30]);
		const bulk = await owner.postForm('/setup/beds', {
			block: 'Terrace',
			count: '2',
			lengthFt: '15.24', // m: exactly 50 ft
			widthIn: '75', // cm: 29.53 in → 30
			prefix: 'U',
			firstNumber: '1'
		});
		expect(bulk.status).toBe(200);
		const u = await testDb()('beds').where({ farm_id: farmId }).whereIn('name', ['U1', 'U2']).select();
		expect(u.map((b) => [Number(b.length_ft), b.width_in])).toEqual([
			[50, 30],
			[50, 30]
		]);
	});

	it('logs a harvest typed in kg as lb, and shows it back in kg', async () => {
		const bed = (await testDb()('beds').where({ farm_id: farmId, name: 'T1' }).first('id')).id;
		const [plantingId] = await testDb()('plantings').insert({
			farm_id: farmId,
			season_id: seasonId,
			variety_id: varietyId,
			bed_id: bed,
			start_ft: 0,
			length_ft: 20,
			rows: 5,
			in_row_spacing_in: 1.5,
			method: 'direct',
			field_date: '2026-04-01',
			first_harvest: '2026-05-10',
			last_harvest: '2026-05-23'
		});
		const res = await owner.postForm(`/seasons/${seasonId}/harvests?/log`, {
			plantingId,
			quantity: '2.5', // kg: 2.5 ÷ 0.45359237 = 5.5116 lb → 5.51
			unit: 'lb',
			harvestedOn: '2026-05-12',
			harvestedBy: '',
			notes: ''
		});
		expect(res.status).toBe(303);
		const rec = await testDb()('harvest_records').where({ planting_id: plantingId }).first();
		expect(Number(rec.quantity)).toBeCloseTo(5.51, 6);
		// 5.51 lb × 0.45359237 = 2.4993 kg, shown to the hundredth.
		const page = (await html(await owner.get(`/seasons/${seasonId}/harvests`))).replace(/\s+/g, ' ');
		expect(page).toContain('2.5 kg');
	});

	it('keeps demand typed in kg as lb, and a cell left as drawn exactly as it was', async () => {
		// One cell already holds 0.25 lb (drawn as 0.113 kg); the other is typed anew as 4.536 kg.
		await testDb()('channel_demand').insert({
			farm_id: farmId,
			season_id: seasonId,
			channel: 'market',
			crop_id: cropId,
			week: '2026-W20',
			quantity: 0.25
		});
		const res = await owner.postForm(`/seasons/${seasonId}/demand?/saveGrid`, {
			grid: 'market',
			[`u.${cropId}`]: 'lb',
			[`q.${cropId}.2026-W20`]: '0.113', // as drawn: 0.25 × 0.45359237 = 0.1134 → "0.113"
			[`was.${cropId}.2026-W20`]: '0.25',
			[`q.${cropId}.2026-W21`]: '4.536', // kg: 4.536 ÷ 0.45359237 = 10.0002 lb → 10
			[`was.${cropId}.2026-W21`]: ''
		});
		expect(res.status).toBe(303);
		const rows = await testDb()('channel_demand')
			.where({ farm_id: farmId, season_id: seasonId, channel: 'market', crop_id: cropId })
			.orderBy('week')
			.select('week', 'quantity');
		expect(rows.map((r) => [r.week, Number(r.quantity)])).toEqual([
			['2026-W20', 0.25],
			['2026-W21', 10]
		]);
	});
});
