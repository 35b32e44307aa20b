import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireCan } from '$lib/server/guards';
import { parseBody, invalidAnswer } from '$lib/server/api';
import { remove, update } from '$lib/server/plantings';
import { plantingPatchSchema, recordFieldsInWords } from '$lib/schemas/planting';
import type { ApiErrorAnswer, PlantingConflictAnswer, PlantingSavedAnswer } from '$lib/api-answers';

function plantingId(raw: string): number {
	const id = Number(raw);
	if (!Number.isInteger(id) || id <= 0) error(404, 'No such planting on this farm.');
	return id;
}

/** An edit made on `version`. Stale: 409 with the row as it stands and who saved it. */
export const PATCH: RequestHandler = async (event) => {
	// The share manager reads the plan; owner and crew lead edit (the crew lead only its own fields).
	const { user, farm } = requireCan(event, 'planting.record');
	const id = plantingId(event.params.id);
	const body = await parseBody(event, plantingPatchSchema);
	if (!body.ok) return body.response;
	const r = await update(farm.id, id, { id: user.id, role: farm.role }, body.data);
	switch (r.kind) {
		case 'ok':
			return json({ planting: r.planting } satisfies PlantingSavedAnswer);
		case 'not_found':
			error(404, 'No such planting on this farm.');
		// falls through never: error() throws
		case 'forbidden':
			return json(
				{
					message: `A crew lead may change only ${recordFieldsInWords}; not ${r.fields.join(', ')}.`,
					fields: r.fields
				} satisfies ApiErrorAnswer,
				{ status: 403 }
			);
		case 'invalid':
			return invalidAnswer(r.errors);
		case 'conflict':
			return json(
				{
					message: `${r.current.updatedBy ?? 'Someone'} saved this planting first (now version ${r.current.version}); your edit was not applied.`,
					current: r.current,
					changedBy: r.current.updatedBy ?? null
				} satisfies PlantingConflictAnswer,
				{ status: 409 }
			);
	}
};

/** Removes a planting. Undo is the grid POSTing the row it still holds back as a new row. */
export const DELETE: RequestHandler = async (event) => {
	const { farm } = requireCan(event, 'plan.edit');
	const removed = await remove(farm.id, plantingId(event.params.id));
	if (!removed) error(404, 'No such planting on this farm.');
	if (removed === 'has_harvests')
		return json(
			{ message: 'This planting has harvests logged; mark it finished or failed instead of removing it.' },
			{ status: 409 }
		);
	return new Response(null, { status: 204 });
};
