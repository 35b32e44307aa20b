// A season of its own on the demo farm for the demand tests, so the demo season's demand (which
// other tests plan from) is never touched. Removed again (with its demand) by cleanup().
import { testDb } from '../helpers/db';
import { demo } from '../helpers/env';

export interface DemandFixture {
	farmId: number;
	seasonId: number;
	crop: (name: string) => number;
	cleanup: () => Promise<void>;
}

export async function demandSeason(year: number): Promise<DemandFixture> {
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	const farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id as number;
	await testDb()('seasons').where({ farm_id: farmId, year }).delete();
	const [seasonId] = await testDb()('seasons').insert({
		farm_id: farmId,
		year,
		name: `${year} test season (invented)`,
		starts_on: `${year}-01-01`,
		ends_on: `${year}-12-31`
	});
	const crops = new Map<string, number>(
		(await testDb()('crops').where({ farm_id: farmId }).select('id', 'name')).map((c) => [c.name, c.id])
	);
	return {
		farmId,
		seasonId,
		crop: (name) => {
			const id = crops.get(name);
			if (!id) throw new Error(`demo farm has no crop ${name}`);
			return id;
		},
		cleanup: async () => {
			await testDb()('seasons').where({ id: seasonId }).delete();
		}
	};
}
