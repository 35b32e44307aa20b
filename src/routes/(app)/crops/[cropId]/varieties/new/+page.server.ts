import { error, fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireCan } from '$lib/server/guards';
import { createVariety, getCrop, LibraryInputError } from '$lib/server/crops';
import type { VarietyInput } from '$lib/schemas/crop';
import { varietySchemaFor } from '$lib/schemas/crop-units';
import { libraryUnits } from '$lib/server/unit-context';
import { newVarietyValues } from '$lib/library-form';
import { answerInputErrors, readForm } from '$lib/server/form';

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
		const form = await readForm(event.request, varietySchemaFor(await libraryUnits(farm.id, crop.harvestUnit)));
		if (form.refused) return fail(400, form.refused);
		return answerInputErrors(LibraryInputError, form.values, async () => {
			const id = await createVariety(farm.id, crop.id, form.data as VarietyInput);
			redirect(303, `/crops/${crop.id}/varieties/${id}`);
		});
	}
} satisfies Actions;
