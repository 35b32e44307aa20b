import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireCan, requireUser } from '$lib/server/guards';
import { can } from '$lib/permissions';
import { seasonFromParams } from '$lib/server/api';
import { createSwap, matching, setShortFill, undoSwap } from '$lib/server/boxes';
import { shortFillSchema, swapSchema } from '$lib/schemas/forecast';
import { fieldErrors } from '$lib/schemas/common';
import { planFreshness } from '$lib/server/seasons';
import { harvestUnits } from '$lib/server/crops';
import { displayPrefs } from '$lib/server/farms';
import { storedQuantity } from '$lib/format';
import type { SwapInput } from '$lib/schemas/forecast';

/** The form's quantities are in the farm's units (kg on a metric farm); the swap keeps canonical ones. */
async function swapInFarmUnits(farmId: number, swap: SwapInput): Promise<SwapInput> {
	const [{ unitSystem }, units] = await Promise.all([
		displayPrefs(farmId),
		harvestUnits(farmId, [swap.fromCropId, swap.toCropId])
	]);
	const unit = (crop: number): string => units.get(crop) ?? '';
	return {
		...swap,
		quantity: storedQuantity(swap.quantity, unit(swap.fromCropId), unitSystem),
		toQuantity:
			swap.toQuantity === undefined ? undefined : storedQuantity(swap.toQuantity, unit(swap.toCropId), unitSystem)
	};
}

export const load = (async (event) => {
	const { farm } = requireUser(event);
	const { season } = await event.parent();
	const [boxes, freshness] = await Promise.all([matching(farm.id, season), planFreshness(farm.id, season.id)]);
	return {
		matching: boxes,
		freshness,
		canSwap: can(farm.role, 'boxes.swap'),
		canSetShort: can(farm.role, 'boxes.settings')
	};
}) satisfies PageServerLoad;

// Back to the same view (filter kept) after a swap or an undo.
const back = (url: URL): string => url.pathname + (url.searchParams.get('show') === 'short' ? '?show=short' : '');

export const actions = {
	swap: async (event) => {
		const { farm, user } = requireCan(event, 'boxes.swap');
		const season = await seasonFromParams(farm.id, event.params.id);
		const values = Object.fromEntries(await event.request.formData()) as Record<string, string>;
		const parsed = swapSchema.safeParse(values);
		if (!parsed.success) return fail(400, { swap: { errors: fieldErrors(parsed.error), values } });
		const result = await createSwap(farm.id, season.id, user.id, await swapInFarmUnits(farm.id, parsed.data));
		if (!result.ok) return fail(400, { swap: { errors: result.errors, values } });
		redirect(303, back(event.url));
	},
	shortFill: async (event) => {
		const { farm } = requireCan(event, 'boxes.settings');
		await seasonFromParams(farm.id, event.params.id);
		const values = Object.fromEntries(
			[...(await event.request.formData())].map(([k, v]) => [k, String(v).slice(0, 100)])
		);
		const parsed = shortFillSchema.safeParse(values);
		if (!parsed.success) return fail(400, { shortFill: { errors: fieldErrors(parsed.error), values } });
		await setShortFill(farm.id, parsed.data.shortFillPct);
		redirect(303, back(event.url));
	},
	undo: async (event) => {
		const { farm, user } = requireCan(event, 'boxes.swap');
		const season = await seasonFromParams(farm.id, event.params.id);
		const id = Number((await event.request.formData()).get('swapId'));
		const result = Number.isInteger(id) && id > 0 ? await undoSwap(farm.id, season.id, id, user.id) : 'missing';
		if (result === 'missing') return fail(400, { undo: { errors: { swapId: 'No such swap in this season.' } } });
		if (result === 'already_undone') return fail(409, { undo: { errors: { swapId: 'This swap is already undone.' } } });
		redirect(303, back(event.url));
	}
} satisfies Actions;
