import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireCan } from '$lib/server/guards';
import { seasonFromParams } from '$lib/server/api';
import { importDemand, uploadFromForm } from '$lib/server/import/demand';

/** A multipart upload (field `file`, optional `mode` merge|replace); all rows or none. */
export const POST: RequestHandler = async (event) => {
	const { farm } = requireCan(event, 'demand.edit');
	const season = await seasonFromParams(farm.id, event.params.id);
	const form = await uploadFromForm(event.request);
	if (!form.ok)
		return json({ message: form.message, errors: { [form.field]: form.message }, rows: [] }, { status: 400 });
	const result = await importDemand(farm.id, season, form.file, form.mode);
	if (!result.ok) {
		const errors = Object.fromEntries(result.errors.map((e) => [`rows.${e.row}.${e.column}`, e.message]));
		return json(
			{
				message: `The upload was refused whole: ${result.errors.length} problem(s); nothing was written.`,
				errors,
				rows: result.errors
			},
			{ status: result.status }
		);
	}
	return json(result);
};
