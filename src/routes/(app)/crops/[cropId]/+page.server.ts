import { error, fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad, RequestEvent } from './$types';
import { requireCan, requireUser } from '$lib/server/guards';
import { can } from '$lib/permissions';
import { getCrop, LibraryInputError, setCropArchived, updateCrop } from '$lib/server/crops';
import type { CropInput } from '$lib/schemas/crop';
import { cropSchemaFor } from '$lib/schemas/crop-units';
import { libraryUnits } from '$lib/server/unit-context';
import { fieldErrors } from '$lib/schemas/common';
import { cropFormValues, textValues } from '$lib/library-form';

function cropId(event: RequestEvent): number {
	const id = Number(event.params.cropId);
	if (!Number.isInteger(id) || id < 1) error(404, "No such crop in this farm's library.");
	return id;
}

export const load = (async (event) => {
	const { farm } = requireUser(event);
	const crop = await getCrop(farm.id, cropId(event));
	if (!crop) error(404, "No such crop in this farm's library.");
	const units = await libraryUnits(farm.id, crop.harvestUnit);
	return { crop, values: cropFormValues(crop, units), canEdit: can(farm.role, 'library.edit') };
}) satisfies PageServerLoad;

export const actions = {
	save: async (event) => {
		const { farm } = requireCan(event, 'library.edit');
		const id = cropId(event);
		// Another farm's crop is "not found" before anything about the form is said.
		if (!(await getCrop(farm.id, id))) error(404, "No such crop in this farm's library.");
		const values = textValues(await event.request.formData());
		const parsed = cropSchemaFor(await libraryUnits(farm.id, values.harvestUnit)).safeParse(values);
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error), values });
		try {
			if (!(await updateCrop(farm.id, id, parsed.data as CropInput)))
				error(404, "No such crop in this farm's library.");
		} catch (e) {
			if (e instanceof LibraryInputError) return fail(e.status, { errors: { [e.field]: e.message }, values });
			throw e;
		}
		return { saved: true };
	},
	archive: async (event) => {
		const { farm } = requireCan(event, 'library.edit');
		if (!(await setCropArchived(farm.id, cropId(event), true))) error(404, "No such crop in this farm's library.");
		redirect(303, `/crops/${cropId(event)}`);
	},
	restore: async (event) => {
		const { farm } = requireCan(event, 'library.edit');
		if (!(await setCropArchived(farm.id, cropId(event), false))) error(404, "No such crop in this farm's library.");
		redirect(303, `/crops/${cropId(event)}`);
	}
} satisfies Actions;
