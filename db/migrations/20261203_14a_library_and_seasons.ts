// The crop library and seasons as the screens keep them: archived crops, varieties and seasons
// (hidden from new plans, kept for history); where a figure came from; a price per harvest unit
// (to size box swaps across units by value); the box fill below which a share item counts as
// short; and swaps into crops of another unit.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.alterTable('crops', (t) => {
		t.datetime('archived_at').nullable();
		t.integer('price_cents_per_unit').unsigned().nullable();
		t.string('source', 500).nullable();
	});
	await knex.schema.alterTable('varieties', (t) => {
		t.datetime('archived_at').nullable();
		t.string('source', 500).nullable();
	});
	await knex.schema.alterTable('seasons', (t) => {
		t.datetime('archived_at').nullable();
	});
	await knex.schema.alterTable('farms', (t) => {
		// Percent of an item's need; under it the item is flagged short on the share boxes page.
		t.integer('box_short_fill_pct').unsigned().notNullable().defaultTo(95);
	});
	await knex.schema.alterTable('box_swaps', (t) => {
		// A swap into a crop of another unit, sized by value: how much of to_crop goes in per box.
		// NULL keeps the old meaning (the same quantity, same unit).
		t.decimal('to_quantity', 9, 2).nullable();
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('box_swaps', (t) => t.dropColumn('to_quantity'));
	await knex.schema.alterTable('farms', (t) => t.dropColumn('box_short_fill_pct'));
	await knex.schema.alterTable('seasons', (t) => t.dropColumn('archived_at'));
	await knex.schema.alterTable('varieties', (t) => {
		t.dropColumn('source');
		t.dropColumn('archived_at');
	});
	await knex.schema.alterTable('crops', (t) => {
		t.dropColumn('source');
		t.dropColumn('price_cents_per_unit');
		t.dropColumn('archived_at');
	});
}
