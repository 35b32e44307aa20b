import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guards';
import { listCrops, seasonWeeks } from '$lib/server/forecast';
import { planFreshness } from '$lib/server/seasons';

// The numbers themselves come from /api/seasons/{id}/forecast through +page.ts, so the charts
// refresh when the plan changes without reloading the page; the freshness note follows the plan too.
export const load = (async (event) => {
	const { farm } = requireUser(event);
	event.depends('app:plan');
	const { season } = await event.parent();
	const [crops, freshness] = await Promise.all([listCrops(farm.id), planFreshness(farm.id, season.id)]);
	return { crops, weeks: seasonWeeks(season), freshness };
}) satisfies PageServerLoad;
