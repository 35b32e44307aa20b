import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireCan } from '$lib/server/guards';
import { createCrop, LibraryInputError } from '$lib/server/crops';
import type { CropInput } from '$lib/schemas/crop';
import { cropSchemaFor } from '$lib/schemas/crop-units';
import { libraryUnits } from '$lib/server/unit-context';
import { newCropValues } from '$lib/library-form';
import { answerInputErrors, formAction } from '$lib/server/form';

export const load = (async (event) => {
	const { farm } = requireCan(event, 'library.edit');
	return { values: newCropValues(await libraryUnits(farm.id, 'lb')) };
}) satisfies PageServerLoad;

export const actions = {
	default: formAction(
		'library.edit',
		async (f, { farm }) => cropSchemaFor(await libraryUnits(farm.id, f.harvestUnit)),
		async ({ farm }, { data, values }) =>
			answerInputErrors(LibraryInputError, values, async () => {
				const id = await createCrop(farm.id, data as CropInput);
				redirect(303, `/crops/${id}/varieties/new?created=1`);
			})
	)
} satisfies Actions;
