import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guards';
import { seasonFromParams } from '$lib/server/api';
import { getDemand, targetInput } from '$lib/server/demand';
import { deriveTargetsWithNotes } from '$lib/planning';

/** The season's demand and the weekly targets derived from it; every role may read. */
export const GET: RequestHandler = async (event) => {
	const { farm } = requireUser(event);
	const season = await seasonFromParams(farm.id, event.params.id);
	const [view, input] = await Promise.all([getDemand(farm.id, season.id), targetInput(farm.id, season.id)]);
	const { targets, notes } = deriveTargetsWithNotes(input);
	return json({
		season,
		...view,
		targets: targets.map((t) => ({ ...t, crop: Number(t.crop) })),
		notes: notes.map((n) => n.message)
	});
};
