// Direct access to the test database, for arranging rows and checking what a request wrote.
import knex, { type Knex } from 'knex';
import { knexConfig } from '../../knexfile';

let instance: Knex | undefined;
export function testDb(): Knex {
	instance ??= knex(knexConfig(process.env.FC_DB_NAME ?? 'furrowcast_test'));
	return instance;
}

export async function closeTestDb(): Promise<void> {
	await instance?.destroy();
	instance = undefined;
}

export async function count(table: string, where: Record<string, unknown> = {}): Promise<number> {
	const row = await testDb()(table).where(where).count({ n: '*' }).first();
	return Number(row?.n ?? 0);
}

/** A unique e-mail for one test, so tests never collide on the unique index. */
export function uniqueEmail(tag: string): string {
	return `${tag}-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 8)}@test.furrowcast.test`;
}
