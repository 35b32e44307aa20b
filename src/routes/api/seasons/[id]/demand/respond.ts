// Shared by the demand JSON routes: a refused write becomes its status with the named errors.
import { json, type RequestEvent } from '@sveltejs/kit';
import { z } from 'zod';
import { DemandInputError } from '$lib/server/demand';
import type { Season } from '$lib/server/seasons';
import { requireCan } from '$lib/server/guards';
import { parseBody, seasonFromParams } from '$lib/server/api';

export async function respond(work: () => Promise<Response>): Promise<Response> {
	try {
		return await work();
	} catch (e) {
		if (e instanceof DemandInputError) return json({ message: e.message, errors: e.errors }, { status: e.status });
		throw e;
	}
}

/**
 * A route that hands the season's demand writer the raw body (the writer checks it and names each bad
 * cell); its answer is the writer's result as JSON.
 */
export function demandWrite(write: (farmId: number, season: Season, raw: unknown) => Promise<unknown>) {
	return async (event: RequestEvent<{ id: string }>): Promise<Response> => {
		const { farm } = requireCan(event, 'demand.edit');
		const season = await seasonFromParams(farm.id, event.params.id);
		const body = await parseBody(event, z.unknown());
		if (!body.ok) return body.response;
		return respond(async () => json(await write(farm.id, season, body.data)));
	};
}
