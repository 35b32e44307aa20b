import { error } from '@sveltejs/kit';
import type { PageLoad } from './$types';
import type { PlantingsListAnswer } from '$lib/api-answers';
import type { GridPrefs } from '$lib/schemas/planting';

// The grid's data through SvelteKit's load, so `invalidate('app:plan')` after a save fetches it again
// (the API answers 304 from its ETag while nothing changed). Nothing secret: the JSON API checks the
// session and farm. The filters live in the page's address, not here, so changing one loads nothing.
export const load = (async ({ fetch, params, depends }) => {
	depends('app:plan');
	const [res, prefs] = await Promise.all([fetch(`/api/seasons/${params.id}/plantings`), fetch('/api/me/prefs/grid')]);
	if (!res.ok) error(res.status, `The plantings could not be loaded (${res.status}).`);
	const plantings = (await res.json()) as PlantingsListAnswer;
	const gridPrefs: GridPrefs = prefs.ok ? await prefs.json() : { widths: {}, hidden: [] };
	return { plantings, gridPrefs };
}) satisfies PageLoad;
