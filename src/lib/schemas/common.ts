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

/**
 * The app's one rule for calendar dates: 'YYYY-MM-DD', a real calendar date, in 1900–2200.
 * Planting dates are held tighter still, to their season's year ± 1 (seasonDateProblem).
 */
export const DATE_MIN_YEAR = 1900;
export const DATE_MAX_YEAR = 2200;

/** Why `v` is not an acceptable date, or null when it is. */
export function dateProblem(label: string, v: string): string | null {
	if (!/^\d{4}-\d{2}-\d{2}$/.test(v)) return `${label} must be a date (YYYY-MM-DD).`;
	const year = Number(v.slice(0, 4));
	const month = Number(v.slice(5, 7));
	const day = Number(v.slice(8, 10));
	const real =
		month >= 1 &&
		month <= 12 &&
		day >= 1 &&
		day <= new Date(Date.UTC(2000, month, 0)).getUTCDate() &&
		(month !== 2 || day < 29 || leap(year));
	if (!real) return `${label} is not a real calendar date.`;
	if (year < DATE_MIN_YEAR || year > DATE_MAX_YEAR)
		return `${label} must be between ${DATE_MIN_YEAR} and ${DATE_MAX_YEAR}.`;
	return null;
}

function leap(y: number): boolean {
	return (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;
}

export const isoDate = (label: string) =>
	z.string({ error: `${label} is required.` }).superRefine((v, ctx) => {
		const problem = dateProblem(label, v);
		if (problem) ctx.addIssue({ code: 'custom', message: problem });
	});

/** A planting's dates (planned or actual) lie within its season's year ± 1. */
export function seasonDateProblem(label: string, v: string, seasonYear: number): string | null {
	const year = Number(v.slice(0, 4));
	if (Math.abs(year - seasonYear) > 1)
		return `${label} must be within ${seasonYear - 1}–${seasonYear + 1}, the ${seasonYear} season's year ± 1.`;
	return null;
}

/** An ISO week key 'YYYY-Www' that exists (W53 only in years that have one), in 1900–2200. */
export function isoWeekProblem(label: string, v: string): string | null {
	if (!/^\d{4}-W\d{2}$/.test(v)) return `${label} must be an ISO week like 2027-W24.`;
	const year = Number(v.slice(0, 4));
	if (year < DATE_MIN_YEAR || year > DATE_MAX_YEAR)
		return `${label} must be a week between ${DATE_MIN_YEAR} and ${DATE_MAX_YEAR}.`;
	const week = Number(v.slice(6));
	// ISO 8601: a year has 53 weeks when 28 December falls in week 53 (its 1 January or, in a
	// leap year, 31 December is a Thursday); otherwise 52.
	const jan1 = new Date(Date.UTC(year, 0, 1)).getUTCDay();
	const weeks = jan1 === 4 || (leap(year) && jan1 === 3) ? 53 : 52;
	if (week < 1 || week > weeks) return `${label}: ${year} has no ISO week ${week} (it has ${weeks}).`;
	return null;
}

export const isoWeekKey = (label: string) =>
	z
		.string({ error: `${label} is required.` })
		.trim()
		.transform((v) => v.toUpperCase())
		.superRefine((v, ctx) => {
			const problem = isoWeekProblem(label, v);
			if (problem) ctx.addIssue({ code: 'custom', message: problem });
		});

/**
 * A typed or pasted number as text: "1,000" and "1.000" could each be one thousand or one, so
 * they are refused with both readings named; "1,5", "1.5", "1,000.5" and "1 000" read one way.
 */
export function numberFromText(
	label: string,
	v: string,
	ctx: { addIssue(issue: { code: 'custom'; message: string }): void }
): unknown {
	if (v.trim() === '') return undefined;
	const read = parseNumberText(v);
	if (read.kind === 'number') return read.value;
	if (read.kind === 'ambiguous') {
		const [a, b] = read.readings;
		ctx.addIssue({
			code: 'custom',
			message: `${label}: "${v.trim()}" could be ${a.toLocaleString('en-US')} or ${String(b)}; write it without a thousands separator.`
		});
		return z.NEVER;
	}
	return Number.NaN;
}

/** A number typed into a form field (a string there) or sent as JSON (a number). */
export const numberField = (label: string, min: number, max: number, opts: { int?: boolean } = {}) =>
	z.preprocess(
		(v, ctx) => (typeof v === 'string' ? numberFromText(label, v, ctx) : v),
		z
			.number({
				error: (issue) => (issue.input === undefined ? `${label} is required.` : `${label} must be a number.`)
			})
			.refine((n) => Number.isFinite(n), `${label} must be a number.`)
			.refine((n) => !opts.int || Number.isInteger(n), `${label} must be a whole number.`)
			.refine((n) => n >= min, `${label} must be at least ${min}.`)
			.refine((n) => n <= max, `${label} must be at most ${max}.`)
	);

/**
 * Money typed as dollars ("$0.29", "720.50", "1,200") or sent as a number, kept as whole cents.
 * More than two decimals is refused with the field's name, never rounded away (0.001 is not 0).
 */
export const moneyCents = (label: string, maxDollars = 1_000_000) =>
	z.preprocess(
		(v) =>
			typeof v === 'number'
				? Number.isFinite(v)
					? String(v)
					: 'not a number'
				: typeof v === 'string'
					? v
							.trim()
							.replace(/^\$\s*/, '')
							.replace(/,/g, '')
					: v,
		z
			.string({ error: `${label} is required.` })
			.min(1, `${label} is required.`)
			.regex(/^\d{1,9}(\.\d+)?$/, `${label} must be an amount like 0.29 or 720.00.`)
			.refine(
				(s) => (s.split('.')[1] ?? '').replace(/0+$/, '').length <= 2,
				`${label} must be in whole cents (at most 2 decimals); a smaller amount cannot be kept.`
			)
			.refine((s) => Number(s.split('.')[0]) <= maxDollars, `${label} must be at most ${maxDollars}.`)
			// Whole and fraction parts separately, so 0.29 never becomes 28 cents through float rounding.
			.transform((s) => {
				const [whole, frac = ''] = s.split('.');
				return Number(whole) * 100 + Number(frac.replace(/0+$/, '').padEnd(2, '0'));
			})
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

const DAYS_IN_MONTH = [31, 29, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** MM-DD: a day that every (leap) year has. */
export function monthDaySchema(label: string) {
	return z.string().refine((v) => {
		const m = /^(\d{2})-(\d{2})$/.exec(v.trim());
		if (!m) return false;
		const month = Number(m[1]);
		const day = Number(m[2]);
		return month >= 1 && month <= 12 && day >= 1 && day <= DAYS_IN_MONTH[month - 1];
	}, `${label} must be a month and day as MM-DD, e.g. 10-01.`);
}
