import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireCan } from '$lib/server/guards';
import { varietyPlanErrors } from '$lib/server/variety-plan';
import { parseBody, seasonFromParams, invalidAnswer } from '$lib/server/api';
import { applyRequestSchema } from '$lib/schemas/plan';
import { apply } from '$lib/server/plan';
import { PlanConflictError } from '$lib/server/plan-history';

/**
 * Replaces the season's planned plantings with the engine's plan, in one transaction, keeping the
 * replaced ones for undo. With the preview's `fingerprint`, a season that moved on since is a 409.
 */
export const POST: RequestHandler = async (event) => {
	const { farm, user } = requireCan(event, 'plan.edit');
	const season = await seasonFromParams(farm.id, event.params.id);
	const body = await parseBody(event, applyRequestSchema);
	if (!body.ok) return body.response;
	const wrong = await varietyPlanErrors(farm.id, body.data.varietyPlan);
	if (wrong) return invalidAnswer(wrong);
	const { fingerprint, ...request } = body.data;
	try {
		const { preview, ...changes } = await apply(farm.id, season, user.id, request, fingerprint);
		return json({ season, ...changes, warnings: preview.plan.warnings, shortfall: preview.plan.shortfall });
	} catch (e) {
		if (e instanceof PlanConflictError)
			return json({ message: e.message, reason: e.reason, errors: { fingerprint: e.message } }, { status: 409 });
		throw e;
	}
};
