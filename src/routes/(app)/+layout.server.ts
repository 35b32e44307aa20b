import type { LayoutServerLoad } from './$types';
import { requireUser } from '$lib/server/guards';
import { roleLabels } from '$lib/roles';
import { navFor } from '$lib/navigation';
import { devMailEnabled } from '$lib/server/mail';
import * as seasons from '$lib/server/seasons';
import { displayPrefs } from '$lib/server/farms';

export const load = (async (event) => {
	const { user, farm } = requireUser(event);
	const [seasonList, display] = await Promise.all([seasons.list(farm.id), displayPrefs(farm.id)]);
	return {
		user,
		/** Unit system, currency and time zone for every figure on the page ($lib/format). */
		display,
		farm: { ...farm, roleLabel: roleLabels[farm.role] },
		nav: navFor(farm.role, devMailEnabled()),
		seasons: seasonList
	};
}) satisfies LayoutServerLoad;
