// GET /api/plantings/{id}/cover — the weeks a planting harvests, each with the crop's target, the
// planting's share, the other plantings' shares and what is left short or over (server/cover.ts).
// Every member of the farm may read it; another farm's planting answers 404.
import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guards';
import { plantingCover } from '$lib/server/cover';

export const GET: RequestHandler = async (event) => {
	const { farm } = requireUser(event);
	const id = Number(event.params.id);
	if (!Number.isSafeInteger(id) || id <= 0) error(404, 'No such planting on this farm.');
	const cover = await plantingCover(farm.id, id);
	if (!cover) error(404, 'No such planting on this farm.');
	return json(cover);
};
