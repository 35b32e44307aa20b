// Accounts: a confirmed sign-up (a farm and its owner in one transaction), look-ups, passwords.
import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import type { Role } from '$lib/roles';
import { db } from './db';
import { hashPassword, verifyPassword } from './password';

export interface UserRow {
	id: string;
	email: string;
	name: string;
	password_hash: string;
}

export function findByEmail(email: string): Promise<UserRow | undefined> {
	return db()('users').where({ email: email.toLowerCase() }).first();
}

export class DuplicateEmailError extends Error {
	constructor() {
		super('An account with this e-mail already exists. Sign in, or reset your password.');
	}
}

async function insertUser(
	trx: Knex.Transaction,
	input: { email: string; name: string; password: string }
): Promise<string> {
	const existing = await trx('users').where({ email: input.email.toLowerCase() }).first('id');
	if (existing) throw new DuplicateEmailError();
	const id = randomUUID();
	await trx('users').insert({
		id,
		email: input.email.toLowerCase(),
		name: input.name,
		password_hash: await hashPassword(input.password)
	});
	return id;
}

/**
 * A confirmed sign-up: the owner's account (its password hashed when the sign-up was asked for), the
 * farm and the membership, in the caller's transaction. DuplicateEmailError when the address has an
 * account by now.
 */
export async function createOwnerAndFarm(
	trx: Knex.Transaction,
	input: {
		name: string;
		email: string;
		passwordHash: string;
		farmName: string;
		latitude: number;
		lastSpringFrost: string;
		firstFallFrost: string;
	}
): Promise<{ userId: string; farmId: number }> {
	const email = input.email.toLowerCase();
	if (await trx('users').where({ email }).forUpdate().first('id')) throw new DuplicateEmailError();
	const userId = randomUUID();
	await trx('users').insert({ id: userId, email, name: input.name, password_hash: input.passwordHash });
	const [farmId] = await trx('farms').insert({
		name: input.farmName,
		latitude: input.latitude,
		last_spring_frost: input.lastSpringFrost,
		first_fall_frost: input.firstFallFrost
	});
	await trx('farm_members').insert({ farm_id: farmId, user_id: userId, role: 'owner' satisfies Role });
	return { userId, farmId };
}

/** Creates the account of an invited person and adds them to the farm, in one transaction. */
export async function createInvitedUser(
	trx: Knex.Transaction,
	input: { email: string; name: string; password: string; farmId: number; role: Role }
): Promise<string> {
	const existing: { id: string; password_hash: string } | undefined = await trx('users')
		.where({ email: input.email.toLowerCase() })
		.first('id', 'password_hash');
	// An existing account joins the farm once its owner proves it with the account's password.
	if (existing && !(await verifyPassword(existing.password_hash, input.password))) {
		throw new Error('An account with this e-mail exists: enter its current password to join.');
	}
	const userId = existing ? existing.id : await insertUser(trx, input);
	await trx('farm_members')
		.insert({ farm_id: input.farmId, user_id: userId, role: input.role })
		.onConflict(['farm_id', 'user_id'])
		.merge(['role']);
	return userId;
}

export async function setPassword(trx: Knex.Transaction, userId: string, password: string): Promise<void> {
	await trx('users')
		.where({ id: userId })
		.update({ password_hash: await hashPassword(password) });
}
