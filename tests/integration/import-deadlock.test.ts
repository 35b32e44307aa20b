// An import that MariaDB rolls back in a deadlock is retried once, then refused with 409; nothing of
// it is ever half-written. The deadlocks here are real ones, made against the running app's database
// with transactions of the test's own (no mocks): a blocker holds the farm's beds shared, the import
// takes the farm's crops, varieties and blocks and waits for the beds, and the blocker then asks for
// the crops. The blocker has written more (rows it rolls back at the end), so MariaDB picks the
// import as the victim: InnoDB rolls back the transaction that modified the fewest rows.
// Source: MariaDB Knowledge Base, "InnoDB Lock Modes" / deadlock detection; MySQL 8.0 Reference
// Manual 17.7.5.2 "Deadlock Detection" (the smaller transaction, by rows changed, is rolled back).
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeTestDb, testDb } from '../helpers/db';
import { signUpFarm, upload, writeHandPlan, type NewFarm } from '../helpers/transfer';

afterAll(closeTestDb);

let farm: NewFarm;
beforeAll(async () => {
	farm = await signUpFarm('import-deadlock');
	await writeHandPlan(farm.farmId);
});

const lengths = async (): Promise<Record<string, number>> =>
	Object.fromEntries(
		(await testDb()('beds').where({ farm_id: farm.farmId }).select('name', 'length_ft')).map((b) => [
			b.name,
			Number(b.length_ft)
		])
	);

// Every row is read whole ('*'): a read covered by a secondary index would lock only that index's
// entries, which the import's reads by name would pass by.

/** A transaction that holds the farm's beds shared and has written 200 rows (so it is the heavier one). */
async function blocker(): Promise<Knex.Transaction> {
	const trx = await testDb().transaction();
	await trx('beds').where({ farm_id: farm.farmId }).forShare().select('*');
	const rows = Array.from({ length: 200 }, (_, i) => ({
		farm_id: farm.farmId,
		harvest_id: 900_000 + i,
		action: 'create'
	}));
	await trx('harvest_audit').insert(rows);
	return trx;
}

const isLockError = (err: unknown): boolean => [1205, 1213].includes((err as { errno?: number }).errno ?? 0);

/** Waits until the import holds the farm's block rows, which it locks just before the beds. */
async function importHoldsBlocks(): Promise<void> {
	for (let i = 0; i < 500; i++) {
		try {
			await testDb().transaction(async (probe) => {
				await probe.raw('select * from blocks where farm_id = ? for update nowait', [farm.farmId]);
			});
		} catch (err) {
			if (isLockError(err)) return;
			throw err;
		}
		await new Promise((r) => setTimeout(r, 20));
	}
	throw new Error('the import never took the block rows');
}

/** The blocker asks for the farm's crops, which the import holds: a deadlock the import loses. */
async function closeTheCycle(trx: Knex.Transaction): Promise<void> {
	await trx('crops').where({ farm_id: farm.farmId }).forShare().select('*');
}

const csv = (e1: number) => `Block,Bed,Length (ft),Width (in)\nEast,E1,${e1},30\n`;

describe('an import deadlocked by another transaction', () => {
	it('is retried once and written whole when the other lets go', async () => {
		const before = await lengths();
		expect(before.E1).toBe(100);
		const t1 = await blocker();
		const answer = upload(farm.client, 'beds.csv', csv(90));
		try {
			await importHoldsBlocks();
			// Granted only once MariaDB rolled the import back: the first attempt lost the deadlock.
			await closeTheCycle(t1);
			// Still nothing of the import is written while the retry waits.
			expect(await lengths()).toEqual(before);
		} finally {
			await t1.rollback();
		}
		const res = await answer;
		const body = await res.json();
		expect(res.status, JSON.stringify(body)).toBe(201);
		expect(body).toMatchObject({ beds: 1, plantings: 0 });
		expect(await lengths()).toEqual({ ...before, E1: 90 });
		// The blocker's rows went with its rollback.
		expect(await testDb()('harvest_audit').where({ farm_id: farm.farmId }).count({ n: '*' }).first()).toEqual({ n: 0 });
	});

	it('answers 409 naming the clash when the retry deadlocks too, and writes nothing', async () => {
		const before = await lengths();
		const t1 = await blocker();
		const t2 = await blocker().catch(async (err) => {
			await t1.rollback();
			throw err;
		});
		const answer = upload(farm.client, 'beds.csv', csv(75));
		try {
			await importHoldsBlocks();
			await closeTheCycle(t1); // first deadlock: the import is rolled back and tried again
			await t1.rollback(); // the retry gets the crops, varieties and blocks, and waits for the beds t2 holds
			await importHoldsBlocks();
			await closeTheCycle(t2); // second deadlock: the import gives up
		} finally {
			if (!t1.isCompleted()) await t1.rollback();
			await t2.rollback();
		}
		const res = await answer;
		const body = await res.json();
		expect(res.status, JSON.stringify(body)).toBe(409);
		expect(body.message).toMatch(/at the same moment/);
		expect(body.message).toMatch(/nothing of this import was written/i);
		expect(await lengths()).toEqual(before);
	});
});
