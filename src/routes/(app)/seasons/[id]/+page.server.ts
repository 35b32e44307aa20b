import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guards';
import * as seasons from '$lib/server/seasons';
import { listForSeason } from '$lib/server/plantings';

export const load = (async (event) => {
	const { farm } = requireUser(event);
	const id = Number(event.params.id);
	const season = Number.isInteger(id) ? await seasons.get(farm.id, id) : null;
	if (!season) error(404, 'No such season on this farm.');
	const plantings = await listForSeason(farm.id, season.id);
	return { season, plantings };
}) satisfies PageServerLoad;
