// Two imports into one farm at the same moment: MariaDB may deadlock them on the farm's library
// rows. The loser is retried once and then refused with 409; no request answers 500, and what
// is written is one whole import, never a mix.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, count } from '../helpers/db';
import { download, signUpFarm, upload, writeHandPlan } from '../helpers/transfer';

afterAll(closeTestDb);

let workbook: Buffer;
let sourceFarmId: number;
beforeAll(async () => {
	// A small plan of a farm of the test's own: the demo season is changed by other test files,
	// so its export is no fixed point to race with.
	const source = await signUpFarm('import-race-source');
	sourceFarmId = source.farmId;
	const hand = await writeHandPlan(source.farmId);
	workbook = (await download(source.client, hand.seasonId)).bytes;
});

describe('concurrent imports into one farm', () => {
	it('answer 201, 400 or 409, never 500, and leave one whole import', async () => {
		const farm = await signUpFarm('import-race');
		const answers = await Promise.all([0, 1, 2].map(() => upload(farm.client, 'plan.xlsx', workbook)));
		const statuses = answers.map((r) => r.status);
		for (const s of statuses) expect([201, 400, 409], statuses.join(',')).toContain(s);
		expect(
			statuses.filter((s) => s === 201),
			statuses.join(',')
		).toHaveLength(1);
		expect(await count('plantings', { farm_id: farm.farmId })).toBe(
			await count('plantings', { farm_id: sourceFarmId })
		);
	});
});
