import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireCan } from '$lib/server/guards';
import * as farms from '$lib/server/farms';
import * as beds from '$lib/server/beds';
import { bedSchemaFor, blockSchema, farmSettingsSchemaFor } from '$lib/schemas/farm';
import { fieldErrors } from '$lib/schemas/common';
import { bulkBedsAction } from '$lib/server/bed-bulk-action';

function text(form: FormData): Record<string, string> {
	return Object.fromEntries([...form.entries()].map(([k, v]) => [k, String(v)]));
}

export const load = (async (event) => {
	const { farm } = requireCan(event, 'farm.settings');
	const [settings, blocks, bedList] = await Promise.all([
		farms.get(farm.id),
		beds.listBlocks(farm.id),
		beds.list(farm.id)
	]);
	return { settings, blocks, beds: bedList, welcome: event.url.searchParams.has('welcome') };
}) satisfies PageServerLoad;

export const actions = {
	bulkBeds: bulkBedsAction,
	farm: async (event) => {
		const { farm } = requireCan(event, 'farm.settings');
		const values = text(await event.request.formData());
		// Lengths are read in the units the form was shown in: the farm's, before this save.
		const parsed = farmSettingsSchemaFor((await farms.displayPrefs(farm.id)).unitSystem).safeParse(values);
		if (!parsed.success) return fail(400, { farm: { errors: fieldErrors(parsed.error), values } });
		await farms.update(farm.id, parsed.data);
		return { farm: { saved: true } };
	},
	addBlock: async (event) => {
		const { farm } = requireCan(event, 'farm.settings');
		const values = text(await event.request.formData());
		const parsed = blockSchema.safeParse(values);
		if (!parsed.success) return fail(400, { block: { errors: fieldErrors(parsed.error), values } });
		try {
			await beds.createBlock(farm.id, parsed.data.name);
		} catch (e) {
			if (e instanceof beds.BedInputError) return fail(400, { block: { errors: { [e.field]: e.message }, values } });
			throw e;
		}
		redirect(303, '/settings#beds');
	},
	saveBed: async (event) => {
		const { farm } = requireCan(event, 'farm.settings');
		const values = text(await event.request.formData());
		const bedId = values.id ? Number(values.id) : null;
		const key = bedId ? `bed-${bedId}` : 'bed-new';
		const parsed = bedSchemaFor((await farms.displayPrefs(farm.id)).unitSystem).safeParse(values);
		if (!parsed.success) return fail(400, { bed: { key, errors: fieldErrors(parsed.error), values } });
		try {
			if (bedId) {
				if (!(await beds.update(farm.id, bedId, parsed.data)))
					return fail(404, { bed: { key, errors: { _form: 'That bed is not on this farm.' }, values } });
			} else {
				await beds.create(farm.id, parsed.data);
			}
		} catch (e) {
			if (e instanceof beds.BedInputError) return fail(400, { bed: { key, errors: { [e.field]: e.message }, values } });
			throw e;
		}
		redirect(303, '/settings#beds');
	},
	deleteBed: async (event) => {
		const { farm } = requireCan(event, 'farm.settings');
		const id = Number((await event.request.formData()).get('id'));
		if (!Number.isInteger(id) || !(await beds.remove(farm.id, id)))
			return fail(404, { bed: { key: `bed-${id}`, errors: { _form: 'That bed is not on this farm.' }, values: {} } });
		redirect(303, '/settings#beds');
	}
} satisfies Actions;
