import { error, fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad, RequestEvent } from './$types';
import { requireCan, requireUser } from '$lib/server/guards';
import { can } from '$lib/permissions';
import * as seasons from '$lib/server/seasons';
import { copySeason } from '$lib/server/season-copy';
import { seasonCopySchema, seasonCreateSchema, seasonRenameSchema } from '$lib/schemas/season';
import { readForm } from '$lib/server/form';
import { textValues } from '$lib/library-form';
import * as farms from '$lib/server/farms';
import { todayIn } from '$lib/today';

export const load = (async (event) => {
	const { farm } = requireUser(event);
	const [list, settings] = await Promise.all([seasons.listSummaries(farm.id), farms.get(farm.id)]);
	const thisYear = Number(todayIn(settings.timeZone).slice(0, 4));
	const taken = new Set(list.map((s) => s.year));
	let nextYear = thisYear;
	while (taken.has(nextYear)) nextYear++;
	return { summaries: list, canEdit: can(farm.role, 'seasons.manage'), nextYear };
}) satisfies PageServerLoad;

function seasonId(raw: string | undefined): number {
	const id = Number(raw);
	if (!Number.isInteger(id) || id < 1) error(404, 'No such season on this farm.');
	return id;
}

async function setArchived(event: RequestEvent, archived: boolean) {
	const { farm } = requireCan(event, 'seasons.manage');
	const values = textValues(await event.request.formData());
	if (!(await seasons.setArchived(farm.id, seasonId(values.id), archived))) error(404, 'No such season on this farm.');
	redirect(303, '/seasons');
}

export const actions = {
	create: async (event) => {
		const { farm } = requireCan(event, 'seasons.manage');
		const { data, values, refused } = await readForm(event.request, seasonCreateSchema);
		if (refused) return fail(400, { create: refused });
		let id: number;
		try {
			id = await seasons.create(farm.id, data);
		} catch (e) {
			if (e instanceof seasons.SeasonInputError)
				return fail(e.status, { create: { errors: { [e.field]: e.message }, values } });
			throw e;
		}
		redirect(303, `/seasons/${id}`);
	},
	copy: async (event) => {
		const { farm, user } = requireCan(event, 'seasons.manage');
		const { data, values, refused } = await readForm(event.request, seasonCopySchema);
		if (refused) return fail(400, { copy: refused });
		const source = await seasons.get(farm.id, data.from);
		if (!source) return fail(400, { copy: { errors: { from: "Choose one of this farm's seasons." }, values } });
		const out = await copySeason(farm.id, source, user.id);
		if (!out.ok) return fail(out.status, { copy: { errors: { from: out.message }, values } });
		redirect(303, `/seasons/${out.report.season.id}`);
	},
	rename: async (event) => {
		const { farm } = requireCan(event, 'seasons.manage');
		const { data, values, refused } = await readForm(event.request, seasonRenameSchema);
		const id = seasonId(values.id);
		if (!(await seasons.get(farm.id, id))) error(404, 'No such season on this farm.');
		if (refused) return fail(400, { rename: { id, ...refused } });
		if (!(await seasons.rename(farm.id, id, data.name))) error(404, 'No such season on this farm.');
		return { rename: { id, saved: true } };
	},
	archive: (event) => setArchived(event, true),
	restore: (event) => setArchived(event, false)
} satisfies Actions;
