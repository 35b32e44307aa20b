// Every migration runs up, down and up again on a scratch database, and the schema it leaves
// is the same both times.
import { afterAll, describe, expect, it } from 'vitest';
import knex from 'knex';
import { knexConfig } from '../../knexfile';

const database = process.env.FC_DB_SCRATCH_NAME ?? 'furrowcast_scratch';
const conn = knex(knexConfig(database));
afterAll(() => conn.destroy());

async function tables(): Promise<string[]> {
	const [rows] = await conn.raw(
		'SELECT table_name AS t FROM information_schema.tables WHERE table_schema = ? ORDER BY table_name',
		[database]
	);
	return (rows as { t: string }[]).map((r) => r.t).filter((t) => !t.startsWith('knex_'));
}

async function columns(): Promise<string> {
	const [rows] = await conn.raw(
		'SELECT table_name, column_name, column_type, is_nullable FROM information_schema.columns WHERE table_schema = ? ORDER BY table_name, ordinal_position',
		[database]
	);
	return JSON.stringify(rows);
}

describe('migrations', () => {
	// Every migration twice over on a shared two-core machine: allow well past the default 30 s.
	it('run up, all the way down, and up again', { timeout: 180_000 }, async () => {
		await conn.migrate.rollback(undefined, true);
		expect(await tables()).toEqual([]);

		await conn.migrate.latest();
		const first = await tables();
		const firstColumns = await columns();
		for (const t of [
			'farms',
			'users',
			'farm_members',
			'user_sessions',
			'invites',
			'password_resets',
			'blocks',
			'beds',
			'crops',
			'varieties',
			'seasons',
			'plantings',
			'share_sizes',
			'box_items',
			'channel_demand',
			'harvest_records'
		]) {
			expect(first).toContain(t);
		}

		await conn.migrate.rollback(undefined, true);
		expect(await tables()).toEqual([]);

		await conn.migrate.latest();
		expect(await tables()).toEqual(first);
		expect(await columns()).toBe(firstColumns);
	});

	it('keep money in integer cents and calendar dates as DATE', async () => {
		const [rows] = await conn.raw(
			"SELECT table_name, column_name, data_type FROM information_schema.columns WHERE table_schema = ? AND (column_name LIKE '%cents%' OR column_name IN ('field_date','first_harvest','last_harvest','tray_sow_date','harvested_on','last_spring_frost','first_fall_frost'))",
			[database]
		);
		const list = rows as { column_name: string; data_type: string }[];
		expect(list.length).toBeGreaterThan(8);
		for (const c of list) expect(c.data_type).toBe(c.column_name.includes('cents') ? 'int' : 'date');
	});

	it('have the plantings carry a version for optimistic concurrency', async () => {
		const [rows] = await conn.raw(
			"SELECT column_default FROM information_schema.columns WHERE table_schema = ? AND table_name = 'plantings' AND column_name = 'version'",
			[database]
		);
		expect((rows as { column_default: string }[])[0]?.column_default).toBe('1');
	});
});
