import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireCan } from '$lib/server/guards';
import * as seasons from '$lib/server/seasons';
import * as farms from '$lib/server/farms';
import { seasonCreateSchema } from '$lib/schemas/season';
import { answerInputErrors, formAction } from '$lib/server/form';
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
	default: formAction('seasons.manage', seasonCreateSchema, async ({ farm }, { data, values }) =>
		answerInputErrors(seasons.SeasonInputError, values, async () => {
			const id = await seasons.create(farm.id, data);
			redirect(303, `/seasons/${id}/demand`);
		})
	)
} satisfies Actions;
