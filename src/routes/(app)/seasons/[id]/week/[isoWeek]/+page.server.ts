import { error, fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireCan, requireUser } from '$lib/server/guards';
import { can } from '$lib/permissions';
import * as farms from '$lib/server/farms';
import { addWeeks } from '$lib/planning';
import { todayIn } from '$lib/today';
import { fieldErrors, type FieldErrors } from '$lib/schemas/common';
import { sheetContext } from '$lib/server/sheets/context';
import { weekSheet } from '$lib/server/sheets/week';
import { cautionsFor } from '$lib/server/sheets/cautions';
import { crewAddresses, sendWeekSheets } from '$lib/server/sheets/send';
import { markDoneSchema, sendSheetsSchema, splitAddresses } from '$lib/server/sheets/schemas';
import type { z } from 'zod';
import { markTaskDone, undoableMarks, undoTaskMark } from '$lib/server/tasks';
import { undoMarkSchema } from '$lib/server/sheets/schemas';

const quietWeek = (v: string | null): string | null => (v && /^\d{4}-W\d{2}$/.test(v) ? v : null);

export const load = (async (event) => {
	const { farm } = requireUser(event);
	const ctx = await sheetContext(farm.id, event.params.id, event.params.isoWeek);
	const canMark = can(farm.role, 'tasks.mark');
	const [settings, sheet, crew] = await Promise.all([
		farms.get(farm.id),
		weekSheet(farm.id, ctx.season.id, ctx.week, ctx.monday, ctx.sunday),
		canMark ? crewAddresses(farm.id) : Promise.resolve([] as string[])
	]);
	const shown = sheet.sections.flatMap((x) => x.groups.flatMap((g) => g.rows.map((r) => r.plantingId)));
	const undo = canMark ? await undoableMarks(farm.id, shown) : new Map();
	return {
		sheet,
		/** Per planting, its last tick that can still be taken back. */
		undo: Object.fromEntries(undo),
		cautions: cautionsFor(sheet.weekMeanF, sheet.unitSystem),
		canMark,
		crew,
		farmName: settings.name,
		today: todayIn(settings.timeZone),
		previousWeek: addWeeks(ctx.week, -1),
		nextWeek: addWeeks(ctx.week, 1),
		sent: event.url.searchParams.get('sent'),
		/** The week the crew lead asked for had no tasks: this is the next one that has some. */
		quietWeek: quietWeek(event.url.searchParams.get('quiet'))
	};
}) satisfies PageServerLoad;

export const actions = {
	done: async (event) => {
		const { farm, user } = requireCan(event, 'tasks.mark');
		const ctx = await sheetContext(farm.id, event.params.id, event.params.isoWeek);
		const form = Object.fromEntries(await event.request.formData());
		const plantingId = Number(form.plantingId);
		const parsed = markDoneSchema.safeParse(form);
		if (!parsed.success) return fail(400, { done: { plantingId, errors: fieldErrors(parsed.error) } });
		const settings = await farms.get(farm.id);
		const result = await markTaskDone(farm.id, ctx.season.id, user.id, parsed.data, todayIn(settings.timeZone));
		if (!result.ok) {
			if (result.code === 404) error(404, result.message);
			return fail(result.code, {
				done: { plantingId, errors: <FieldErrors>{ [result.field ?? '_form']: result.message } }
			});
		}
		redirect(303, event.url.pathname);
	},
	undo: async (event) => {
		const { farm, user } = requireCan(event, 'tasks.mark');
		const ctx = await sheetContext(farm.id, event.params.id, event.params.isoWeek);
		const parsed = undoMarkSchema.safeParse(Object.fromEntries(await event.request.formData()));
		if (!parsed.success) return fail(400, { undo: { errors: fieldErrors(parsed.error) } });
		const result = await undoTaskMark(farm.id, ctx.season.id, user.id, parsed.data.markId);
		if (!result.ok) {
			if (result.code === 404) error(404, result.message);
			return fail(409, { undo: { errors: <FieldErrors>{ _form: result.message } } });
		}
		redirect(303, event.url.pathname);
	},
	email: async (event) => {
		const { farm, user } = requireCan(event, 'tasks.mark');
		const ctx = await sheetContext(farm.id, event.params.id, event.params.isoWeek);
		const form = await event.request.formData();
		const values = { team: form.get('team') === 'on', extra: String(form.get('extra') ?? '') };
		const parsed = sendSheetsSchema.safeParse({ team: form.get('team') ?? '', extra: values.extra });
		if (!parsed.success) return fail(400, { email: { errors: addressErrors(parsed.error, values.extra), values } });
		const recipients = [...(parsed.data.team ? await crewAddresses(farm.id) : []), ...parsed.data.extra];
		const [settings, sheet] = await Promise.all([
			farms.get(farm.id),
			weekSheet(farm.id, ctx.season.id, ctx.week, ctx.monday, ctx.sunday)
		]);
		const sent = await sendWeekSheets({
			sheet,
			farmName: settings.name,
			seasonName: ctx.season.name,
			link: `${event.url.origin}${event.url.pathname}`,
			sender: user.name,
			recipients
		});
		redirect(303, `${event.url.pathname}?sent=${sent.length}`);
	}
} satisfies Actions;

/** Errors of the typed-in list name the address at fault, at the one "extra" field. */
function addressErrors(err: z.ZodError, raw: string): FieldErrors {
	const out = fieldErrors(err);
	const bad = Object.keys(out).find((k) => k.startsWith('extra.'));
	if (bad) {
		const i = Number(bad.split('.')[1]);
		const address = splitAddresses(raw)[i];
		out.extra = `${address}: ${out[bad]}`;
		delete out[bad];
	}
	return out;
}
