// DELETE /api/seasons/{id}/boxes/swaps/{swapId} — undo a swap (it stays on record as undone).
// Share manager or owner; 204, 404 for no such swap on this farm, 409 when already undone.
import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireCan } from '$lib/server/guards';
import { seasonFromParams } from '$lib/server/api';
import { undoSwap } from '$lib/server/boxes';

export const DELETE: RequestHandler = async (event) => {
	const { farm, user } = requireCan(event, 'boxes.swap');
	const season = await seasonFromParams(farm.id, event.params.id);
	const swapId = Number(event.params.swapId);
	const result =
		Number.isInteger(swapId) && swapId > 0 ? await undoSwap(farm.id, season.id, swapId, user.id) : 'missing';
	if (result === 'missing') error(404, 'No such swap in this season.');
	if (result === 'already_undone') error(409, 'This swap is already undone.');
	return new Response(null, { status: 204 });
};
