// Sign-ups wait for the address to be confirmed: the form's answer is the same for a new and a taken
// address, and the farm is made only when the link mailed to a new address is followed. A row per
// sign-up asked for; rows expire after 24 hours. `token_hash` is null for an address that already had
// an account (it got a note instead of a link). `viewer_hash` ties the row to the browser that asked,
// for Mail (dev) in demo mode only.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('signup_requests', (t) => {
		t.increments('id').primary();
		t.string('email', 254).notNullable();
		t.specificType('token_hash', 'CHAR(64)').nullable().unique();
		t.specificType('viewer_hash', 'CHAR(64)').nullable();
		t.string('name', 120).nullable();
		t.string('password_hash', 255).nullable();
		t.string('farm_name', 120).nullable();
		t.decimal('latitude', 8, 5).nullable();
		t.date('last_spring_frost').nullable();
		t.date('first_fall_frost').nullable();
		t.datetime('expires_at').notNullable();
		t.timestamp('created_at').notNullable().defaultTo(knex.fn.now());
		t.index(['email']);
		t.index(['viewer_hash']);
		t.index(['expires_at']);
	});
}

export async function down(knex: Knex): Promise<void> {
	await knex.schema.dropTableIfExists('signup_requests');
}
