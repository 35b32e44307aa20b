import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireCan, requireUser } from '$lib/server/guards';
import { parseBody, seasonFromParams, invalidAnswer } from '$lib/server/api';
import { create, gridContext } from '$lib/server/plantings';
import { seasonPlantingsJson } from '$lib/server/plantings-json';
import { cachedAnswer } from '$lib/server/plantings-cache';
import { editableFields, plantingBatchSchema } from '$lib/schemas/planting';
import type { PlantingsCreatedAnswer } from '$lib/api-answers';

// `{ season, plantings }` as before, plus what the grid needs to recalculate in the browser.
// Kept ready in memory until the season's data changes (plantings-cache.ts), with an ETag.
export const GET: RequestHandler = async (event) => {
	const { farm } = requireUser(event);
	const id = Number(event.params.id);
	// Not an id at all: the same 404 as for a season of another farm, without asking the cache.
	if (!(Number.isSafeInteger(id) && id > 0)) await seasonFromParams(farm.id, event.params.id);
	// An answer is kept only once seasonFromParams below has found the season on this farm, and the
	// stamp covers the farm's seasons: while it holds, the season is still this farm's.
	return cachedAnswer(event.request, farm.id, id, farm.role, async () => {
		// Everything read here, after the stamp (the season too): a 404 for another farm's season.
		const [season, plantings, context] = await Promise.all([
			seasonFromParams(farm.id, event.params.id),
			seasonPlantingsJson(farm.id, id),
			gridContext(farm.id)
		]);
		// The plantings array comes as JSON text from the database (plantings-json.ts); the rest is small.
		const rest = JSON.stringify({ season, ...context, role: farm.role, editable: editableFields(farm.role) });
		return `{"plantings":${plantings},${rest.slice(1)}`;
	});
};

/** New rows: `{ plantings: [...] }`, one or a whole paste; all are written or none. */
export const POST: RequestHandler = async (event) => {
	const { user, farm } = requireCan(event, 'plan.edit');
	const season = await seasonFromParams(farm.id, event.params.id);
	const body = await parseBody(event, plantingBatchSchema);
	if (!body.ok) return body.response;
	const result = await create(farm.id, season.id, user.id, body.data.plantings);
	if (!result.ok) return invalidAnswer(result.errors);
	return json({ plantings: result.plantings } satisfies PlantingsCreatedAnswer, { status: 201 });
};
