import { error } from '@sveltejs/kit';
import type { LayoutServerLoad } from './$types';
import { requireUser } from '$lib/server/guards';
import * as seasons from '$lib/server/seasons';
import { seasonTabsFor } from '$lib/season-tabs';

export const load = (async (event) => {
	const { farm } = requireUser(event);
	const id = Number(event.params.id);
	const season = Number.isInteger(id) && id > 0 ? await seasons.get(farm.id, id) : null;
	if (!season) error(404, 'No such season on this farm.');
	return { season, tabs: seasonTabsFor(farm.role) };
}) satisfies LayoutServerLoad;
