import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guards';

export const load = (async (event) => {
	requireUser(event);
	// The seasons themselves come from the (app) layout.
	return {};
}) satisfies PageServerLoad;
