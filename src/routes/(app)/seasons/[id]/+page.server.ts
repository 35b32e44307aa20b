import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guards';
import { listForSeason } from '$lib/server/plantings';

export const load = (async (event) => {
	const { farm } = requireUser(event);
	const { season } = await event.parent();
	return { plantings: await listForSeason(farm.id, season.id) };
}) satisfies PageServerLoad;
