import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireCan } from '$lib/server/guards';
import { varietyPlanErrors } from '$lib/server/variety-plan';
import { parseBody, seasonFromParams, invalidAnswer } from '$lib/server/api';
import { planRequestSchema } from '$lib/schemas/plan';
import { preview } from '$lib/server/plan';
import { planFingerprint } from '$lib/server/plan-history';
import { describePreview } from '$lib/server/plan-screen';
import { previewCover } from '$lib/server/plan-cover';

/**
 * Runs the engine on the season's targets and returns the proposal; writes nothing. `fingerprint`
 * names the state it was made from (send it back with apply); `changes` is what the plan screen lists;
 * `cover` who covers each crop-week after the apply, per planting (plan-cover.ts).
 */
export const POST: RequestHandler = async (event) => {
	const { farm } = requireCan(event, 'plan.edit');
	const season = await seasonFromParams(farm.id, event.params.id);
	const body = await parseBody(event, planRequestSchema);
	if (!body.ok) return body.response;
	const wrong = await varietyPlanErrors(farm.id, body.data.varietyPlan);
	if (wrong) return invalidAnswer(wrong);
	// Taken before the run: if anything moves meanwhile, the apply from this preview is refused.
	const fingerprint = await planFingerprint(farm.id, season.id);
	const result = await preview(farm.id, season, body.data);
	const [details, cover] = await Promise.all([
		describePreview(farm.id, season, result),
		previewCover(farm.id, season, result.plan.plantings)
	]);
	const { balance, ...shares } = cover;
	return json({
		season,
		kept: result.kept,
		replaced: result.replaced,
		...result.plan,
		names: result.names,
		fingerprint,
		changes: { ...details, balance },
		cover: shares
	});
};
