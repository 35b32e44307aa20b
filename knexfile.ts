// Knex settings for migrations and seeds. Migrations run as the schema-owning account;
// the app itself connects with the row-only account (src/lib/server/db.ts).
import type { Knex } from 'knex';
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const migrationsDir = fileURLToPath(new URL('./db/migrations', import.meta.url));

/**
 * The migration files, loaded with the importer of whoever runs them (tsx for the scripts,
 * Vitest's module runner in tests): Knex's own loader cannot read TypeScript on Node 20.
 * Names are the file names, as Knex itself would record them.
 */
export const migrationSource: Knex.MigrationSource<string> = {
	getMigrations: async () =>
		readdirSync(migrationsDir)
			.filter((f) => f.endsWith('.ts'))
			.sort(),
	getMigrationName: (file) => file,
	getMigration: async (file) => (await import(/* @vite-ignore */ join(migrationsDir, file))) as Knex.Migration
};

function required(name: string): string {
	const value = process.env[name];
	if (!value) throw new Error(`${name} is not set: run through npm start / npm test, or source scripts/env.sh`);
	return value;
}

export function knexConfig(database = process.env.FC_DB_NAME ?? 'furrowcast'): Knex.Config {
	return {
		client: 'mysql2',
		connection: {
			host: process.env.FC_DB_HOST ?? '127.0.0.1',
			port: Number(process.env.FC_DB_PORT ?? 3307),
			user: required('FC_DB_MIGRATE_USER'),
			password: required('FC_DB_MIGRATE_PASSWORD'),
			database,
			timezone: 'Z',
			// mysql2 takes a list of column types here; knex's typing only knows the boolean form.
			dateStrings: ['DATE'] as unknown as boolean,
			multipleStatements: false
		},
		pool: { min: 0, max: 4 },
		migrations: { migrationSource }
	};
}

export default knexConfig();
