import type { Actions, PageServerLoad } from './$types';
import { requireCan } from '$lib/server/guards';
import { applyAction, importAction, importedSummary, updatedSummary } from '$lib/server/import/action';

// The farm-wide import: a workbook's plantings go into the season its Season sheet names,
// created when the farm has no season of that year (so a new, empty farm can take a plan).
export const load = (async (event) => {
	requireCan(event, 'season.import');
	return { imported: importedSummary(event.url), updated: updatedSummary(event.url) };
}) satisfies PageServerLoad;

export const actions = {
	import: async (event) => importAction(event),
	apply: async (event) => applyAction(event)
} satisfies Actions;
