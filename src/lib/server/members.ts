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
	const rows: { user_id: string; name: string; email: string; role: Role; created_at: Date }[] = await db()('farm_members as m')
		.join('users as u', 'u.id', 'm.user_id')
		.where('m.farm_id', farmId)
		.select('m.user_id', 'u.name', 'u.email', 'm.role', 'm.created_at')
		.orderBy('u.name');
	return rows.map((r) => ({ userId: r.user_id, name: r.name, email: r.email, role: r.role, since: r.created_at.toISOString().slice(0, 10) }));
}
