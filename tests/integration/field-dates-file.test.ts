// A crop's field dates (the earliest and latest day of the year it may be sown or set out) travel in
// the workbook's Crops & varieties sheet as plain month-day text under a header naming it, come back
// in on import, and are checked like every other cell. The starter library gives garlic autumn dates.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, testDb } from '../helpers/db';
import {
	download,
	libraryOf,
	loadWorkbook,
	signUpFarm,
	upload,
	writeHandPlan,
	type NewFarm
} from '../helpers/transfer';

afterAll(closeTestDb);

let source: NewFarm;
let seasonId: number;
let bytes: Buffer;
beforeAll(async () => {
	source = await signUpFarm('field-dates-src');
	seasonId = (await writeHandPlan(source.farmId)).seasonId;
	// Invented for the check: garlic planted 1 Oct – 15 Dec; the carrot has none.
	await testDb()('crops')
		.where({ farm_id: source.farmId, name: 'Garlic' })
		.update({ sow_from: '10-01', sow_to: '12-15' });
	const got = await download(source.client, seasonId);
	expect(got.res.status).toBe(200);
	bytes = got.bytes;
});

const crops = async (farmId: number) =>
	Object.fromEntries(
		(await testDb()('crops').where({ farm_id: farmId }).select('name', 'sow_from', 'sow_to')).map((c) => [
			c.name,
			[c.sow_from, c.sow_to]
		])
	);

describe('field dates in the Crops & varieties sheet', () => {
	it('are written as MM-DD text under headers that name them', async () => {
		const ws = (await loadWorkbook(bytes)).getWorksheet('Crops & varieties')!;
		const head = (ws.getRow(1).values as unknown[]).slice(1) as string[];
		const from = head.indexOf('Earliest field date (MM-DD)') + 1;
		const to = head.indexOf('Latest field date (MM-DD)') + 1;
		expect(from).toBeGreaterThan(0);
		expect(to).toBeGreaterThan(0);
		const rows: Record<string, [unknown, unknown]> = {};
		for (let n = 2; n <= ws.rowCount; n++) {
			const r = ws.getRow(n);
			rows[String(r.getCell(1).value)] = [r.getCell(from).value, r.getCell(to).value];
		}
		// Text, not a date of one year: a spreadsheet shows 10-01 as typed.
		expect(rows.Garlic).toEqual(['10-01', '12-15']);
		expect(rows.Carrot).toEqual([null, null]);
	});

	it('come back on import into an empty farm (round trip)', async () => {
		const target = await signUpFarm('field-dates-dst');
		const res = await upload(target.client, 'hand.xlsx', bytes);
		expect(res.status, JSON.stringify(await res.clone().json())).toBe(201);
		expect(await crops(target.farmId)).toEqual({
			Carrot: [null, null],
			'Head lettuce': [null, null],
			Garlic: ['10-01', '12-15']
		});
		expect((await libraryOf(target.farmId)).crops).toEqual((await libraryOf(source.farmId)).crops);
	});

	const header = 'Crop,Family,Harvest unit,Frost tolerance,Earliest field date (MM-DD),Latest field date (MM-DD)\r\n';
	it('are checked: a day no year has, or only one of the two, is refused naming the row and column', async () => {
		const farm = await signUpFarm('field-dates-bad');
		const before = await crops(farm.farmId);
		const bad = await upload(
			farm.client,
			'crops.csv',
			`${header}Garlic,Amaryllidaceae,head,hardy,02-30,12-15\r\nLeek,Amaryllidaceae,each,hardy,04-01,\r\n`,
			{ sheet: 'Crops & varieties' }
		);
		expect(bad.status).toBe(400);
		const body = await bad.json();
		expect(body.errors).toEqual([
			expect.objectContaining({ row: 2, column: 'E', header: 'Earliest field date (MM-DD)' }),
			expect.objectContaining({ row: 3, column: 'F', header: 'Latest field date (MM-DD)' })
		]);
		expect(body.errors[0].message).toMatch(/MM-DD/);
		expect(body.errors[1].message).toMatch(/both field dates/);
		expect(await crops(farm.farmId)).toEqual(before);
	});

	it('a file without the columns leaves a crop’s field dates as they are; a blank pair clears them', async () => {
		const farm = await signUpFarm('field-dates-keep');
		const ok = await upload(
			farm.client,
			'crops.csv',
			`${header}Garlic,Amaryllidaceae,head,hardy,10-01,12-15\r\nLeek,Amaryllidaceae,each,hardy,03-15,06-30\r\n`,
			{ sheet: 'Crops & varieties' }
		);
		expect(ok.status).toBe(201);
		expect(await crops(farm.farmId)).toEqual({ Garlic: ['10-01', '12-15'], Leek: ['03-15', '06-30'] });
		const old = await upload(
			farm.client,
			'old.csv',
			'Crop,Family,Harvest unit,Frost tolerance\r\nGarlic,Amaryllidaceae,head,hardy\r\n',
			{
				sheet: 'Crops & varieties'
			}
		);
		expect(old.status).toBe(201);
		expect(await crops(farm.farmId)).toEqual({ Garlic: ['10-01', '12-15'], Leek: ['03-15', '06-30'] });
		const cleared = await upload(farm.client, 'clear.csv', `${header}Leek,Amaryllidaceae,each,hardy,,\r\n`, {
			sheet: 'Crops & varieties'
		});
		expect(cleared.status).toBe(201);
		expect((await crops(farm.farmId)).Leek).toEqual([null, null]);
	});
});

describe('the starter library', () => {
	it('gives garlic autumn field dates and leaves crops set by frost and soil temperature without', async () => {
		const farm = await signUpFarm('field-dates-starter');
		const res = await farm.client.postForm('/setup/crops', { crop: 'garlic' });
		expect(res.status).toBeLessThan(400);
		await farm.client.postForm('/setup/crops', { crop: 'carrot' });
		// Common practice (no published source): garlic goes in in autumn, before the ground freezes.
		expect(await crops(farm.farmId)).toEqual({ Garlic: ['10-01', '11-30'], Carrot: [null, null] });
	});
});
