import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guards';
import { parseQuery, seasonFromParams } from '$lib/server/api';
import { freeSpaceQuerySchema } from '$lib/schemas/free-space';
import { freeSpaceFor } from '$lib/server/timeline';

/** GET ?from=YYYY-Www&to=YYYY-Www[&minFt=][&block=]: per bed, the foot ranges free for all of those weeks. Every role may ask. */
export const GET: RequestHandler = async (event) => {
	const { farm } = requireUser(event);
	const season = await seasonFromParams(farm.id, event.params.id);
	const parsed = parseQuery(event, freeSpaceQuerySchema);
	if (!parsed.ok) return parsed.response;
	return json({ season: { id: season.id, name: season.name }, ...(await freeSpaceFor(farm.id, parsed.data)) });
};
