import { fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireCan } from '$lib/server/guards';
import { addStarterCrops, listCrops } from '$lib/server/crops';
import { starterCrop, starterCrops, type StarterCrop } from '$lib/server/starter-library';
import { plural } from '$lib/plural';

export const load = (async (event) => {
	const { farm } = requireCan(event, 'library.edit');
	const have = new Set((await listCrops(farm.id, { archived: true })).map((c) => c.name.toLowerCase()));
	return {
		starter: starterCrops.map((c) => ({
			key: c.key,
			name: c.name,
			family: c.family,
			harvestUnit: c.harvestUnit,
			frostTolerance: c.frostTolerance,
			inLibrary: have.has(c.name.toLowerCase()),
			varieties: c.varieties.map((v) => ({
				name: v.name,
				method: v.method,
				daysToMaturity: v.daysToMaturity,
				source: v.source
			}))
		}))
	};
}) satisfies PageServerLoad;

export const actions = {
	default: async (event) => {
		const { farm } = requireCan(event, 'library.edit');
		const keys = (await event.request.formData()).getAll('crop').map(String);
		if (keys.length === 0) return fail(400, { errors: { crop: 'Tick at least one crop, or skip this step.' } });
		if (keys.length > starterCrops.length)
			return fail(400, { errors: { crop: 'The same crop is listed more than once.' } });
		const picked: StarterCrop[] = [];
		for (const k of new Set(keys)) {
			const c = starterCrop(k);
			if (!c) return fail(400, { errors: { crop: `"${k.slice(0, 40)}" is not in the starter library.` } });
			picked.push(c);
		}
		const out = await addStarterCrops(farm.id, picked);
		const message =
			`Added ${plural(out.crops.length, 'crop')} with ${plural(out.varieties, 'variety', 'varieties')} to your library.` +
			(out.skipped.length ? ` Already there, left as they are: ${out.skipped.join(', ')}.` : '');
		return { added: out.crops, message };
	}
} satisfies Actions;
