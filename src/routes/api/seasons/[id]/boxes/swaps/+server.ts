// POST /api/seasons/{id}/boxes/swaps — record a substitution in one share size's box for one
// week: { shareSizeId, week, fromCropId, toCropId, quantity } (per box, same harvest unit).
// Share manager or owner; 201 with the swap's id.
import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireCan } from '$lib/server/guards';
import { parseBody, seasonFromParams } from '$lib/server/api';
import { createSwap } from '$lib/server/boxes';
import { swapSchema } from '$lib/schemas/forecast';

export const POST: RequestHandler = async (event) => {
	const { farm, user } = requireCan(event, 'boxes.swap');
	const season = await seasonFromParams(farm.id, event.params.id);
	const body = await parseBody(event, swapSchema);
	if (!body.ok) return body.response;
	const result = await createSwap(farm.id, season.id, user.id, body.data);
	if (!result.ok) {
		const message = Object.entries(result.errors)
			.map(([k, v]) => `${k}: ${v}`)
			.join('; ');
		return json({ message: `Invalid swap: ${message}`, errors: result.errors }, { status: 400 });
	}
	return json({ id: result.id, ...body.data }, { status: 201 });
};
