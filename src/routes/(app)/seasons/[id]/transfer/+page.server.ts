import type { Actions, PageServerLoad } from './$types';
import { requireCan, requireUser } from '$lib/server/guards';
import { can } from '$lib/permissions';
import { seasonFromParams } from '$lib/server/api';
import {
	applyAction,
	importAction,
	importedSummary,
	updatedSummary,
	requireOwnerForUpload
} from '$lib/server/import/action';

export const load = (async (event) => {
	const { farm } = requireUser(event);
	const { season } = await event.parent();
	return {
		season,
		canImport: can(farm.role, 'season.import'),
		imported: importedSummary(event.url),
		updated: updatedSummary(event.url)
	};
}) satisfies PageServerLoad;

export const actions = {
	import: async (event) => {
		const { farm } = await requireOwnerForUpload(event);
		const season = await seasonFromParams(farm.id, event.params.id);
		return importAction(event, season.id);
	},
	apply: async (event) => {
		const { farm } = requireCan(event, 'season.import');
		await seasonFromParams(farm.id, event.params.id);
		return applyAction(event);
	}
} satisfies Actions;
