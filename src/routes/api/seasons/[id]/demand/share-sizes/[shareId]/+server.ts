import { error, json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { requireCan } from '$lib/server/guards';
import { parseBody, seasonFromParams } from '$lib/server/api';
import { removeShareSize, updateShareSize } from '$lib/server/demand';
import { respond } from '../../respond';

function shareId(raw: string): number {
	const id = Number(raw);
	if (!Number.isInteger(id) || id <= 0) error(404, 'No such share size in this season.');
	return id;
}

/** Replaces a share size's fields (all of them, as in the add form). */
export const PUT: RequestHandler = async (event) => {
	const { farm } = requireCan(event, 'demand.edit');
	const season = await seasonFromParams(farm.id, event.params.id);
	const id = shareId(event.params.shareId);
	const body = await parseBody(event, z.unknown());
	if (!body.ok) return body.response;
	return respond(async () => {
		const share = await updateShareSize(farm.id, season, id, body.data);
		if (!share) error(404, 'No such share size in this season.');
		return json(share);
	});
};

/** Removes a share size and its box contents. */
export const DELETE: RequestHandler = async (event) => {
	const { farm } = requireCan(event, 'demand.edit');
	const season = await seasonFromParams(farm.id, event.params.id);
	if (!(await removeShareSize(farm.id, season.id, shareId(event.params.shareId))))
		error(404, 'No such share size in this season.');
	return new Response(null, { status: 204 });
};
