import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireCan } from '$lib/server/guards';
import * as farms from '$lib/server/farms';
import { locationSchema } from '$lib/schemas/farm';
import { formAction } from '$lib/server/form';

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
	default: formAction('farm.settings', locationSchema, async ({ farm }, { data }) => {
		const { id: _id, ...current } = await farms.get(farm.id);
		await farms.update(farm.id, { ...current, ...data });
		redirect(303, '/setup/beds');
	})
} satisfies Actions;
