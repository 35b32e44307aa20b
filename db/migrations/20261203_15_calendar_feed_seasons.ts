// Which seasons a calendar feed covers: a JSON list of season ids chosen on the calendar page,
// or NULL for the farm's current seasons (so test and past seasons stay out unless chosen).
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.alterTable('calendar_feeds', (t) => {
		t.string('season_ids', 1000).nullable();
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('calendar_feeds', (t) => {
		t.dropColumn('season_ids');
	});
}
