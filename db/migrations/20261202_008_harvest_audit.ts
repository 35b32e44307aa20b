// The harvest log's audit trail (every create, edit and delete of a harvest record, with who,
// when, and the values before and after), and the record of variety figures the owner took
// over from observed harvests, so each change can be undone.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('harvest_audit', (t) => {
		t.increments('id').primary();
		t.integer('farm_id').unsigned().notNullable().references('farms.id').onDelete('CASCADE');
		// No foreign key to the record: the trail outlives a deleted harvest.
		t.integer('harvest_id').unsigned().notNullable();
		t.integer('planting_id').unsigned().nullable().references('plantings.id').onDelete('SET NULL');
		t.enum('action', ['create', 'update', 'delete']).notNullable();
		t.string('changed_by', 40).nullable().references('users.id').onDelete('SET NULL');
		t.timestamp('changed_at').notNullable().defaultTo(knex.fn.now());
		// JSON of the record's fields before and after; null for the side that did not exist.
		t.text('old_values').nullable();
		t.text('new_values').nullable();
		t.index(['farm_id', 'harvest_id']);
		t.index(['planting_id']);
	});
	await knex.schema.createTable('variety_figure_changes', (t) => {
		t.increments('id').primary();
		t.integer('farm_id').unsigned().notNullable().references('farms.id').onDelete('CASCADE');
		t.integer('variety_id').unsigned().notNullable().references('varieties.id').onDelete('CASCADE');
		t.integer('season_id').unsigned().nullable().references('seasons.id').onDelete('SET NULL');
		t.decimal('old_yield_per_bed_foot', 9, 3).notNullable();
		t.decimal('new_yield_per_bed_foot', 9, 3).notNullable();
		t.integer('old_days_to_maturity').unsigned().notNullable();
		t.integer('new_days_to_maturity').unsigned().notNullable();
		// How many plantings stood behind each figure when it was taken over.
		t.integer('yield_plantings').unsigned().notNullable().defaultTo(0);
		t.integer('dtm_plantings').unsigned().notNullable().defaultTo(0);
		t.string('changed_by', 40).nullable().references('users.id').onDelete('SET NULL');
		t.timestamp('changed_at').notNullable().defaultTo(knex.fn.now());
		t.timestamp('undone_at').nullable();
		t.string('undone_by', 40).nullable().references('users.id').onDelete('SET NULL');
		t.index(['farm_id', 'variety_id']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('variety_figure_changes');
	await knex.schema.dropTableIfExists('harvest_audit');
}
