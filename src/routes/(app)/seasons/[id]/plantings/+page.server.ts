import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guards';
import * as gridPrefs from '$lib/server/grid-prefs';

// The user's own column widths and hidden columns, read once with the page. They do not change with the
// plan, so this load takes no `app:plan` dependency: a save's `invalidate('app:plan')` reruns +page.ts
// (the plantings) and leaves these as they were.
export const load = (async (event) => {
	const { user } = requireUser(event);
	return { gridPrefs: await gridPrefs.get(user.id, 'plantings') };
}) satisfies PageServerLoad;
