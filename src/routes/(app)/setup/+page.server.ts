import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireCan } from '$lib/server/guards';
import * as farms from '$lib/server/farms';
import { locationSchema } from '$lib/schemas/farm';
import { fieldErrors } from '$lib/schemas/common';
import { textValues } from '$lib/library-form';

export const load = (async (event) => {
	const { farm } = requireCan(event, 'farm.settings');
	const s = await farms.get(farm.id);
	return {
		values: {
			latitude: String(s.latitude),
			timeZone: s.timeZone,
			unitSystem: s.unitSystem,
			lastSpringFrost: s.lastSpringFrost,
			firstFallFrost: s.firstFallFrost
		}
	};
}) satisfies PageServerLoad;

export const actions = {
	default: async (event) => {
		const { farm } = requireCan(event, 'farm.settings');
		const values = textValues(await event.request.formData());
		const parsed = locationSchema.safeParse(values);
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error), values });
		const current = await farms.get(farm.id);
		const { id: _id, ...rest } = current;
		await farms.update(farm.id, { ...rest, ...parsed.data });
		redirect(303, '/setup/beds');
	}
} satisfies Actions;
