// Column widths and hidden columns of the planting grid, kept per user (and per grid, so a
// later grid can keep its own). Stored as JSON text: the app validates it with zod on the way in.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('user_grid_prefs', (t) => {
		t.string('user_id', 40).notNullable().references('users.id').onDelete('CASCADE');
		t.string('grid', 40).notNullable();
		t.text('prefs').notNullable();
		t.timestamp('updated_at').notNullable().defaultTo(knex.fn.now());
		t.primary(['user_id', 'grid']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('user_grid_prefs');
}
