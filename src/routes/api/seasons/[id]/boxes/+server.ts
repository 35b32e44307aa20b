// GET /api/seasons/{id}/boxes — every share box of the season against the forecast, with
// substitutes for short items, the season summary and the swap history. Every role may read.
import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guards';
import { seasonFromParams } from '$lib/server/api';
import { matching } from '$lib/server/boxes';

export const GET: RequestHandler = async (event) => {
	const { farm } = requireUser(event);
	const season = await seasonFromParams(farm.id, event.params.id);
	return json(await matching(farm.id, season));
};
