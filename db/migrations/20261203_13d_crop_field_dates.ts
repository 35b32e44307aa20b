// A crop's field dates: the earliest and latest day of the year (month-day, "MM-DD") it may be sown
// or set out, both or neither. Outside them the grid warns and the planner proposes nothing.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.alterTable('crops', (t) => {
		t.string('sow_from', 5).nullable();
		t.string('sow_to', 5).nullable();
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('crops', (t) => {
		t.dropColumn('sow_from');
		t.dropColumn('sow_to');
	});
}
