// Per-user settings of a grid (column widths, hidden columns). A user's own row only.
import type { GridPrefs } from '$lib/schemas/planting';
import { db } from './db';

const empty: GridPrefs = { widths: {}, hidden: [] };

export async function get(userId: string, grid: string): Promise<GridPrefs> {
	const r = await db()('user_grid_prefs').where({ user_id: userId, grid }).first('prefs');
	if (!r) return empty;
	try {
		return { ...empty, ...JSON.parse(r.prefs) };
	} catch {
		return empty;
	}
}

export async function save(userId: string, grid: string, prefs: GridPrefs): Promise<void> {
	await db()('user_grid_prefs')
		.insert({ user_id: userId, grid, prefs: JSON.stringify(prefs) })
		.onConflict(['user_id', 'grid'])
		.merge({ prefs: JSON.stringify(prefs), updated_at: db().fn.now() });
}
