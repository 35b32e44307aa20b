// Small helpers shared by the JSON routes: the season from the URL, and a validated JSON body.
import { error, json, type RequestEvent } from '@sveltejs/kit';
import type { z } from 'zod';
import { fieldErrors, type FieldErrors } from '$lib/schemas/common';
import type { ApiErrorAnswer } from '$lib/api-answers';
import * as seasons from './seasons';

/** The season named in the URL, if it is this farm's; another farm's answers 404 like a missing one. */
export async function seasonFromParams(farmId: number, raw: string): Promise<seasons.Season> {
	const id = Number(raw);
	const season = Number.isInteger(id) && id > 0 ? await seasons.get(farmId, id) : null;
	if (!season) error(404, 'No such season on this farm.');
	return season;
}

export type Parsed<T> = { ok: true; data: T } | { ok: false; response: Response };

/** Parses the JSON body with the schema; a bad body is a 400 naming each field. */
export async function parseBody<S extends z.ZodType>(event: RequestEvent, schema: S): Promise<Parsed<z.infer<S>>> {
	let body: unknown = {};
	const text = await event.request.text();
	if (text.trim() !== '') {
		try {
			body = JSON.parse(text);
		} catch {
			return {
				ok: false,
				response: json({ message: 'The body is not valid JSON.', errors: { _body: 'not valid JSON' } }, { status: 400 })
			};
		}
	}
	const parsed = schema.safeParse(body);
	if (!parsed.success) return { ok: false, response: invalidAnswer(fieldErrors(parsed.error)) };
	return { ok: true, data: parsed.data };
}

/** Parses the URL's query string with the schema; a bad query is a 400 naming each parameter. */
export function parseQuery<S extends z.ZodType>(event: RequestEvent, schema: S): Parsed<z.infer<S>> {
	const parsed = schema.safeParse(Object.fromEntries(event.url.searchParams));
	if (!parsed.success) return { ok: false, response: invalidAnswer(fieldErrors(parsed.error), 'query') };
	return { ok: true, data: parsed.data };
}

/** The 400 of every JSON route: a sentence naming each bad field, and the fields one by one. */
export function invalidAnswer(errors: FieldErrors, what: 'input' | 'query' = 'input'): Response {
	const list = Object.entries(errors)
		.map(([k, v]) => `${k}: ${v}`)
		.join('; ');
	return json({ message: `Invalid ${what}: ${list}`, errors } satisfies ApiErrorAnswer, { status: 400 });
}
