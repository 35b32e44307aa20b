// Substitutions in farm-share boxes: "this week, the full share gets 0.5 lb spinach instead of
// 0.5 lb carrots". Kept as a record (who, when) over the planned box contents rather than an
// edit of them, so a swap can be undone and the history stays readable.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('box_swaps', (t) => {
		t.increments('id').primary();
		t.integer('farm_id').unsigned().notNullable().references('farms.id').onDelete('CASCADE');
		t.integer('season_id').unsigned().notNullable().references('seasons.id').onDelete('CASCADE');
		t.integer('share_size_id').unsigned().notNullable().references('share_sizes.id').onDelete('CASCADE');
		t.specificType('week', 'CHAR(8)').notNullable();
		t.integer('from_crop_id').unsigned().notNullable().references('crops.id').onDelete('CASCADE');
		t.integer('to_crop_id').unsigned().notNullable().references('crops.id').onDelete('CASCADE');
		// Per box, in the harvest unit both crops share.
		t.decimal('quantity', 9, 2).notNullable();
		t.string('created_by', 40).nullable().references('users.id').onDelete('SET NULL');
		t.timestamp('created_at').notNullable().defaultTo(knex.fn.now());
		// An undone swap stays on record; only swaps with undone_at NULL change the boxes.
		t.timestamp('undone_at').nullable();
		t.string('undone_by', 40).nullable().references('users.id').onDelete('SET NULL');
		t.index(['season_id', 'week']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('box_swaps');
}
