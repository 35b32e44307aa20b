import type { PageServerLoad } from './$types';
import { requireCan } from '$lib/server/guards';
import { can } from '$lib/permissions';
import { planScreenData } from '$lib/server/plan-screen-load';

// Every role reads the plan screen; only the owner previews, applies and undoes (the API checks).
export const load = (async (event) => {
	const { farm } = requireCan(event, 'plan.read');
	const { season } = await event.parent();
	return { ...(await planScreenData(farm.id, season)), canPlan: can(farm.role, 'plan.edit') };
}) satisfies PageServerLoad;
