import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guards';
import { planScreenData } from '$lib/server/plan-screen-load';

// Every role reads the plan screen; only the owner previews, applies and undoes (the API checks).
export const load = (async (event) => {
	const { farm } = requireUser(event);
	const { season } = await event.parent();
	return { ...(await planScreenData(farm.id, season)), canPlan: farm.role === 'owner' };
}) satisfies PageServerLoad;
