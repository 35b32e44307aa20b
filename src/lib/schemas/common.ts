// Building blocks shared by every input schema, on the server and in the browser alike.
import { z } from 'zod';
import { parseNumberText } from './number-text';

/** Free text a person types: trimmed, bounded, and never markup. */
export function plainText(label: string, max: number) {
	return z
		.string({ error: `${label} is required.` })
		.trim()
		.min(1, `${label} is required.`)
		.max(max, `${label} must be at most ${max} characters.`)
		.refine((v) => !/[<>]/.test(v), `${label} may not contain < or >.`);
}

export const email = z
	.string({ error: 'E-mail is required.' })
	.trim()
	.toLowerCase()
	.min(1, 'E-mail is required.')
	.max(254, 'E-mail must be at most 254 characters.')
	.pipe(z.email('Enter a valid e-mail address, like name@example.com.'));

export const password = z
	.string({ error: 'Password is required.' })
	.min(10, 'Password must be at least 10 characters.')
	.max(200, 'Password must be at most 200 characters.');

export const isoDate = (label: string) =>
	z
		.string({ error: `${label} is required.` })
		.regex(/^\d{4}-\d{2}-\d{2}$/, `${label} must be a date (YYYY-MM-DD).`)
		.refine((v) => !Number.isNaN(Date.parse(`${v}T00:00:00Z`)) && new Date(`${v}T00:00:00Z`).toISOString().startsWith(v), `${label} is not a real calendar date.`);

/**
 * A typed or pasted number as text: "1,000" and "1.000" could each be one thousand or one, so
 * they are refused with both readings named; "1,5", "1.5", "1,000.5" and "1 000" read one way.
 */
export function numberFromText(label: string, v: string, ctx: { addIssue(issue: { code: 'custom'; message: string }): void }): unknown {
	if (v.trim() === '') return undefined;
	const read = parseNumberText(v);
	if (read.kind === 'number') return read.value;
	if (read.kind === 'ambiguous') {
		const [a, b] = read.readings;
		ctx.addIssue({ code: 'custom', message: `${label}: "${v.trim()}" could be ${a.toLocaleString('en-US')} or ${String(b)}; write it without a thousands separator.` });
		return z.NEVER;
	}
	return Number.NaN;
}

/** A number typed into a form field (a string there) or sent as JSON (a number). */
export const numberField = (label: string, min: number, max: number, opts: { int?: boolean } = {}) =>
	z.preprocess(
		(v, ctx) => (typeof v === 'string' ? numberFromText(label, v, ctx) : v),
		z
			.number({ error: (issue) => (issue.input === undefined ? `${label} is required.` : `${label} must be a number.`) })
			.refine((n) => Number.isFinite(n), `${label} must be a number.`)
			.refine((n) => !opts.int || Number.isInteger(n), `${label} must be a whole number.`)
			.refine((n) => n >= min, `${label} must be at least ${min}.`)
			.refine((n) => n <= max, `${label} must be at most ${max}.`)
	);

export type FieldErrors = Record<string, string>;

/** The first message for each field, keyed by its path ('rows' or 'beds.3.name'). */
export function fieldErrors(error: z.ZodError): FieldErrors {
	const out: FieldErrors = {};
	for (const issue of error.issues) {
		const key = issue.path.join('.') || '_form';
		out[key] ??= issue.message;
	}
	return out;
}
