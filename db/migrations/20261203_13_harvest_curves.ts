// Harvest curves and storage: how a crop's yield spreads over its harvest window (flat; ramp,
// peak and tail; one cut; several cuts), per crop with a per-variety override, and for storage
// crops how many weeks the harvest keeps and what share is lost each week in store.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.alterTable('crops', (t) => {
		t.string('harvest_curve', 8).notNullable().defaultTo('flat');
		t.smallint('harvest_cut_interval_days').unsigned().nullable();
		t.smallint('storage_weeks').unsigned().nullable();
		t.decimal('storage_loss_per_week', 5, 4).nullable();
	});
	await knex.schema.alterTable('varieties', (t) => {
		// Null: the crop's curve.
		t.string('harvest_curve', 8).nullable();
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('varieties', (t) => {
		t.dropColumn('harvest_curve');
	});
	await knex.schema.alterTable('crops', (t) => {
		t.dropColumn('harvest_curve');
		t.dropColumn('harvest_cut_interval_days');
		t.dropColumn('storage_weeks');
		t.dropColumn('storage_loss_per_week');
	});
}
