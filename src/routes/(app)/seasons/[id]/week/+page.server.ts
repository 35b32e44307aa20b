import { redirect } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guards';
import * as farms from '$lib/server/farms';
import { isoWeek } from '$lib/planning';
import { todayIn } from '$lib/today';

// The crew sheets open on the current ISO week as the farm's clock has it, not the server's.
// A season that has not begun (or is over) opens on its first (or last) week instead of a 404.
export const load = (async (event) => {
	const { farm } = requireUser(event);
	const { season } = await event.parent();
	const settings = await farms.get(farm.id);
	const today = todayIn(settings.timeZone);
	const day = today < season.startsOn ? season.startsOn : today > season.endsOn ? season.endsOn : today;
	redirect(307, `/seasons/${season.id}/week/${isoWeek(day)}`);
}) satisfies PageServerLoad;
