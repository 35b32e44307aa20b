import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guards';
import { seasonOverview } from '$lib/server/season-overview';
import { planFreshness } from '$lib/server/seasons';

export const load = (async (event) => {
	const { farm } = requireUser(event);
	const { season } = await event.parent();
	const [overview, freshness] = await Promise.all([seasonOverview(farm.id, season), planFreshness(farm.id, season.id)]);
	return { overview, freshness };
}) satisfies PageServerLoad;
