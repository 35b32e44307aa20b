import { json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { requireCan } from '$lib/server/guards';
import { parseBody, seasonFromParams } from '$lib/server/api';
import { copyWeek } from '$lib/server/demand-cells';
import { respond } from '../respond';

/** Copies one week of a grid onto a range of weeks ({ grid, fromWeek, toFirst, toLast }). */
export const POST: RequestHandler = async (event) => {
	const { farm } = requireCan(event, 'demand.edit');
	const season = await seasonFromParams(farm.id, event.params.id);
	const body = await parseBody(event, z.unknown());
	if (!body.ok) return body.response;
	return respond(async () => json(await copyWeek(farm.id, season, body.data)));
};
