// Actual against plan as JSON (everyone on the farm): per planting, per crop and week, per variety.
import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guards';
import { seasonFromParams } from '$lib/server/api';
import { seasonActuals } from '$lib/server/actuals';

export const GET = (async (event) => {
	const { farm } = requireUser(event);
	const season = await seasonFromParams(farm.id, event.params.id);
	return json(await seasonActuals(farm.id, season.id));
}) satisfies RequestHandler;
