import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireCan, requireUser } from '$lib/server/guards';
import { can } from '$lib/permissions';
import { seasonFromParams } from '$lib/server/api';
import * as harvests from '$lib/server/harvests';
import * as harvestLog from '$lib/server/harvest-log';
import { listMembers } from '$lib/server/members';
import { harvestPatchSchema, harvestSchema } from '$lib/schemas/harvest';
import { fieldErrors } from '$lib/schemas/common';
import { readForm } from '$lib/server/form';
import { textValues } from '$lib/library-form';
import { sheetRows, remapRowErrors } from './sheet';
import { displayPrefs } from '$lib/server/farms';
import { storedQuantity } from '$lib/format';

/** Quantities are typed in the farm's units (kg on a metric farm) and kept in the crop's canonical unit. */
async function inFarmUnits<T extends { quantity?: number; unit?: string }>(farmId: number, records: T[]): Promise<T[]> {
	const { unitSystem } = await displayPrefs(farmId);
	return records.map((r) =>
		r.quantity === undefined || r.unit === undefined
			? r
			: { ...r, quantity: storedQuantity(r.quantity, r.unit, unitSystem) }
	);
}

export const load = (async (event) => {
	const { farm, user } = requireUser(event);
	const { season } = await event.parent();
	const today = await harvests.farmToday(farm.id);
	const [records, plantings, members, audit] = await Promise.all([
		harvests.list(farm.id, season.id),
		harvests.plantingOptions(farm.id, season.id, today),
		listMembers(farm.id),
		harvests.auditTrail(farm.id, season.id, 50)
	]);
	return {
		today,
		records,
		plantings,
		members: members.map((m) => ({ id: m.userId, name: m.name })),
		audit,
		me: user.id,
		canWrite: can(farm.role, 'harvests.log')
	};
}) satisfies PageServerLoad;

export const actions = {
	log: async (event) => {
		const { farm, user } = requireCan(event, 'harvests.log');
		const season = await seasonFromParams(farm.id, event.params.id);
		const form = await readForm(event.request, harvestSchema);
		if (form.refused) return fail(400, { log: form.refused });
		const out = await harvestLog.create(farm.id, season.id, user.id, await inFarmUnits(farm.id, [form.data]));
		if (!out.ok) return fail(out.status, { log: { errors: out.errors, values: form.values } });
		redirect(303, `/seasons/${season.id}/harvests?logged=${out.value[0].id}`);
	},
	sheet: async (event) => {
		const { farm, user } = requireCan(event, 'harvests.log');
		const season = await seasonFromParams(farm.id, event.params.id);
		const values = textValues(await event.request.formData());
		const { records, rowOf, errors } = sheetRows(values);
		if (Object.keys(errors).length) return fail(400, { sheet: { errors, values } });
		const out = await harvestLog.create(farm.id, season.id, user.id, await inFarmUnits(farm.id, records), true);
		if (!out.ok) return fail(out.status, { sheet: { errors: remapRowErrors(out.errors, rowOf), values } });
		redirect(303, `/seasons/${season.id}/harvests?saved=${out.value.length}`);
	},
	edit: async (event) => {
		const { farm, user } = requireCan(event, 'harvests.log');
		const season = await seasonFromParams(farm.id, event.params.id);
		const { id, ...values } = textValues(await event.request.formData());
		const key = `edit-${id}`;
		const parsed = harvestPatchSchema.safeParse(values);
		if (!parsed.success) return fail(400, { edit: { key, errors: fieldErrors(parsed.error), values } });
		const [patch] = await inFarmUnits(farm.id, [parsed.data]);
		const out = await harvestLog.update(farm.id, season.id, Number(id), user.id, patch);
		if (!out.ok) return fail(out.status, { edit: { key, errors: out.errors, values } });
		redirect(303, `/seasons/${season.id}/harvests?edited=${id}`);
	},
	delete: async (event) => {
		const { farm, user } = requireCan(event, 'harvests.log');
		const season = await seasonFromParams(farm.id, event.params.id);
		const id = Number((await event.request.formData()).get('id'));
		if (!Number.isInteger(id) || !(await harvestLog.remove(farm.id, season.id, id, user.id)))
			return fail(404, {
				edit: { key: `edit-${id}`, errors: { _form: 'No such harvest record in this season.' }, values: {} }
			});
		redirect(303, `/seasons/${season.id}/harvests?deleted=${id}`);
	}
} satisfies Actions;
