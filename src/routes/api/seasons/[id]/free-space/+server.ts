import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guards';
import { seasonFromParams } from '$lib/server/api';
import { freeSpaceQuerySchema } from '$lib/schemas/free-space';
import { fieldErrors } from '$lib/schemas/common';
import { freeSpaceFor } from '$lib/server/timeline';

/** GET ?from=YYYY-Www&to=YYYY-Www[&minFt=][&block=]: per bed, the foot ranges free for all of those weeks. Every role may ask. */
export const GET: RequestHandler = async (event) => {
	const { farm } = requireUser(event);
	const season = await seasonFromParams(farm.id, event.params.id);
	const parsed = freeSpaceQuerySchema.safeParse(Object.fromEntries(event.url.searchParams));
	if (!parsed.success) {
		const errors = fieldErrors(parsed.error);
		return json(
			{
				message: `Invalid query: ${Object.entries(errors)
					.map(([k, v]) => `${k}: ${v}`)
					.join('; ')}`,
				errors
			},
			{ status: 400 }
		);
	}
	return json({ season: { id: season.id, name: season.name }, ...(await freeSpaceFor(farm.id, parsed.data)) });
};
