import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireCan } from '$lib/server/guards';
import { createCrop, LibraryInputError } from '$lib/server/crops';
import type { CropInput } from '$lib/schemas/crop';
import { cropSchemaFor } from '$lib/schemas/crop-units';
import { libraryUnits } from '$lib/server/unit-context';
import { fieldErrors } from '$lib/schemas/common';
import { newCropValues, textValues } from '$lib/library-form';

export const load = (async (event) => {
	const { farm } = requireCan(event, 'library.edit');
	return { values: newCropValues(await libraryUnits(farm.id, 'lb')) };
}) satisfies PageServerLoad;

export const actions = {
	default: async (event) => {
		const { farm } = requireCan(event, 'library.edit');
		const values = textValues(await event.request.formData());
		const parsed = cropSchemaFor(await libraryUnits(farm.id, values.harvestUnit)).safeParse(values);
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error), values });
		let id: number;
		try {
			id = await createCrop(farm.id, parsed.data as CropInput);
		} catch (e) {
			if (e instanceof LibraryInputError) return fail(e.status, { errors: { [e.field]: e.message }, values });
			throw e;
		}
		redirect(303, `/crops/${id}/varieties/new?created=1`);
	}
} satisfies Actions;
