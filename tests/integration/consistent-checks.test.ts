// The same input gets the same answer everywhere: money below a cent is refused (not stored as
// 0), a CSV without rows or a known sheet is a 400 naming `sheet` (not 201 with 0 rows), and a
// plan request naming another farm's variety is a 400 naming the entry (not 200 with a warning).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, html, signedIn } from '../helpers/http';
import { closeTestDb, count, testDb } from '../helpers/db';
import { demo } from '../helpers/env';
import { signUpFarm, upload, type NewFarm } from '../helpers/transfer';

afterAll(closeTestDb);

let demoFarmId: number;
let demoSeasonId: number;
let owner: Client;
let fresh: NewFarm;

beforeAll(async () => {
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	demoFarmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	demoSeasonId = (await testDb()('seasons').where({ farm_id: demoFarmId, year: 2027 }).first('id')).id;
	owner = await signedIn(demo.owner, demo.password);
	fresh = await signUpFarm('checks');
});

const cropsHeader =
	'Crop,Family,Harvest unit,Frost tolerance,Variety,Method,Days to maturity (d),Harvest window (d),Yield per bed-foot (harvest units),Rows per bed,In-row spacing (in),Germination (%),Seeds per gram (seeds/g),Seed price ($/g)\n';
const cropRow = (price: string) => `Beet,Amaranthaceae,Bunch,hardy,Check Ruby,direct,55,21,3,4,3,80%,55,${price}\n`;

describe('money below a cent', () => {
	it('a seed price of $0.001 per gram is refused, naming the column; nothing written', async () => {
		const res = await upload(fresh.client, 'crops.csv', cropsHeader + cropRow('0.001'), { sheet: 'Crops & varieties' });
		expect(res.status).toBe(400);
		const errors = (await res.json()).errors as { header: string; message: string }[];
		expect(errors).toEqual([
			expect.objectContaining({ header: 'Seed price ($/g)', message: expect.stringMatching(/whole cents/) })
		]);
		expect(await count('varieties', { farm_id: fresh.farmId })).toBe(0);
	});
	it('$0.29 is kept as 29 cents', async () => {
		expect(
			(await upload(fresh.client, 'crops.csv', cropsHeader + cropRow('$0.29'), { sheet: 'Crops & varieties' })).status
		).toBe(201);
		expect(
			(
				await testDb()('varieties')
					.where({ farm_id: fresh.farmId, name: 'Check Ruby' })
					.first('seed_price_cents_per_gram')
			).seed_price_cents_per_gram
		).toBe(29);
	});
	it('the crop library refuses a seed price of $0.001 too, naming it; nothing written', async () => {
		const crop = await testDb()('crops').where({ farm_id: demoFarmId }).first('id');
		const before = await count('varieties', { farm_id: demoFarmId });
		const res = await owner.postForm(`/crops/${crop.id}/varieties/new`, {
			name: 'Sub-cent',
			method: 'direct',
			daysToMaturity: '70',
			daysInTray: '0',
			harvestWindowDays: '14',
			yieldPerBedFoot: '2.4',
			rows: '4',
			inRowSpacingIn: '1',
			seedsPerSpot: '1',
			germinationRate: '65',
			seedsPerGram: '776.03',
			seedPrice: '0.001',
			seedsPerPacket: '',
			cellsPerTray: '128',
			margin: '10',
			gddToMaturity: '',
			source: 'test'
		});
		expect(res.status).toBe(400);
		expect(await html(res)).toContain('Seed price must be in whole cents');
		expect(await count('varieties', { farm_id: demoFarmId })).toBe(before);
	});
	it('a share price of 0.001 sent as JSON is refused, naming price', async () => {
		const before = await count('share_sizes', { season_id: demoSeasonId });
		const res = await owner.json(`/api/seasons/${demoSeasonId}/demand/share-sizes`, 'POST', {
			name: 'Sub-cent share',
			members: 1,
			firstWeek: '2027-W24',
			lastWeek: '2027-W30',
			pickupDays: ['Tue'],
			price: 0.001
		});
		expect(res.status).toBe(400);
		expect(Object.keys((await res.json()).errors)).toEqual(['price']);
		expect(await count('share_sizes', { season_id: demoSeasonId })).toBe(before);
	});
});

describe('a CSV that says nothing', () => {
	it('a header with no rows and no sheet: 400 naming sheet', async () => {
		const res = await upload(fresh.client, 'beds.csv', 'Block,Bed,Length (ft)\n');
		expect(res.status).toBe(400);
		expect((await res.json()).errors).toEqual([expect.objectContaining({ header: 'sheet' })]);
	});
	it('a header nobody knows and no sheet: 400 naming sheet', async () => {
		const res = await upload(fresh.client, 'odd.csv', 'Colour,Shape\nred,round\n');
		expect(res.status).toBe(400);
		expect((await res.json()).errors).toEqual([expect.objectContaining({ header: 'sheet' })]);
	});
});

describe("another farm's variety in a plan request", () => {
	for (const route of ['preview', 'apply']) {
		it(`plan/${route}: 400 naming varietyPlan.<crop>.0.varietyId, nothing written`, async () => {
			const mine = await testDb()('varieties').where({ farm_id: demoFarmId }).first('id', 'crop_id');
			const [otherCrop] = await testDb()('crops').insert({
				farm_id: fresh.farmId,
				name: `Stray ${route}`,
				family: 'Apiaceae',
				harvest_unit: 'lb',
				frost_tolerance: 'hardy'
			});
			const [foreign] = await testDb()('varieties').insert({
				farm_id: fresh.farmId,
				crop_id: otherCrop,
				name: 'Foreign',
				method: 'direct',
				days_to_maturity: 60,
				harvest_window_days: 14,
				yield_per_bed_foot: 1,
				rows_per_bed: 2,
				in_row_spacing_in: 2,
				germination_rate: 0.8,
				seeds_per_gram: 100
			});
			const before = await count('plantings', { season_id: demoSeasonId });
			const res = await owner.json(`/api/seasons/${demoSeasonId}/plan/${route}`, 'POST', {
				varietyPlan: { [mine.crop_id]: [{ varietyId: foreign }] }
			});
			expect(res.status).toBe(400);
			expect(Object.keys((await res.json()).errors)).toEqual([`varietyPlan.${mine.crop_id}.0.varietyId`]);
			// Another farm's crop as the key is refused the same way.
			const byCrop = await owner.json(`/api/seasons/${demoSeasonId}/plan/${route}`, 'POST', {
				varietyPlan: { [otherCrop]: [{ varietyId: mine.id }] }
			});
			expect(byCrop.status).toBe(400);
			expect(Object.keys((await byCrop.json()).errors)).toEqual([`varietyPlan.${otherCrop}`]);
			expect(await count('plantings', { season_id: demoSeasonId })).toBe(before);
		});
	}
});
