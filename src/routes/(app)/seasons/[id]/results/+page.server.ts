import { fail, redirect } from '@sveltejs/kit';
import type { z } from 'zod';
import type { Action, Actions, PageServerLoad } from './$types';
import { requireCan, requireUser } from '$lib/server/guards';
import { can } from '$lib/permissions';
import { seasonFromParams } from '$lib/server/api';
import * as actuals from '$lib/server/actuals';
import { copySeason } from '$lib/server/season-copy';
import { figureChangeSchema, varietyFiguresSchema } from '$lib/schemas/harvest';
import { readForm } from '$lib/server/form';

export const load = (async (event) => {
	const { farm } = requireUser(event);
	const { season } = await event.parent();
	return {
		...(await actuals.seasonActuals(farm.id, season.id)),
		canAdopt: can(farm.role, 'varieties.adopt'),
		canCopy: can(farm.role, 'season.copy')
	};
}) satisfies PageServerLoad;

/**
 * Taking a variety's figures into the library and undoing that read the same way: one number from the
 * form (a refused one named at its field), one step in actuals, then back to the figures with its change.
 */
function figuresAction<K extends string>(
	schema: z.ZodType<Record<K, number>>,
	field: K,
	step: (farmId: number, seasonId: number, id: number, userId: string) => Promise<actuals.FigureResult>,
	shown: 'figures' | 'undone'
) {
	return async (event: Parameters<Action>[0]) => {
		const { farm, user } = requireCan(event, 'varieties.adopt');
		const season = await seasonFromParams(farm.id, event.params.id);
		const form = await readForm(event.request, schema);
		if (form.refused) return fail(400, { figures: { errors: form.refused.errors } });
		const out = await step(farm.id, season.id, form.data[field], user.id);
		if (!out.ok) return fail(out.status, { figures: { errors: { [field]: out.message } as Record<string, string> } });
		redirect(303, `/seasons/${season.id}/results?${shown}=${out.change.id}#figures`);
	};
}

export const actions = {
	useFigures: figuresAction(varietyFiguresSchema, 'varietyId', actuals.useFigures, 'figures'),
	undoFigures: figuresAction(figureChangeSchema, 'changeId', actuals.undoFigures, 'undone'),
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
