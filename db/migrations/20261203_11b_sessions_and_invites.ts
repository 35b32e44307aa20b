// When each session began, so renewal can stop at an absolute lifetime; and whether each invite's
// mail went out, so an invite whose mail failed is shown as "not sent" with a resend button.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.alterTable('user_sessions', (t) => {
		// Written by the app in UTC with every new session. Sessions from before this column have none
		// and count from now on: they end at the absolute lifetime from the moment of this migration.
		t.datetime('created_at').notNullable().defaultTo(knex.fn.now());
	});
	await knex.schema.alterTable('invites', (t) => {
		// Null until the mail server accepted the invite; existing invites were sent when they were made.
		t.datetime('sent_at').nullable();
	});
	await knex('invites').update({ sent_at: knex.ref('created_at') });
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.alterTable('invites', (t) => t.dropColumn('sent_at'));
	await knex.schema.alterTable('user_sessions', (t) => t.dropColumn('created_at'));
}
