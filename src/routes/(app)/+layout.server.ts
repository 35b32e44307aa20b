import type { LayoutServerLoad } from './$types';
import { requireUser } from '$lib/server/guards';
import { roleLabels } from '$lib/roles';
import { navFor } from '$lib/navigation';
import { devMailEnabled } from '$lib/server/mail';
import * as seasons from '$lib/server/seasons';

export const load = (async (event) => {
	const { user, farm } = requireUser(event);
	return {
		user,
		farm: { ...farm, roleLabel: roleLabels[farm.role] },
		nav: navFor(farm.role, devMailEnabled()),
		seasons: await seasons.list(farm.id)
	};
}) satisfies LayoutServerLoad;
