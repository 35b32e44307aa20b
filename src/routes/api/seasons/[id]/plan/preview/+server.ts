import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireCan } from '$lib/server/guards';
import { parseBody, seasonFromParams } from '$lib/server/api';
import { planRequestSchema } from '$lib/schemas/plan';
import { preview } from '$lib/server/plan';

/** Runs the engine on the season's targets and returns the proposal; writes nothing. */
export const POST: RequestHandler = async (event) => {
	const { farm } = requireCan(event, 'plan.edit');
	const season = await seasonFromParams(farm.id, event.params.id);
	const body = await parseBody(event, planRequestSchema);
	if (!body.ok) return body.response;
	const result = await preview(farm.id, season, body.data);
	return json({ season, kept: result.kept, replaced: result.replaced, ...result.plan, names: result.names });
};
