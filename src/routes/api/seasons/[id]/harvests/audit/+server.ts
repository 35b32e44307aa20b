// The harvest log's audit trail for a season: who changed which record, when, old and new values.
import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guards';
import { seasonFromParams } from '$lib/server/api';
import * as harvests from '$lib/server/harvests';

export const GET = (async (event) => {
	const { farm } = requireUser(event);
	const season = await seasonFromParams(farm.id, event.params.id);
	return json({ audit: await harvests.auditTrail(farm.id, season.id) });
}) satisfies RequestHandler;
