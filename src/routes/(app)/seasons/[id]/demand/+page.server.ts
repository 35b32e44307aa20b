import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad, RequestEvent } from './$types';
import { requireCan, requireUser } from '$lib/server/guards';
import { can } from '$lib/permissions';
import { seasonFromParams } from '$lib/server/api';
import * as demand from '$lib/server/demand';
import { copyWeek, saveCells } from '$lib/server/demand-cells';
import { importDemand, uploadFromForm, MAX_UPLOAD_BYTES } from '$lib/server/import/demand';
import { cellErrorsToInputs, gridFields, shareFields, text } from './form-input';
import * as farms from '$lib/server/farms';

export const load = (async (event) => {
	const { farm } = requireUser(event);
	const { season } = await event.parent();
	const view = await demand.getDemand(farm.id, season.id);
	const wanted = event.url.searchParams.get('grid');
	const grids = [...view.shareSizes.map((s) => `share:${s.id}`), 'market', 'restaurant'];
	return {
		demand: view,
		grid: wanted && grids.includes(wanted) ? wanted : grids[0],
		span: demand.seasonWeekSpan(season),
		canEdit: can(farm.role, 'demand.edit'),
		maxUploadKb: MAX_UPLOAD_BYTES / 1024
	};
}) satisfies PageServerLoad;

/** Runs a write and turns a refusal into fail(status, { [key]: { errors, values } }). */
async function attempt(
	key: string,
	values: Record<string, unknown>,
	work: () => Promise<unknown>,
	mapErrors = (e: Record<string, string>) => e
) {
	try {
		await work();
		return null;
	} catch (e) {
		if (e instanceof demand.DemandInputError)
			return fail(e.status === 409 ? 400 : e.status, { [key]: { errors: mapErrors(e.errors), values } });
		throw e;
	}
}

async function editing(event: RequestEvent) {
	const { farm } = requireCan(event, 'demand.edit');
	const season = await seasonFromParams(farm.id, event.params.id);
	return { farm, season, form: await event.request.formData() };
}

const back = (event: RequestEvent, grid?: string): string =>
	`/seasons/${event.params.id}/demand${grid ? `?grid=${encodeURIComponent(grid)}` : ''}`;

export const actions = {
	addShare: async (event) => {
		const { farm, season, form } = await editing(event);
		const values = shareFields(form);
		const failed = await attempt('share', { ...values, key: 'new' }, () =>
			demand.createShareSize(farm.id, season, values)
		);
		if (failed) return failed;
		redirect(303, back(event));
	},
	saveShare: async (event) => {
		const { farm, season, form } = await editing(event);
		const id = Number(form.get('id'));
		const values = shareFields(form);
		let found = true;
		const failed = await attempt(
			'share',
			{ ...values, key: String(id) },
			async () => (found = (await demand.updateShareSize(farm.id, season, id, values)) !== null)
		);
		if (failed) return failed;
		if (!found)
			return fail(404, {
				share: { errors: { _form: 'No such share size in this season.' }, values: { ...values, key: String(id) } }
			});
		redirect(303, back(event));
	},
	deleteShare: async (event) => {
		const { farm, season, form } = await editing(event);
		const id = Number(form.get('id'));
		if (!Number.isInteger(id) || !(await demand.removeShareSize(farm.id, season.id, id)))
			return fail(404, {
				share: { errors: { _form: 'No such share size in this season.' }, values: { key: String(id) } }
			});
		redirect(303, back(event));
	},
	saveGrid: async (event) => {
		const { farm, season, form } = await editing(event);
		const crops = await demand.listCrops(farm.id);
		const { unitSystem } = await farms.displayPrefs(farm.id);
		const { body, names } = gridFields(form, new Map(crops.map((c) => [c.id, c.unit])), unitSystem);
		const failed = await attempt(
			'grid',
			text(form),
			() => saveCells(farm.id, season, body),
			(e) => cellErrorsToInputs(e, names)
		);
		if (failed) return failed;
		redirect(303, back(event, body.grid));
	},
	copyWeek: async (event) => {
		const { farm, season, form } = await editing(event);
		const values = text(form);
		const { grid = '', fromWeek = '', toFirst = '', toLast = '' } = values;
		const failed = await attempt('copy', values, () => copyWeek(farm.id, season, { grid, fromWeek, toFirst, toLast }));
		if (failed) return failed;
		redirect(303, back(event, grid));
	},
	upload: async (event) => {
		const { farm } = requireCan(event, 'demand.edit');
		const season = await seasonFromParams(farm.id, event.params.id);
		const form = await uploadFromForm(event.request);
		if (!form.ok) return fail(400, { upload: { errors: [{ row: 0, column: form.field, message: form.message }] } });
		const result = await importDemand(farm.id, season, form.file, form.mode);
		if (!result.ok) return fail(result.status, { upload: { errors: result.errors } });
		return { upload: { done: { rows: result.rows, set: result.set, cleared: result.cleared } } };
	}
} satisfies Actions;
