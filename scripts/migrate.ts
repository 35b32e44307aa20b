// Runs the Knex migrations: `tsx scripts/migrate.ts [latest|rollback-all|fresh] [database]`.
import knex from 'knex';
import { knexConfig } from '../knexfile';

const [command = 'latest', database = process.env.FC_DB_NAME ?? 'furrowcast'] = process.argv.slice(2);
const conn = knex(knexConfig(database));
try {
	if (command === 'rollback-all' || command === 'fresh') await conn.migrate.rollback(undefined, true);
	if (command === 'latest' || command === 'fresh') {
		const [batch, names] = await conn.migrate.latest();
		console.log(
			names.length
				? `[migrate] ${database}: batch ${batch}, ${names.length} migration(s)`
				: `[migrate] ${database}: up to date`
		);
	}
} catch (error) {
	console.error(`[migrate] ${database}: ${(error as Error).message}`);
	process.exitCode = 1;
} finally {
	await conn.destroy();
}
