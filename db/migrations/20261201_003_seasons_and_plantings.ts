// A farm's seasons and the plantings in them. Each planting carries a version for
// optimistic concurrency: a write with a stale version is refused, never merged blindly.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('seasons', (t) => {
		t.increments('id').primary();
		t.integer('farm_id').unsigned().notNullable().references('farms.id').onDelete('CASCADE');
		t.smallint('year').notNullable();
		t.string('name', 80).notNullable();
		t.date('starts_on').notNullable();
		t.date('ends_on').notNullable();
		t.unique(['farm_id', 'year']);
	});
	await knex.schema.createTable('plantings', (t) => {
		t.increments('id').primary();
		t.integer('farm_id').unsigned().notNullable().references('farms.id').onDelete('CASCADE');
		t.integer('season_id').unsigned().notNullable().references('seasons.id').onDelete('CASCADE');
		t.integer('variety_id').unsigned().notNullable().references('varieties.id').onDelete('RESTRICT');
		t.integer('bed_id').unsigned().nullable().references('beds.id').onDelete('SET NULL');
		t.decimal('start_ft', 7, 1).notNullable().defaultTo(0);
		t.decimal('length_ft', 7, 1).notNullable();
		t.integer('rows').unsigned().notNullable();
		t.decimal('in_row_spacing_in', 5, 2).notNullable();
		t.integer('seeds_per_spot').unsigned().notNullable().defaultTo(1);
		t.enum('method', ['direct', 'transplant']).notNullable();
		t.date('tray_sow_date').nullable();
		// Sowing date for direct-sown plantings, transplanting date for transplants.
		t.date('field_date').notNullable();
		t.date('first_harvest').notNullable();
		t.date('last_harvest').notNullable();
		t.decimal('expected_yield', 11, 2).notNullable().defaultTo(0);
		t.integer('seeds_needed').unsigned().notNullable().defaultTo(0);
		t.enum('status', ['planned', 'sown', 'transplanted', 'harvesting', 'finished', 'failed'])
			.notNullable()
			.defaultTo('planned');
		t.date('actual_tray_sow_date').nullable();
		t.date('actual_field_date').nullable();
		t.date('actual_first_harvest').nullable();
		t.date('actual_last_harvest').nullable();
		t.text('notes').nullable();
		t.integer('version').unsigned().notNullable().defaultTo(1);
		t.string('updated_by', 40).nullable().references('users.id').onDelete('SET NULL');
		t.timestamp('created_at').notNullable().defaultTo(knex.fn.now());
		t.timestamp('updated_at').notNullable().defaultTo(knex.fn.now());
		t.index(['season_id', 'field_date']);
		t.index(['season_id', 'first_harvest']);
		t.index(['bed_id', 'field_date']);
		t.index(['farm_id']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('plantings');
	await knex.schema.dropTableIfExists('seasons');
}
