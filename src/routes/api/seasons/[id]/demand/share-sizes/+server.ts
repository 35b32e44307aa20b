import { json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { requireCan } from '$lib/server/guards';
import { parseBody, seasonFromParams } from '$lib/server/api';
import { createShareSize, listShareSizes } from '$lib/server/demand';
import { respond } from '../respond';

export const GET: RequestHandler = async (event) => {
	const { farm } = requireCan(event, 'plan.read');
	const season = await seasonFromParams(farm.id, event.params.id);
	return json(await listShareSizes(farm.id, season.id));
};

/** Adds a share size: 201 with it; 400 naming the field; 409 when the name is taken. */
export const POST: RequestHandler = async (event) => {
	const { farm } = requireCan(event, 'demand.edit');
	const season = await seasonFromParams(farm.id, event.params.id);
	const body = await parseBody(event, z.unknown());
	if (!body.ok) return body.response;
	return respond(async () => json(await createShareSize(farm.id, season, body.data), { status: 201 }));
};
