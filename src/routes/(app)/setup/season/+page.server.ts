import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireCan } from '$lib/server/guards';
import * as seasons from '$lib/server/seasons';
import * as farms from '$lib/server/farms';
import { seasonCreateSchema } from '$lib/schemas/season';
import { fieldErrors } from '$lib/schemas/common';
import { textValues } from '$lib/library-form';
import { todayIn } from '$lib/today';

export const load = (async (event) => {
	const { farm } = requireCan(event, 'seasons.manage');
	const [list, settings] = await Promise.all([seasons.list(farm.id, { archived: true }), farms.get(farm.id)]);
	const today = todayIn(settings.timeZone);
	// After midsummer a new farm is planning next year's season.
	const year = Number(today.slice(0, 4)) + (today.slice(5) > '07-31' ? 1 : 0);
	return { seasons: list, values: { year: String(year), name: `${year} season` } };
}) satisfies PageServerLoad;

export const actions = {
	default: async (event) => {
		const { farm } = requireCan(event, 'seasons.manage');
		const values = textValues(await event.request.formData());
		const parsed = seasonCreateSchema.safeParse(values);
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error), values });
		let id: number;
		try {
			id = await seasons.create(farm.id, parsed.data);
		} catch (e) {
			if (e instanceof seasons.SeasonInputError) return fail(e.status, { errors: { [e.field]: e.message }, values });
			throw e;
		}
		redirect(303, `/seasons/${id}/demand`);
	}
} satisfies Actions;
