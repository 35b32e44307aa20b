// Farm settings for dates a grower can trust: the probability the frost dates stand for (they are
// climate normals, applied to every season's own year), how many days after the last spring frost
// frost-tender crops go out, and how many years back the rotation check looks.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.alterTable('farms', (t) => {
		t.tinyint('frost_probability_pct').unsigned().notNullable().defaultTo(50);
		t.smallint('tender_days_after_frost').unsigned().notNullable().defaultTo(7);
		t.tinyint('rotation_years').unsigned().notNullable().defaultTo(3);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('farms', (t) => {
		t.dropColumn('frost_probability_pct');
		t.dropColumn('tender_days_after_frost');
		t.dropColumn('rotation_years');
	});
}
