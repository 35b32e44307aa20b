// Every crew-sheet tick, with what the planting held before it, so a wrong tap on a phone can be
// taken back in one step (status and actual date as they were) and both the tick and its undoing
// stay on record with who and when.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('task_marks', (t) => {
		t.increments('id').primary();
		t.integer('farm_id').unsigned().notNullable();
		t.integer('planting_id').unsigned().notNullable();
		t.string('kind', 16).notNullable();
		t.date('done_on').notNullable();
		// JSON of the planting's fields the tick changed, as they were before it.
		t.text('before_values').notNullable();
		// The planting's version the tick wrote: an undo holds only while nobody changed it since.
		t.integer('version_after').unsigned().notNullable();
		t.string('marked_by', 40).nullable().references('users.id').onDelete('SET NULL');
		t.timestamp('marked_at').notNullable().defaultTo(knex.fn.now());
		t.timestamp('undone_at').nullable();
		t.string('undone_by', 40).nullable().references('users.id').onDelete('SET NULL');
		t.index(['farm_id', 'planting_id'], 'task_marks_farm_planting_idx');
		// A tick belongs to a planting of the same farm, and goes with it.
		t.foreign(['farm_id', 'planting_id'], 'task_marks_planting_farm_fk')
			.references(['farm_id', 'id'])
			.inTable('plantings')
			.onDelete('CASCADE');
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('task_marks');
}
