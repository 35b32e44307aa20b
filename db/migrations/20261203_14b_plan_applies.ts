// The plan screen's memory of each apply: when the season's plan was last applied and from which
// demand, a counter that makes a preview of an older state detectably stale, and a snapshot of the
// planned plantings each apply replaced, so "Undo last apply" can put them back exactly.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.alterTable('seasons', (t) => {
		// Bumped by every apply and undo; part of a preview's fingerprint.
		t.integer('plan_version').unsigned().notNullable().defaultTo(0);
		t.timestamp('plan_applied_at').nullable();
		// Hash of the weekly targets the last apply planned for: demand changed when today's differs.
		t.specificType('plan_demand_hash', 'CHAR(64)').nullable();
		// Set by every demand write (share sizes, box contents, market and restaurant demand, uploads).
		t.timestamp('demand_changed_at').nullable();
	});
	await knex.schema.createTable('plan_applies', (t) => {
		t.increments('id').primary();
		t.integer('farm_id').unsigned().notNullable().references('farms.id').onDelete('CASCADE');
		t.integer('season_id').unsigned().notNullable().references('seasons.id').onDelete('CASCADE');
		t.string('applied_by', 40).nullable().references('users.id').onDelete('SET NULL');
		t.timestamp('applied_at').notNullable().defaultTo(knex.fn.now());
		// The options of the run, as the plan screen sent them (JSON).
		t.text('options').notNullable();
		// The planned plantings this apply replaced, every column (JSON), and the ids it added (JSON).
		t.specificType('replaced', 'LONGTEXT').notNullable();
		t.specificType('added_ids', 'LONGTEXT').notNullable();
		// The season's demand hash and applied time before this apply, restored by an undo.
		t.specificType('previous_demand_hash', 'CHAR(64)').nullable();
		t.timestamp('previous_applied_at').nullable();
		t.timestamp('undone_at').nullable();
		t.string('undone_by', 40).nullable().references('users.id').onDelete('SET NULL');
		t.index(['season_id', 'id']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('plan_applies');
	await knex.schema.alterTable('seasons', (t) => {
		t.dropColumn('plan_version');
		t.dropColumn('plan_applied_at');
		t.dropColumn('plan_demand_hash');
		t.dropColumn('demand_changed_at');
	});
}
