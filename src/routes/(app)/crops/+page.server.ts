import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guards';
import { listVarieties } from '$lib/server/crops';

export const load = (async (event) => {
	const { farm } = requireUser(event);
	return { varieties: await listVarieties(farm.id) };
}) satisfies PageServerLoad;
