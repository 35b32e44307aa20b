// Invitations by e-mail with a role. A link works once and expires after FC_INVITE_DAYS (7).
// The row is written and committed first, the mail sent after: a mail server that is down leaves an
// invite marked "not sent" (sent_at null) that the owner can resend, never a half-done request.
import type { Role } from '$lib/roles';
import { roleLabels } from '$lib/roles';
import { env } from '$env/dynamic/private';
import { db } from './db';
import { sendMail } from './mail';
import { hashToken, newToken } from './tokens';
import { createInvitedUser } from './users';

const inviteDays = () => Number(env.FC_INVITE_DAYS ?? 7);

export interface NewInvite {
	id: number;
	email: string;
	role: Role;
	token: string;
	expiresAt: Date;
}

export async function createInvite(farmId: number, invitedBy: string, email: string, role: Role): Promise<NewInvite> {
	const { token, hash } = newToken();
	const expiresAt = new Date(Date.now() + inviteDays() * 86_400_000);
	const [id] = await db()('invites').insert({
		farm_id: farmId,
		email,
		role,
		token_hash: hash,
		invited_by: invitedBy,
		expires_at: expiresAt
	});
	return { id, email, role, token, expiresAt };
}

/**
 * Mails an invite whose row is already committed, and records that it went out. False (with the
 * error logged) when the mail server refused or could not be reached: the invite stays, marked not sent.
 */
export async function sendInvite(
	farmId: number,
	invite: NewInvite,
	from: { inviter: string; farmName: string; origin: string }
): Promise<boolean> {
	const link = `${from.origin}/invite/${invite.token}`;
	const role = roleLabels[invite.role].toLowerCase();
	const until = invite.expiresAt.toISOString().slice(0, 10);
	try {
		await sendMail({
			to: invite.email,
			subject: `${from.inviter} invites you to ${from.farmName} on Furrowcast`,
			text: `${from.inviter} invites you to join ${from.farmName} on Furrowcast as ${role}.\n\nAccept the invite here (the link works once, until ${until}):\n${link}\n`,
			html: `<p>${escapeHtml(from.inviter)} invites you to join <strong>${escapeHtml(from.farmName)}</strong> on Furrowcast as ${role}.</p><p><a href="${link}">Accept the invite</a> (the link works once, until ${until}).</p>`
		});
	} catch (error) {
		console.error(`[invites] mail to invite ${invite.id} failed:`, (error as Error).message);
		return false;
	}
	await db()('invites').where({ farm_id: farmId, id: invite.id }).update({ sent_at: new Date() });
	return true;
}

/**
 * A fresh link for an open invite of this farm (only the token's hash is kept, so the old link cannot
 * be mailed again; it stops working). Null when there is no such open invite.
 */
export async function renewInvite(farmId: number, id: number): Promise<NewInvite | null> {
	const { token, hash } = newToken();
	const expiresAt = new Date(Date.now() + inviteDays() * 86_400_000);
	const row: { email: string; role: Role } | undefined = await db()('invites')
		.where({ farm_id: farmId, id })
		.whereNull('accepted_at')
		.first('email', 'role');
	if (!row) return null;
	const changed = await db()('invites')
		.where({ farm_id: farmId, id })
		.whereNull('accepted_at')
		.update({ token_hash: hash, expires_at: expiresAt, sent_at: null });
	return changed ? { id, email: row.email, role: row.role, token, expiresAt } : null;
}

function escapeHtml(s: string): string {
	return s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
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
		.first(
			'i.id',
			'i.farm_id',
			'f.name as farm_name',
			'i.email',
			'i.role',
			'i.expires_at',
			'i.accepted_at',
			'u.id as user_id'
		);
	if (!row) return { ok: false, reason: 'This invite link is not valid. Ask the farm owner for a new one.' };
	if (row.accepted_at) return { ok: false, reason: 'This invite has already been used. Sign in instead.' };
	if (new Date(row.expires_at).getTime() < Date.now())
		return { ok: false, reason: 'This invite link has expired. Ask the farm owner to send a new one.' };
	return {
		ok: true,
		invite: {
			id: row.id,
			farmId: row.farm_id,
			farmName: row.farm_name,
			email: row.email,
			role: row.role,
			expiresAt: new Date(row.expires_at),
			accountExists: Boolean(row.user_id)
		}
	};
}

/** Accepts an invite: creates (or reuses) the account, adds the membership, closes the invite. */
export async function acceptInvite(invite: OpenInvite, name: string, password: string): Promise<string> {
	return db().transaction(async (trx) => {
		// Lock the invite row so two tabs cannot accept the same link twice.
		const fresh = await trx('invites').where({ id: invite.id }).whereNull('accepted_at').forUpdate().first('id');
		if (!fresh) throw new Error('This invite has already been used. Sign in instead.');
		const userId = await createInvitedUser(trx, {
			email: invite.email,
			name,
			password,
			farmId: invite.farmId,
			role: invite.role
		});
		await trx('invites').where({ id: invite.id }).update({ accepted_at: new Date() });
		return userId;
	});
}

export async function listOpenInvites(
	farmId: number
): Promise<{ id: number; email: string; role: Role; expiresAt: string; sent: boolean }[]> {
	const rows: { id: number; email: string; role: Role; expires_at: Date; sent_at: Date | null }[] = await db()(
		'invites'
	)
		.where({ farm_id: farmId })
		.whereNull('accepted_at')
		.where('expires_at', '>', new Date())
		.orderBy('created_at', 'desc')
		.select('id', 'email', 'role', 'expires_at', 'sent_at');
	return rows.map((r) => ({
		id: r.id,
		email: r.email,
		role: r.role,
		expiresAt: new Date(r.expires_at).toISOString(),
		sent: r.sent_at !== null
	}));
}

export async function revokeInvite(farmId: number, id: number): Promise<void> {
	await db()('invites').where({ farm_id: farmId, id }).whereNull('accepted_at').delete();
}
