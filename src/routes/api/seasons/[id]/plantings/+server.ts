import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireCan, requireUser } from '$lib/server/guards';
import { parseBody, seasonFromParams } from '$lib/server/api';
import { create, gridContext } from '$lib/server/plantings';
import { seasonPlantingsJson } from '$lib/server/plantings-json';
import { editableFields, plantingBatchSchema } from '$lib/schemas/planting';

// `{ season, plantings }` as before, plus what the grid needs to recalculate in the browser.
export const GET: RequestHandler = async (event) => {
	const { farm } = requireUser(event);
	const season = await seasonFromParams(farm.id, event.params.id);
	const [plantings, context] = await Promise.all([seasonPlantingsJson(farm.id, season.id), gridContext(farm.id)]);
	// The plantings array comes as JSON text from the database (plantings-json.ts); the rest is small.
	const rest = JSON.stringify({ season, ...context, role: farm.role, editable: editableFields(farm.role) });
	return new Response(`{"plantings":${plantings},${rest.slice(1)}`, {
		headers: { 'content-type': 'application/json' }
	});
};

/** New rows: `{ plantings: [...] }`, one or a whole paste; all are written or none. */
export const POST: RequestHandler = async (event) => {
	const { user, farm } = requireCan(event, 'plan.edit');
	const season = await seasonFromParams(farm.id, event.params.id);
	const body = await parseBody(event, plantingBatchSchema);
	if (!body.ok) return body.response;
	const result = await create(farm.id, season.id, user.id, body.data.plantings);
	if (!result.ok)
		return json(
			{
				message: `Invalid input: ${Object.entries(result.errors)
					.map(([k, v]) => `${k}: ${v}`)
					.join('; ')}`,
				errors: result.errors
			},
			{ status: 400 }
		);
	return json({ plantings: result.plantings }, { status: 201 });
};
