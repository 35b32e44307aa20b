import type { Actions, PageServerLoad } from './$types';
import { fail, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/guards';
import {
	chooseSeasons,
	chosenSeasons,
	createFeed,
	currentSeasonIds,
	feedStatus,
	revokeFeed
} from '$lib/server/calendar';
import * as seasons from '$lib/server/seasons';
import * as farms from '$lib/server/farms';
import { todayIn } from '$lib/today';

export const load = (async (event) => {
	const { user, farm } = requireUser(event);
	const [feed, all, chosen, info] = await Promise.all([
		feedStatus(farm.id, user.id),
		seasons.list(farm.id),
		chosenSeasons(farm.id, user.id),
		farms.get(farm.id)
	]);
	const current = await currentSeasonIds(farm.id, todayIn(info.timeZone));
	return {
		feed,
		role: farm.role,
		seasons: all.map((x) => ({ id: x.id, name: x.name, startsOn: x.startsOn, endsOn: x.endsOn })),
		chosen,
		current
	};
}) satisfies PageServerLoad;

export const actions = {
	// The secret URL is shown once, in this response: only its hash is kept, so a 303 to a fresh
	// page could never show it again. Reloading the page afterwards shows the feed as open.
	create: async (event) => {
		const { user, farm } = requireUser(event);
		const token = await createFeed(farm.id, user.id);
		return { created: { url: `${event.url.origin}/calendar/${token}.ics` } };
	},
	// Which seasons the feed covers: the boxes ticked, or (with "current") the farm's current seasons.
	seasons: async (event) => {
		const { user, farm } = requireUser(event);
		const form = await event.request.formData().catch(() => null);
		if (!form) return fail(400, { seasonsError: 'Send the form as a form.' });
		if (form.get('current') === 'on') await chooseSeasons(farm.id, user.id, null);
		else {
			const ids = form
				.getAll('season')
				.map(Number)
				.filter((n) => Number.isInteger(n) && n > 0);
			if (!ids.length) return fail(400, { seasonsError: 'Tick at least one season, or choose the current seasons.' });
			await chooseSeasons(farm.id, user.id, ids);
		}
		redirect(303, '/calendar?seasons=1');
	},
	revoke: async (event) => {
		const { user, farm } = requireUser(event);
		await revokeFeed(farm.id, user.id);
		redirect(303, '/calendar?revoked=1');
	}
} satisfies Actions;
