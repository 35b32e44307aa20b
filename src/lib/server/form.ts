// A posted form read against its schema, and the answer a refused one gets: the first message for each bad
// field, with what was typed so the form shows it again (never a secret such as a password).
import { fail, type ActionFailure, type RequestEvent } from '@sveltejs/kit';
import type { z } from 'zod';
import { fieldErrors, type FieldErrors } from '$lib/schemas/common';
import { textValues } from '$lib/library-form';
import type { Action } from '$lib/permissions';
import { requireCan, type Viewer } from './guards';

export type FormValues = Record<string, string>;

/** What a refused form answers: a message for each bad field (`_form` for the whole form), and what was typed. */
export interface FormRefusal {
	errors: FieldErrors;
	values: FormValues;
}

export type FormRead<T> =
	{ data: T; values: FormValues; refused?: undefined } | { data?: undefined; values: FormValues; refused: FormRefusal };

/**
 * The posted fields as text (capped, see textValues), checked by the schema, or by the one a function picks
 * from those fields (a crop's schema depends on its harvest unit). `secret` fields are checked but not echoed.
 * Use: `const form = await readForm(event.request, schema); if (form.refused) return fail(400, form.refused);`
 */
export async function readForm<S extends z.ZodType>(
	request: Request,
	schema: S | ((fields: FormValues) => S | Promise<S>),
	options: { secret?: string[] } = {}
): Promise<FormRead<z.output<S>>> {
	const fields = textValues(await request.formData());
	const values = Object.fromEntries(Object.entries(fields).filter(([k]) => !options.secret?.includes(k)));
	const parsed = (typeof schema === 'function' ? await schema(fields) : schema).safeParse(fields);
	if (!parsed.success) return { values, refused: { errors: fieldErrors(parsed.error), values } };
	return { data: parsed.data, values };
}

/** A model's refusal of one field, thrown by a write (a duplicate name, a crop of another farm). */
interface InputError {
	field: string;
	message: string;
	status?: number;
}

/**
 * Runs a write (which may end in a redirect); an input error of the given kind that it throws becomes the
 * form's answer at that field, with what was typed. Anything else is thrown on.
 */
export async function answerInputErrors<T>(
	kind: abstract new (...args: never[]) => InputError,
	values: FormValues,
	write: () => Promise<T>
): Promise<T | ActionFailure<FormRefusal>> {
	try {
		return await write();
	} catch (e) {
		if (e instanceof kind) return fail(e.status ?? 400, { errors: { [e.field]: e.message }, values });
		throw e;
	}
}

/**
 * A form action that one permission allows and that reads one form: the viewer must be allowed `action`,
 * a refused form answers 400, and `run` gets the viewer and the checked form. The schema may depend on
 * the fields and the viewer (a crop's on its harvest unit and the farm's units).
 */
export function formAction<S extends z.ZodType, R>(
	action: Action,
	schema: S | ((fields: FormValues, viewer: Viewer) => S | Promise<S>),
	run: (viewer: Viewer & { event: RequestEvent }, form: { data: z.output<S>; values: FormValues }) => Promise<R>
) {
	return async (event: RequestEvent) => {
		const viewer = requireCan(event, action);
		const form = await readForm(event.request, typeof schema === 'function' ? (f) => schema(f, viewer) : schema);
		if (form.refused) return fail(400, form.refused);
		return run({ ...viewer, event }, form);
	};
}
