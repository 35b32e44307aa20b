import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guards';
import { listCrops, seasonWeeks } from '$lib/server/forecast';

// The numbers themselves are fetched in the browser from /api/seasons/{id}/forecast, so the
// charts can refresh when the plan changes without reloading the page.
export const load = (async (event) => {
	const { farm } = requireUser(event);
	const { season } = await event.parent();
	return { crops: await listCrops(farm.id), weeks: seasonWeeks(season) };
}) satisfies PageServerLoad;
