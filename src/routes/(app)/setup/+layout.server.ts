import type { LayoutServerLoad } from './$types';
import { requireCan } from '$lib/server/guards';
import { db } from '$lib/server/db';

/** How far the farm is: the set-up steps show a tick for what is already there. */
export const load = (async (event) => {
	const { farm } = requireCan(event, 'farm.settings');
	const count = async (table: string): Promise<number> => {
		const r = await db()(table).where({ farm_id: farm.id }).count({ n: '*' }).first();
		return Number(r?.n ?? 0);
	};
	const [beds, crops, seasons] = await Promise.all([count('beds'), count('crops'), count('seasons')]);
	return { progress: { beds, crops, seasons } };
}) satisfies LayoutServerLoad;
