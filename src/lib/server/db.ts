// The one Knex instance of the app. It connects with the row-only account and fails fast
// when its settings are missing, rather than guessing at a database.
import knex, { type Knex } from 'knex';
import { env } from '$env/dynamic/private';

function setting(name: string): string {
	const value = env[name];
	if (!value) throw new Error(`${name} is not set: start the app with npm start (see README, Configuration)`);
	return value;
}

/** Where the app's row-only account connects: the Knex pool here and the session store (auth.ts). */
export function dbAccount(): { host: string; port: number; user: string; password: string; database: string } {
	return {
		host: setting('FC_DB_HOST'),
		port: Number(setting('FC_DB_PORT')),
		user: setting('FC_DB_USER'),
		password: setting('FC_DB_PASSWORD'),
		database: setting('FC_DB_NAME')
	};
}

function connect(): Knex {
	return knex({
		client: 'mysql2',
		connection: {
			...dbAccount(),
			timezone: 'Z',
			// Calendar dates stay 'YYYY-MM-DD' strings end to end: no time-zone drift.
			// mysql2 takes a list of column types here; knex's typing only knows the boolean form.
			dateStrings: ['DATE'] as unknown as boolean,
			decimalNumbers: true
		},
		pool: { min: 0, max: Number(env.FC_DB_POOL_MAX ?? 10) }
	});
}

let instance: Knex | undefined;

/** The shared Knex instance, created on first use. */
export function db(): Knex {
	instance ??= connect();
	return instance;
}

/** Closes the pool (on shutdown), so the process can exit once requests are done. */
export async function closeDb(): Promise<void> {
	const current = instance;
	instance = undefined;
	await current?.destroy();
}
