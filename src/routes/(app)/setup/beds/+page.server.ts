import type { Actions, PageServerLoad } from './$types';
import { requireCan } from '$lib/server/guards';
import * as beds from '$lib/server/beds';
import { bulkBedsAction } from '$lib/server/bed-bulk-action';

export const load = (async (event) => {
	const { farm } = requireCan(event, 'farm.settings');
	const [blocks, list] = await Promise.all([beds.listBlocks(farm.id), beds.list(farm.id)]);
	return { blocks, beds: list };
}) satisfies PageServerLoad;

export const actions = {
	default: bulkBedsAction
} satisfies Actions;
