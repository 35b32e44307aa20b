// Two imports into one farm at the same moment: MariaDB may deadlock them on the farm's library
// rows. The loser is retried once and then refused with 409; no request answers 500, and what
// is written is one whole import, never a mix.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signedIn } from '../helpers/http';
import { closeTestDb, count, testDb } from '../helpers/db';
import { demo } from '../helpers/env';
import { download, signUpFarm, upload } from '../helpers/transfer';

afterAll(closeTestDb);

let workbook: Buffer;
let seasonId: number;
beforeAll(async () => {
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	const farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	seasonId = (await testDb()('seasons').where({ farm_id: farmId, year: 2027 }).first('id')).id;
	workbook = (await download(await signedIn(demo.owner, demo.password), seasonId)).bytes;
});

describe('concurrent imports into one farm', () => {
	it('answer 201, 400 or 409, never 500, and leave one whole import', async () => {
		const farm = await signUpFarm('import-race');
		const answers = await Promise.all([0, 1, 2].map(() => upload(farm.client, 'plan.xlsx', workbook)));
		const statuses = answers.map((r) => r.status);
		console.log(
			'import-race',
			statuses,
			await Promise.all(
				answers.map((r) =>
					r
						.clone()
						.text()
						.then((t) => t.slice(0, 300))
				)
			)
		);
		for (const s of statuses) expect([201, 400, 409], statuses.join(',')).toContain(s);
		expect(statuses.filter((s) => s === 201)).toHaveLength(1);
		expect(await count('plantings', { farm_id: farm.farmId })).toBe(await count('plantings', { season_id: seasonId }));
	});
});
