import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireCan } from '$lib/server/guards';
import { parseBody, seasonFromParams } from '$lib/server/api';
import { planRequestSchema } from '$lib/schemas/plan';
import { apply } from '$lib/server/plan';

/** Replaces the season's planned plantings with the engine's plan, in one transaction. */
export const POST: RequestHandler = async (event) => {
	const { farm, user } = requireCan(event, 'plan.edit');
	const season = await seasonFromParams(farm.id, event.params.id);
	const body = await parseBody(event, planRequestSchema);
	if (!body.ok) return body.response;
	const { preview, ...changes } = await apply(farm.id, season, user.id, body.data);
	return json({ season, ...changes, warnings: preview.plan.warnings, shortfall: preview.plan.shortfall });
};
