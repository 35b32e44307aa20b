import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guards';
import { parseBody } from '$lib/server/api';
import * as prefs from '$lib/server/grid-prefs';
import { gridPrefsSchema } from '$lib/schemas/planting';

// Every role keeps its own widths and hidden columns: even a reader arranges what it reads.
export const GET: RequestHandler = async (event) => {
	const { user } = requireUser(event);
	return json(await prefs.get(user.id, 'plantings'));
};

export const PUT: RequestHandler = async (event) => {
	const { user } = requireUser(event);
	const body = await parseBody(event, gridPrefsSchema);
	if (!body.ok) return body.response;
	await prefs.save(user.id, 'plantings', body.data);
	return new Response(null, { status: 204 });
};
