// Seeds the invented demo farm: `tsx scripts/seed.ts [database] [--reset]`.
// Idempotent: when the demo owner's farm is already there it is reused, untouched;
// --reset deletes the demo farm (and its users) first and seeds it afresh.
import knex from 'knex';
import { knexConfig } from '../knexfile';
import { DEMO_OWNER_EMAIL, DEMO_PASSWORD, countDemoFarm, ensureDemoFarm } from '../db/seeds/demo-farm';

const args = process.argv.slice(2);
const reset = args.includes('--reset');
const database = args.find((a) => !a.startsWith('--')) ?? process.env.FC_DB_NAME ?? 'furrowcast';

const conn = knex(knexConfig(database));
try {
	const { farmId, created } = await ensureDemoFarm(conn, { reset });
	const c = await countDemoFarm(conn, farmId);
	const what = created ? (reset ? 'reset and seeded' : 'seeded') : 'reused existing';
	console.log(
		`[seed] ${database}: ${what} demo farm #${farmId} — ${c.beds} beds, ${c.crops} crops, ${c.varieties} varieties, ` +
			`${c.users} users, ${c.boxItems} box items, ${c.channelDemand} channel demand rows, ${c.plantings} plantings (${c.unplaced} not placed), ` +
			`${c.harvestRecords} harvest records; sign in as ${DEMO_OWNER_EMAIL} / ${DEMO_PASSWORD}`
	);
} catch (error) {
	console.error(`[seed] ${database}: ${(error as Error).message}`);
	process.exitCode = 1;
} finally {
	await conn.destroy();
}
