// The ground and the crop library: blocks, beds (bed-foot coordinates), crops and varieties.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('blocks', (t) => {
		t.increments('id').primary();
		t.integer('farm_id').unsigned().notNullable().references('farms.id').onDelete('CASCADE');
		t.string('name', 60).notNullable();
		t.integer('position').notNullable().defaultTo(0);
		t.unique(['farm_id', 'name']);
	});
	await knex.schema.createTable('beds', (t) => {
		t.increments('id').primary();
		t.integer('farm_id').unsigned().notNullable().references('farms.id').onDelete('CASCADE');
		t.integer('block_id').unsigned().notNullable().references('blocks.id').onDelete('RESTRICT');
		t.string('name', 60).notNullable();
		t.decimal('length_ft', 7, 1).notNullable();
		t.integer('width_in').unsigned().notNullable().defaultTo(30);
		// Walking order within the block, for crew sheets.
		t.integer('position').notNullable().defaultTo(0);
		t.unique(['farm_id', 'name']);
		t.index(['block_id', 'position']);
	});
	await knex.schema.createTable('crops', (t) => {
		t.increments('id').primary();
		t.integer('farm_id').unsigned().notNullable().references('farms.id').onDelete('CASCADE');
		t.string('name', 80).notNullable();
		t.string('family', 40).notNullable();
		t.enum('harvest_unit', ['lb', 'bunch', 'head', 'each']).notNullable();
		t.enum('frost_tolerance', ['tender', 'hardy']).notNullable();
		t.decimal('heat_limit_f', 5, 1).nullable();
		t.decimal('base_temp_f', 5, 1).notNullable().defaultTo(40);
		t.unique(['farm_id', 'name']);
	});
	await knex.schema.createTable('varieties', (t) => {
		t.increments('id').primary();
		t.integer('farm_id').unsigned().notNullable().references('farms.id').onDelete('CASCADE');
		t.integer('crop_id').unsigned().notNullable().references('crops.id').onDelete('CASCADE');
		t.string('name', 80).notNullable();
		t.enum('method', ['direct', 'transplant']).notNullable();
		t.integer('days_to_maturity').unsigned().notNullable();
		t.integer('days_in_tray').unsigned().notNullable().defaultTo(0);
		t.integer('harvest_window_days').unsigned().notNullable();
		t.decimal('yield_per_bed_foot', 9, 3).notNullable();
		t.integer('rows_per_bed').unsigned().notNullable();
		t.decimal('in_row_spacing_in', 5, 2).notNullable();
		t.integer('seeds_per_spot').unsigned().notNullable().defaultTo(1);
		t.decimal('germination_rate', 4, 3).notNullable();
		t.decimal('seeds_per_gram', 10, 2).notNullable();
		t.integer('seed_price_cents_per_gram').unsigned().notNullable().defaultTo(0);
		t.integer('seeds_per_packet').unsigned().nullable();
		t.integer('cells_per_tray').unsigned().notNullable().defaultTo(128);
		t.decimal('margin', 4, 3).notNullable().defaultTo(0.1);
		t.integer('gdd_to_maturity').unsigned().nullable();
		t.unique(['crop_id', 'name']);
		t.index(['farm_id']);
	});
}

export async function down(knex: Knex): Promise<void> {
	for (const table of ['varieties', 'crops', 'beds', 'blocks']) await knex.schema.dropTableIfExists(table);
}
