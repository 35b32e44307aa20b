import type { Actions, PageServerLoad } from './$types';
import { redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/guards';
import { createFeed, feedStatus, revokeFeed } from '$lib/server/calendar';

export const load = (async (event) => {
	const { user, farm } = requireUser(event);
	return { feed: await feedStatus(farm.id, user.id), role: farm.role };
}) satisfies PageServerLoad;

export const actions = {
	// The secret URL is shown once, in this response: only its hash is kept, so a 303 to a fresh
	// page could never show it again. Reloading the page afterwards shows the feed as open.
	create: async (event) => {
		const { user, farm } = requireUser(event);
		const token = await createFeed(farm.id, user.id);
		return { created: { url: `${event.url.origin}/calendar/${token}.ics` } };
	},
	revoke: async (event) => {
		const { user, farm } = requireUser(event);
		await revokeFeed(farm.id, user.id);
		redirect(303, '/calendar?revoked=1');
	}
} satisfies Actions;
