// How the farm writes dates (a BCP 47 locale tag such as en-US or de-DE): pasted or typed dates
// like "6/24/2028" are read in its day/month order, whatever the browser of the day is set to.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.alterTable('farms', (t) => {
		t.string('date_locale', 35).notNullable().defaultTo('en-US');
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('farms', (t) => {
		t.dropColumn('date_locale');
	});
}
