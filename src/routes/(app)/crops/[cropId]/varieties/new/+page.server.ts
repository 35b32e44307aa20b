import { error, fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireCan } from '$lib/server/guards';
import { createVariety, getCrop, LibraryInputError } from '$lib/server/crops';
import type { VarietyInput } from '$lib/schemas/crop';
import { varietySchemaFor } from '$lib/schemas/crop-units';
import { libraryUnits } from '$lib/server/unit-context';
import { fieldErrors } from '$lib/schemas/common';
import { newVarietyValues, textValues } from '$lib/library-form';

async function cropOf(farmId: number, raw: string) {
	const id = Number(raw);
	const crop = Number.isInteger(id) && id > 0 ? await getCrop(farmId, id) : null;
	if (!crop) error(404, "No such crop in this farm's library.");
	return crop;
}

export const load = (async (event) => {
	const { farm } = requireCan(event, 'library.edit');
	const crop = await cropOf(farm.id, event.params.cropId);
	return {
		crop: { id: crop.id, name: crop.name, harvestUnit: crop.harvestUnit },
		values: newVarietyValues,
		created: event.url.searchParams.has('created')
	};
}) satisfies PageServerLoad;

export const actions = {
	default: async (event) => {
		const { farm } = requireCan(event, 'library.edit');
		const crop = await cropOf(farm.id, event.params.cropId);
		const values = textValues(await event.request.formData());
		const parsed = varietySchemaFor(await libraryUnits(farm.id, crop.harvestUnit)).safeParse(values);
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error), values });
		let id: number;
		try {
			id = await createVariety(farm.id, crop.id, parsed.data as VarietyInput);
		} catch (e) {
			if (e instanceof LibraryInputError) return fail(e.status, { errors: { [e.field]: e.message }, values });
			throw e;
		}
		redirect(303, `/crops/${crop.id}/varieties/${id}`);
	}
} satisfies Actions;
