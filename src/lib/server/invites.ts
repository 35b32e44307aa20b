// Invitations by e-mail with a role. A link works once and expires after FC_INVITE_DAYS (7).
import type { Role } from '$lib/roles';
import { env } from '$env/dynamic/private';
import { db } from './db';
import { hashToken, newToken } from './tokens';
import { createInvitedUser } from './users';

const inviteDays = () => Number(env.FC_INVITE_DAYS ?? 7);

export async function createInvite(farmId: number, invitedBy: string, email: string, role: Role): Promise<{ token: string; expiresAt: Date }> {
	const { token, hash } = newToken();
	const expiresAt = new Date(Date.now() + inviteDays() * 86_400_000);
	await db()('invites').insert({ farm_id: farmId, email, role, token_hash: hash, invited_by: invitedBy, expires_at: expiresAt });
	return { token, expiresAt };
}

export interface OpenInvite {
	id: number;
	farmId: number;
	farmName: string;
	email: string;
	role: Role;
	expiresAt: Date;
	accountExists: boolean;
}

export type InviteLookup = { ok: true; invite: OpenInvite } | { ok: false; reason: string };

export async function findInvite(token: string): Promise<InviteLookup> {
	const row = await db()('invites as i')
		.join('farms as f', 'f.id', 'i.farm_id')
		.leftJoin('users as u', 'u.email', 'i.email')
		.where('i.token_hash', hashToken(token))
		.first('i.id', 'i.farm_id', 'f.name as farm_name', 'i.email', 'i.role', 'i.expires_at', 'i.accepted_at', 'u.id as user_id');
	if (!row) return { ok: false, reason: 'This invite link is not valid. Ask the farm owner for a new one.' };
	if (row.accepted_at) return { ok: false, reason: 'This invite has already been used. Sign in instead.' };
	if (new Date(row.expires_at).getTime() < Date.now()) return { ok: false, reason: 'This invite link has expired. Ask the farm owner to send a new one.' };
	return {
		ok: true,
		invite: { id: row.id, farmId: row.farm_id, farmName: row.farm_name, email: row.email, role: row.role, expiresAt: new Date(row.expires_at), accountExists: Boolean(row.user_id) }
	};
}

/** Accepts an invite: creates (or reuses) the account, adds the membership, closes the invite. */
export async function acceptInvite(invite: OpenInvite, name: string, password: string): Promise<string> {
	return db().transaction(async (trx) => {
		// Lock the invite row so two tabs cannot accept the same link twice.
		const fresh = await trx('invites').where({ id: invite.id }).whereNull('accepted_at').forUpdate().first('id');
		if (!fresh) throw new Error('This invite has already been used. Sign in instead.');
		const userId = await createInvitedUser(trx, { email: invite.email, name, password, farmId: invite.farmId, role: invite.role });
		await trx('invites').where({ id: invite.id }).update({ accepted_at: new Date() });
		return userId;
	});
}

export async function listOpenInvites(farmId: number): Promise<{ id: number; email: string; role: Role; expiresAt: string }[]> {
	const rows: { id: number; email: string; role: Role; expires_at: Date }[] = await db()('invites')
		.where({ farm_id: farmId })
		.whereNull('accepted_at')
		.where('expires_at', '>', new Date())
		.orderBy('created_at', 'desc')
		.select('id', 'email', 'role', 'expires_at');
	return rows.map((r) => ({ id: r.id, email: r.email, role: r.role, expiresAt: new Date(r.expires_at).toISOString() }));
}

export async function revokeInvite(farmId: number, id: number): Promise<void> {
	await db()('invites').where({ farm_id: farmId, id }).whereNull('accepted_at').delete();
}
