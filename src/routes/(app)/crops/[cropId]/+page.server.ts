import { error, fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad, RequestEvent } from './$types';
import { requireCan, requireUser } from '$lib/server/guards';
import { can } from '$lib/permissions';
import { getCrop, LibraryInputError, setCropArchived, updateCrop } from '$lib/server/crops';
import type { CropInput } from '$lib/schemas/crop';
import { cropSchemaFor } from '$lib/schemas/crop-units';
import { libraryUnits } from '$lib/server/unit-context';
import { cropFormValues } from '$lib/library-form';
import { answerInputErrors, readForm } from '$lib/server/form';

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
		const form = await readForm(event.request, async (f) => cropSchemaFor(await libraryUnits(farm.id, f.harvestUnit)));
		if (form.refused) return fail(400, form.refused);
		return answerInputErrors(LibraryInputError, form.values, async () => {
			if (!(await updateCrop(farm.id, id, form.data as CropInput))) error(404, "No such crop in this farm's library.");
			return { saved: true };
		});
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
