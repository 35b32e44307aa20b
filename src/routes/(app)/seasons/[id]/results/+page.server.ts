import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireCan, requireUser } from '$lib/server/guards';
import { can } from '$lib/permissions';
import { seasonFromParams } from '$lib/server/api';
import * as actuals from '$lib/server/actuals';
import { copySeason } from '$lib/server/season-copy';
import { figureChangeSchema, varietyFiguresSchema } from '$lib/schemas/harvest';
import { fieldErrors } from '$lib/schemas/common';

export const load = (async (event) => {
	const { farm } = requireUser(event);
	const { season } = await event.parent();
	return {
		...(await actuals.seasonActuals(farm.id, season.id)),
		canAdopt: can(farm.role, 'varieties.adopt'),
		canCopy: can(farm.role, 'season.copy')
	};
}) satisfies PageServerLoad;

function text(form: FormData): Record<string, string> {
	return Object.fromEntries([...form.entries()].map(([k, v]) => [k, String(v)]));
}

export const actions = {
	useFigures: async (event) => {
		const { farm, user } = requireCan(event, 'varieties.adopt');
		const season = await seasonFromParams(farm.id, event.params.id);
		const parsed = varietyFiguresSchema.safeParse(text(await event.request.formData()));
		if (!parsed.success) return fail(400, { figures: { errors: fieldErrors(parsed.error) } });
		const out = await actuals.useFigures(farm.id, season.id, parsed.data.varietyId, user.id);
		if (!out.ok) return fail(out.status, { figures: { errors: { varietyId: out.message } } });
		redirect(303, `/seasons/${season.id}/results?figures=${out.change.id}#figures`);
	},
	undoFigures: async (event) => {
		const { farm, user } = requireCan(event, 'varieties.adopt');
		const season = await seasonFromParams(farm.id, event.params.id);
		const parsed = figureChangeSchema.safeParse(text(await event.request.formData()));
		if (!parsed.success) return fail(400, { figures: { errors: fieldErrors(parsed.error) } });
		const out = await actuals.undoFigures(farm.id, season.id, parsed.data.changeId, user.id);
		if (!out.ok) return fail(out.status, { figures: { errors: { changeId: out.message } } });
		redirect(303, `/seasons/${season.id}/results?undone=${out.change.id}#figures`);
	},
	// The copy report exists only at the moment of copying, so this action answers with it
	// instead of redirecting; a repeated post finds the new season there and is refused (409).
	copySeason: async (event) => {
		const { farm, user } = requireCan(event, 'season.copy');
		const season = await seasonFromParams(farm.id, event.params.id);
		const out = await copySeason(farm.id, season, user.id);
		if (!out.ok) return fail(out.status, { copy: { error: out.message } });
		return { copy: { report: out.report } };
	}
} satisfies Actions;
