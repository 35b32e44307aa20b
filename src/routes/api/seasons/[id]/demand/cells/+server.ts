import { json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { requireCan } from '$lib/server/guards';
import { parseBody, seasonFromParams } from '$lib/server/api';
import { saveCells } from '$lib/server/demand-cells';
import { respond } from '../respond';

/** Sets cells of one grid ({ grid, cells: [{ crop, week, quantity, unit }] }); all or none. */
export const PATCH: RequestHandler = async (event) => {
	const { farm } = requireCan(event, 'demand.edit');
	const season = await seasonFromParams(farm.id, event.params.id);
	const body = await parseBody(event, z.unknown());
	if (!body.ok) return body.response;
	return respond(async () => json(await saveCells(farm.id, season, body.data)));
};
