// Farm memberships: who belongs to which farm, in which role.
import type { Role } from '$lib/roles';
import { db } from './db';

export interface Membership {
	farmId: number;
	farmName: string;
	role: Role;
}

/** The membership for the session's farm, or the user's first farm when the session has none. */
export async function resolveMembership(userId: string, preferredFarmId: number | null): Promise<Membership | null> {
	const rows: { farm_id: number; name: string; role: Role }[] = await db()('farm_members as m')
		.join('farms as f', 'f.id', 'm.farm_id')
		.where('m.user_id', userId)
		.select('m.farm_id', 'f.name', 'm.role')
		.orderBy('m.created_at');
	const row = rows.find((r) => r.farm_id === preferredFarmId) ?? rows[0];
	return row ? { farmId: row.farm_id, farmName: row.name, role: row.role } : null;
}

export interface Member {
	userId: string;
	name: string;
	email: string;
	role: Role;
	since: string;
}

export async function listMembers(farmId: number): Promise<Member[]> {
	const rows: { user_id: string; name: string; email: string; role: Role; created_at: Date }[] = await db()(
		'farm_members as m'
	)
		.join('users as u', 'u.id', 'm.user_id')
		.where('m.farm_id', farmId)
		.select('m.user_id', 'u.name', 'u.email', 'm.role', 'm.created_at')
		.orderBy('u.name');
	return rows.map((r) => ({
		userId: r.user_id,
		name: r.name,
		email: r.email,
		role: r.role,
		since: r.created_at.toISOString().slice(0, 10)
	}));
}

export class LastOwnerError extends Error {
	constructor(what: 'remove' | 'demote') {
		super(
			what === 'remove'
				? 'A farm needs at least one owner: make someone else owner before removing the last one.'
				: "A farm needs at least one owner: make someone else owner before changing the last owner's role."
		);
	}
}

/**
 * Changes a member's role, or removes the member (role null). The farm's owners are locked first, so
 * two owners demoting each other at once cannot leave the farm without one. False when the person is
 * not a member of this farm.
 */
export async function changeMember(farmId: number, userId: string, role: Role | null): Promise<boolean> {
	return db().transaction(async (trx) => {
		const rows: { user_id: string; role: Role }[] = await trx('farm_members')
			.where({ farm_id: farmId })
			.forUpdate()
			.select('user_id', 'role');
		const target = rows.find((r) => r.user_id === userId);
		if (!target) return false;
		const owners = rows.filter((r) => r.role === 'owner');
		if (target.role === 'owner' && role !== 'owner' && owners.length <= 1)
			throw new LastOwnerError(role === null ? 'remove' : 'demote');
		if (role === null) {
			await trx('farm_members').where({ farm_id: farmId, user_id: userId }).delete();
			// Their calendar link for this farm stops too (it checks membership, but a re-invite should not revive it).
			await trx('calendar_feeds')
				.where({ farm_id: farmId, user_id: userId })
				.whereNull('revoked_at')
				.update({ revoked_at: new Date() });
		} else await trx('farm_members').where({ farm_id: farmId, user_id: userId }).update({ role });
		return true;
	});
}
