// Change stamps for the answer cache of GET /api/seasons/{id}/plantings (src/lib/server/plantings-cache.ts).
//
// Every row of the tables that answer is built from gets a `change_seq`: a number from one
// database sequence, set by a trigger on every INSERT and UPDATE, whoever writes (the app, an
// import, a script, an operator at the SQL prompt). The cache keeps an answer beside the
// (count, highest change_seq) of each of those tables for the farm: an insert or an update raises
// the highest stamp, a delete lowers the count (also a delete by a foreign-key cascade, which
// fires no trigger), so one cheap indexed query tells whether the kept answer still holds.
//
// A sequence rather than a counter row: concurrent writers never wait on one another for it (a
// sequence is not transactional) and cannot deadlock over it.
import type { Knex } from 'knex';

/** Each stamped table and the index its stamp is read through (first the farm, as every query's). */
export const stamped: { table: string; index: string[] }[] = [
	{ table: 'plantings', index: ['farm_id', 'season_id', 'change_seq'] },
	{ table: 'varieties', index: ['farm_id', 'change_seq'] },
	{ table: 'crops', index: ['farm_id', 'change_seq'] },
	{ table: 'beds', index: ['farm_id', 'change_seq'] },
	{ table: 'blocks', index: ['farm_id', 'change_seq'] },
	{ table: 'farm_weekly_temps', index: ['farm_id', 'change_seq'] },
	{ table: 'seasons', index: ['farm_id', 'change_seq'] },
	{ table: 'farms', index: ['change_seq'] },
	// A planting shows the name of who changed it last: any user's name change counts (below).
	{ table: 'users', index: ['change_seq'] }
];

const indexName = (table: string) => `${table}_change_seq_idx`;

export async function up(knex: Knex): Promise<void> {
	await knex.raw('CREATE SEQUENCE IF NOT EXISTS change_seq START WITH 1 INCREMENT BY 1 CACHE 1000');
	for (const { table, index } of stamped) {
		await knex.raw(
			`ALTER TABLE ?? ADD COLUMN change_seq BIGINT UNSIGNED NOT NULL DEFAULT 0, ADD INDEX ?? (${index.map(() => '??').join(', ')})`,
			[table, indexName(table), ...index]
		);
		await knex.raw(
			`CREATE TRIGGER ?? BEFORE INSERT ON ?? FOR EACH ROW SET NEW.change_seq = NEXT VALUE FOR change_seq`,
			[`${table}_stamp_insert`, table]
		);
		// Users: only a new name counts (a new password is no news to a planting list).
		const stamp =
			table === 'users'
				? 'IF(NEW.name <=> OLD.name, OLD.change_seq, NEXT VALUE FOR change_seq)'
				: 'NEXT VALUE FOR change_seq';
		await knex.raw(`CREATE TRIGGER ?? BEFORE UPDATE ON ?? FOR EACH ROW SET NEW.change_seq = ${stamp}`, [
			`${table}_stamp_update`,
			table
		]);
	}
	// A user who goes takes their name off the plantings they last changed (the foreign key would
	// do it too, but a cascade fires no trigger): done here first, so those plantings are stamped.
	await knex.raw(
		'CREATE TRIGGER users_stamp_delete BEFORE DELETE ON users FOR EACH ROW UPDATE plantings SET updated_by = NULL WHERE updated_by = OLD.id'
	);
}

export async function down(knex: Knex): Promise<void> {
	await knex.raw('DROP TRIGGER IF EXISTS users_stamp_delete');
	for (const { table } of stamped) {
		await knex.raw('DROP TRIGGER IF EXISTS ??', [`${table}_stamp_insert`]);
		await knex.raw('DROP TRIGGER IF EXISTS ??', [`${table}_stamp_update`]);
		await knex.raw('ALTER TABLE ?? DROP INDEX ??, DROP COLUMN change_seq', [table, indexName(table)]);
	}
	await knex.raw('DROP SEQUENCE IF EXISTS change_seq');
}
