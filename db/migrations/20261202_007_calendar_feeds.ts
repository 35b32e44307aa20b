// Personal calendar feeds: a secret URL per user and farm that a calendar app polls without a
// session. Only the token's SHA-256 is kept (as for invites), so a copy of the table opens no
// feed; revoking sets revoked_at and the URL answers 404 from then on.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('calendar_feeds', (t) => {
		t.increments('id').primary();
		t.integer('farm_id').unsigned().notNullable().references('farms.id').onDelete('CASCADE');
		t.string('user_id', 40).notNullable().references('users.id').onDelete('CASCADE');
		t.specificType('token_hash', 'CHAR(64)').notNullable().unique();
		t.timestamp('created_at').notNullable().defaultTo(knex.fn.now());
		t.datetime('revoked_at').nullable();
		t.datetime('last_fetched_at').nullable();
		t.index(['farm_id', 'user_id']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('calendar_feeds');
}
