import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guards';
import { listCrops, seasonWeeks } from '$lib/server/forecast';
import { planFreshness } from '$lib/server/seasons';

// The numbers themselves are fetched in the browser from /api/seasons/{id}/forecast, so the
// charts can refresh when the plan changes without reloading the page.
export const load = (async (event) => {
	const { farm } = requireUser(event);
	const { season } = await event.parent();
	const [crops, freshness] = await Promise.all([listCrops(farm.id), planFreshness(farm.id, season.id)]);
	return { crops, weeks: seasonWeeks(season), freshness };
}) satisfies PageServerLoad;
