import { redirect } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guards';
import * as farms from '$lib/server/farms';
import { isoWeek } from '$lib/planning';
import { addDays, weekStart } from '$lib/planning/iso-week';
import { nextTaskDate } from '$lib/server/sheets/next-task';
import { dayInSeason } from '$lib/server/seasons';
import { todayIn } from '$lib/today';

// The crew sheets open on the current ISO week as the farm's clock has it, not the server's.
// A season that has not begun (or is over) opens on its first (or last) week instead of a 404;
// a week with no work opens the next week that has some instead.
export const load = (async (event) => {
	const { farm } = requireUser(event);
	const { season } = await event.parent();
	const settings = await farms.get(farm.id);
	const today = todayIn(settings.timeZone);
	const day = dayInSeason(today, season);
	const week = isoWeek(day);
	// A week with nothing to do: on to the next week with work, saying which week was skipped.
	const monday = weekStart(week);
	const next = await nextTaskDate(farm.id, season.id, monday, season.endsOn);
	if (next && next > addDays(monday, 6))
		redirect(307, `/seasons/${season.id}/week/${isoWeek(next)}?quiet=${encodeURIComponent(week)}`);
	redirect(307, `/seasons/${season.id}/week/${week}`);
}) satisfies PageServerLoad;
