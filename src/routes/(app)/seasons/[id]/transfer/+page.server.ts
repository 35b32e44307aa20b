import type { Actions, PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guards';
import { can } from '$lib/permissions';
import { seasonFromParams } from '$lib/server/api';
import { importAction, importedSummary, requireOwnerForUpload } from '$lib/server/import/action';

export const load = (async (event) => {
	const { farm } = requireUser(event);
	const { season } = await event.parent();
	return { season, canImport: can(farm.role, 'season.import'), imported: importedSummary(event.url) };
}) satisfies PageServerLoad;

export const actions = {
	import: async (event) => {
		const { farm } = await requireOwnerForUpload(event);
		const season = await seasonFromParams(farm.id, event.params.id);
		return importAction(event, season.id);
	}
} satisfies Actions;
