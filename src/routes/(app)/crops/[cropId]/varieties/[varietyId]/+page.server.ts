import { error, fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad, RequestEvent } from './$types';
import { requireCan, requireUser } from '$lib/server/guards';
import { can } from '$lib/permissions';
import { getCrop, LibraryInputError, removeVariety, setVarietyArchived, updateVariety } from '$lib/server/crops';
import { observedForVariety } from '$lib/server/actuals';
import type { VarietyInput } from '$lib/schemas/crop';
import { varietySchemaFor } from '$lib/schemas/crop-units';
import { libraryUnits } from '$lib/server/unit-context';
import { varietyFormValues } from '$lib/library-form';
import { answerInputErrors, readForm } from '$lib/server/form';
import { plural } from '$lib/plural';

const missing = "No such variety in this farm's library.";

/** The crop and variety named in the URL, both of this farm, or a 404. */
async function lookup(event: RequestEvent, farmId: number) {
	const cropId = Number(event.params.cropId);
	const varietyId = Number(event.params.varietyId);
	if (!Number.isInteger(cropId) || cropId < 1 || !Number.isInteger(varietyId) || varietyId < 1) error(404, missing);
	const crop = await getCrop(farmId, cropId);
	const variety = crop?.varieties.find((v) => v.id === varietyId);
	if (!crop || !variety) error(404, missing);
	return { crop, variety };
}

export const load = (async (event) => {
	const { farm } = requireUser(event);
	const { crop, variety } = await lookup(event, farm.id);
	return {
		crop: { id: crop.id, name: crop.name, harvestUnit: crop.harvestUnit, archived: crop.archived },
		variety,
		values: varietyFormValues(variety, await libraryUnits(farm.id, crop.harvestUnit)),
		observed: await observedForVariety(farm.id, variety.id),
		canEdit: can(farm.role, 'library.edit')
	};
}) satisfies PageServerLoad;

export const actions = {
	save: async (event) => {
		const { farm } = requireCan(event, 'library.edit');
		const { crop, variety } = await lookup(event, farm.id);
		const form = await readForm(event.request, varietySchemaFor(await libraryUnits(farm.id, crop.harvestUnit)));
		if (form.refused) return fail(400, form.refused);
		return answerInputErrors(LibraryInputError, form.values, async () => {
			await updateVariety(farm.id, variety.id, form.data as VarietyInput);
			return { saved: true };
		});
	},
	archive: async (event) => {
		const { farm } = requireCan(event, 'library.edit');
		const { crop, variety } = await lookup(event, farm.id);
		await setVarietyArchived(farm.id, variety.id, true);
		redirect(303, `/crops/${crop.id}/varieties/${variety.id}`);
	},
	restore: async (event) => {
		const { farm } = requireCan(event, 'library.edit');
		const { crop, variety } = await lookup(event, farm.id);
		await setVarietyArchived(farm.id, variety.id, false);
		redirect(303, `/crops/${crop.id}/varieties/${variety.id}`);
	},
	delete: async (event) => {
		const { farm } = requireCan(event, 'library.edit');
		const { crop, variety } = await lookup(event, farm.id);
		const out = await removeVariety(farm.id, variety.id);
		if (!out.ok && out.status === 404) error(404, missing);
		if (!out.ok && out.status === 409) {
			return fail(409, {
				deleteRefused: `${variety.name} cannot be deleted: ${plural(out.plantings, 'planting uses', 'plantings use')} it (${out.seasons.join(', ')}). Archive it instead to keep it out of new plans.`
			});
		}
		redirect(303, `/crops/${crop.id}?deleted=${encodeURIComponent(variety.name)}`);
	}
} satisfies Actions;
