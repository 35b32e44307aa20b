import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guards';
import { can } from '$lib/permissions';
import { listCrops } from '$lib/server/crops';

export const load = (async (event) => {
	const { farm } = requireUser(event);
	const archived = event.url.searchParams.get('archived') === '1';
	return {
		crops: await listCrops(farm.id, { archived }),
		showArchived: archived,
		canEdit: can(farm.role, 'library.edit')
	};
}) satisfies PageServerLoad;
