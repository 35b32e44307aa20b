import { error, fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad, RequestEvent } from './$types';
import { requireRole, requireUser } from '$lib/server/guards';
import { getCrop, LibraryInputError, setCropArchived, updateCrop } from '$lib/server/crops';
import { cropSchema, type CropInput } from '$lib/schemas/crop';
import { fieldErrors } from '$lib/schemas/common';
import { cropFormValues, textValues } from '$lib/library-form';

function cropId(event: RequestEvent): number {
	const id = Number(event.params.cropId);
	if (!Number.isInteger(id) || id < 1) error(404, 'No such crop in this farm\'s library.');
	return id;
}

export const load = (async (event) => {
	const { farm } = requireUser(event);
	const crop = await getCrop(farm.id, cropId(event));
	if (!crop) error(404, 'No such crop in this farm\'s library.');
	return { crop, values: cropFormValues(crop), canEdit: farm.role === 'owner' };
}) satisfies PageServerLoad;

export const actions = {
	save: async (event) => {
		const { farm } = requireRole(event, 'owner');
		const id = cropId(event);
		const values = textValues(await event.request.formData());
		const parsed = cropSchema.safeParse(values);
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error), values });
		try {
			if (!(await updateCrop(farm.id, id, parsed.data as CropInput))) error(404, 'No such crop in this farm\'s library.');
		} catch (e) {
			if (e instanceof LibraryInputError) return fail(e.status, { errors: { [e.field]: e.message }, values });
			throw e;
		}
		return { saved: true };
	},
	archive: async (event) => {
		const { farm } = requireRole(event, 'owner');
		if (!(await setCropArchived(farm.id, cropId(event), true))) error(404, 'No such crop in this farm\'s library.');
		redirect(303, `/crops/${cropId(event)}`);
	},
	restore: async (event) => {
		const { farm } = requireRole(event, 'owner');
		if (!(await setCropArchived(farm.id, cropId(event), false))) error(404, 'No such crop in this farm\'s library.');
		redirect(303, `/crops/${cropId(event)}`);
	}
} satisfies Actions;
