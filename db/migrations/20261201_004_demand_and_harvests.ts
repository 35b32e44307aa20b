// What the farm must supply (share sizes, box contents, market and restaurant demand)
// and what it actually harvested. Weeks are ISO 8601 weeks stored as 'YYYY-Www'.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('share_sizes', (t) => {
		t.increments('id').primary();
		t.integer('farm_id').unsigned().notNullable().references('farms.id').onDelete('CASCADE');
		t.integer('season_id').unsigned().notNullable().references('seasons.id').onDelete('CASCADE');
		t.string('name', 60).notNullable();
		t.integer('members').unsigned().notNullable();
		t.specificType('first_week', 'CHAR(8)').notNullable();
		t.specificType('last_week', 'CHAR(8)').notNullable();
		t.string('pickup_days', 60).notNullable().defaultTo('');
		t.integer('price_cents').unsigned().notNullable().defaultTo(0);
		t.unique(['season_id', 'name']);
	});
	await knex.schema.createTable('box_items', (t) => {
		t.increments('id').primary();
		t.integer('share_size_id').unsigned().notNullable().references('share_sizes.id').onDelete('CASCADE');
		t.specificType('week', 'CHAR(8)').notNullable();
		t.integer('crop_id').unsigned().notNullable().references('crops.id').onDelete('CASCADE');
		t.decimal('quantity', 9, 2).notNullable();
		t.enum('unit', ['lb', 'bunch', 'head', 'each']).notNullable();
		t.unique(['share_size_id', 'week', 'crop_id']);
		t.index(['crop_id', 'week']);
	});
	await knex.schema.createTable('channel_demand', (t) => {
		t.increments('id').primary();
		t.integer('farm_id').unsigned().notNullable().references('farms.id').onDelete('CASCADE');
		t.integer('season_id').unsigned().notNullable().references('seasons.id').onDelete('CASCADE');
		t.enum('channel', ['market', 'restaurant']).notNullable();
		t.integer('crop_id').unsigned().notNullable().references('crops.id').onDelete('CASCADE');
		t.specificType('week', 'CHAR(8)').notNullable();
		t.decimal('quantity', 10, 2).notNullable();
		t.unique(['season_id', 'channel', 'crop_id', 'week']);
	});
	await knex.schema.createTable('harvest_records', (t) => {
		t.increments('id').primary();
		t.integer('farm_id').unsigned().notNullable().references('farms.id').onDelete('CASCADE');
		t.integer('planting_id').unsigned().notNullable().references('plantings.id').onDelete('CASCADE');
		t.date('harvested_on').notNullable();
		t.decimal('quantity', 10, 2).notNullable();
		t.enum('unit', ['lb', 'bunch', 'head', 'each']).notNullable();
		t.string('recorded_by', 40).nullable().references('users.id').onDelete('SET NULL');
		t.text('notes').nullable();
		t.timestamp('created_at').notNullable().defaultTo(knex.fn.now());
		t.index(['planting_id']);
		t.index(['farm_id', 'harvested_on']);
	});
}

export async function down(knex: Knex): Promise<void> {
	for (const table of ['harvest_records', 'channel_demand', 'box_items', 'share_sizes'])
		await knex.schema.dropTableIfExists(table);
}
