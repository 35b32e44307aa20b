import { error } from '@sveltejs/kit';
import type { PageLoad } from './$types';
import type { PlantingsListAnswer } from '$lib/api-answers';

// The grid's data through SvelteKit's load, so `invalidate('app:plan')` after a save fetches it again
// (the API answers 304 from its ETag while nothing changed). Nothing secret: the JSON API checks the
// session and farm. The filters live in the page's address, not here, so changing one loads nothing.
// The grid preferences come from +page.server.ts, which a save does not rerun.
export const load = (async ({ fetch, params, depends, data }) => {
	depends('app:plan');
	const res = await fetch(`/api/seasons/${params.id}/plantings`);
	if (!res.ok) error(res.status, `The plantings could not be loaded (${res.status}).`);
	return { ...data, plantings: (await res.json()) as PlantingsListAnswer };
}) satisfies PageLoad;
