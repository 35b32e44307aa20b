// The farm's currency (ISO 4217), for every sum of money the screens and files show. Amounts stay
// in the database as whole minor units (cents); only their display follows this code.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.alterTable('farms', (t) => {
		t.specificType('currency', 'CHAR(3)').notNullable().defaultTo('USD');
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('farms', (t) => {
		t.dropColumn('currency');
	});
}
