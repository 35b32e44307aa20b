import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireCan } from '$lib/server/guards';
import { seasonFromParams } from '$lib/server/api';
import { PlanConflictError, undoLastApply } from '$lib/server/plan-history';

/** Undoes the season's last apply in one step: its plantings go, the ones it replaced come back. */
export const POST: RequestHandler = async (event) => {
	const { farm, user } = requireCan(event, 'plan.edit');
	const season = await seasonFromParams(farm.id, event.params.id);
	try {
		return json({ season, ...(await undoLastApply(farm.id, season.id, user.id)) });
	} catch (e) {
		if (e instanceof PlanConflictError) return json({ message: e.message, reason: e.reason }, { status: 409 });
		throw e;
	}
};
