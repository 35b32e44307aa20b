import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guards';
import * as seasons from '$lib/server/seasons';
import { listForSeason } from '$lib/server/plantings';

export const GET: RequestHandler = async (event) => {
	const { farm } = requireUser(event);
	const id = Number(event.params.id);
	// Another farm's season answers exactly like a missing one.
	const season = Number.isInteger(id) ? await seasons.get(farm.id, id) : null;
	if (!season) error(404, 'No such season on this farm.');
	return json({ season, plantings: await listForSeason(farm.id, season.id) });
};
