import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireCan } from '$lib/server/guards';
import { seasonFromParams } from '$lib/server/api';
import { lastApply, planFingerprint } from '$lib/server/plan-history';
import { planFreshness } from '$lib/server/seasons';

/**
 * The season's plan state, every role: the current fingerprint (a preview whose fingerprint differs
 * is stale), when the plan was last applied and whether demand changed since, and the last apply.
 */
export const GET: RequestHandler = async (event) => {
	const { farm } = requireCan(event, 'plan.read');
	const season = await seasonFromParams(farm.id, event.params.id);
	const [fingerprint, freshness, last] = await Promise.all([
		planFingerprint(farm.id, season.id),
		planFreshness(farm.id, season.id),
		lastApply(farm.id, season.id)
	]);
	return json({ fingerprint, ...freshness, lastApply: last });
};
