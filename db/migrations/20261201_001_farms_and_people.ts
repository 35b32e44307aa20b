// Tenants and the people in them: farms, users, memberships with a role, sessions,
// invites, password resets and the sign-in rate-limit counters.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
	await knex.schema.createTable('farms', (t) => {
		t.increments('id').primary();
		t.string('name', 120).notNullable();
		t.string('time_zone', 64).notNullable().defaultTo('America/New_York');
		t.decimal('latitude', 8, 5).notNullable();
		t.enum('unit_system', ['imperial', 'metric']).notNullable().defaultTo('imperial');
		t.date('last_spring_frost').notNullable();
		t.date('first_fall_frost').notNullable();
		t.integer('bed_foot_increment').unsigned().notNullable().defaultTo(5);
		t.integer('turnaround_days').unsigned().notNullable().defaultTo(7);
		t.timestamp('created_at').notNullable().defaultTo(knex.fn.now());
	});
	// Normal weekly mean air temperature by ISO week number (1-53), for heat checks and degree days.
	await knex.schema.createTable('farm_weekly_temps', (t) => {
		t.integer('farm_id').unsigned().notNullable().references('farms.id').onDelete('CASCADE');
		t.tinyint('week_number').unsigned().notNullable();
		t.decimal('mean_temp_f', 5, 1).notNullable();
		t.primary(['farm_id', 'week_number']);
	});
	await knex.schema.createTable('users', (t) => {
		t.string('id', 40).primary();
		t.string('email', 254).notNullable().unique();
		t.string('name', 120).notNullable();
		t.string('password_hash', 255).notNullable();
		t.timestamp('created_at').notNullable().defaultTo(knex.fn.now());
	});
	await knex.schema.createTable('farm_members', (t) => {
		t.integer('farm_id').unsigned().notNullable().references('farms.id').onDelete('CASCADE');
		t.string('user_id', 40).notNullable().references('users.id').onDelete('CASCADE');
		t.enum('role', ['owner', 'crew_lead', 'share_manager']).notNullable();
		t.timestamp('created_at').notNullable().defaultTo(knex.fn.now());
		t.primary(['farm_id', 'user_id']);
		t.index(['user_id']);
	});
	// Columns as the Lucia MySQL adapter expects them; farm_id is the session's active farm.
	await knex.schema.createTable('user_sessions', (t) => {
		t.string('id', 255).primary();
		t.string('user_id', 40).notNullable().references('users.id').onDelete('CASCADE');
		t.datetime('expires_at').notNullable();
		t.integer('farm_id').unsigned().nullable().references('farms.id').onDelete('SET NULL');
		t.index(['user_id']);
	});
	await knex.schema.createTable('invites', (t) => {
		t.increments('id').primary();
		t.integer('farm_id').unsigned().notNullable().references('farms.id').onDelete('CASCADE');
		t.string('email', 254).notNullable();
		t.enum('role', ['owner', 'crew_lead', 'share_manager']).notNullable();
		// Only a hash of the token is kept: a copy of the table does not let anyone in.
		t.specificType('token_hash', 'CHAR(64)').notNullable().unique();
		t.string('invited_by', 40).nullable().references('users.id').onDelete('SET NULL');
		t.datetime('expires_at').notNullable();
		t.datetime('accepted_at').nullable();
		t.timestamp('created_at').notNullable().defaultTo(knex.fn.now());
		t.index(['farm_id', 'email']);
	});
	await knex.schema.createTable('password_resets', (t) => {
		t.specificType('token_hash', 'CHAR(64)').primary();
		t.string('user_id', 40).notNullable().references('users.id').onDelete('CASCADE');
		t.datetime('expires_at').notNullable();
		t.datetime('used_at').nullable();
		t.index(['user_id']);
	});
	// Shared counters for sign-in rate limits, so several app servers count together.
	await knex.schema.createTable('rate_limits', (t) => {
		t.string('key', 255).primary();
		t.integer('points').notNullable().defaultTo(0);
		t.bigInteger('expire').nullable();
	});
}

export async function down(knex: Knex): Promise<void> {
	for (const table of [
		'rate_limits',
		'password_resets',
		'invites',
		'user_sessions',
		'farm_members',
		'users',
		'farm_weekly_temps',
		'farms'
	]) {
		await knex.schema.dropTableIfExists(table);
	}
}
