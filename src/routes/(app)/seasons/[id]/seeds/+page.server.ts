import type { PageServerLoad } from './$types';
import { requireCan } from '$lib/server/guards';
import { seasonSeedOrder } from '$lib/server/seed-order';

export const load = (async (event) => {
	const { farm } = requireCan(event, 'plan.read');
	const { season } = await event.parent();
	return { order: await seasonSeedOrder(farm.id, season) };
}) satisfies PageServerLoad;
