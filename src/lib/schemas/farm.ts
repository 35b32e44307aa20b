import { z } from 'zod';
import { isoDate, numberField, plainText } from './common';
import { CM_PER_IN, M_PER_FT } from '$lib/planning/units';
import type { UnitSystem } from '$lib/format';

/**
 * Bed figures as the farm types them: feet and inches, or metres and centimetres, kept in feet and
 * whole inches (NIST Handbook 44 constants). Bounds are the same beds in either system.
 */
function bedLength(system: UnitSystem) {
	return system === 'metric'
		? numberField('Length (m)', 0.3, 609).transform((m) => Math.round((m / M_PER_FT) * 10) / 10)
		: numberField('Length (ft)', 1, 2000);
}
function bedWidth(system: UnitSystem) {
	return system === 'metric'
		? numberField('Width (cm)', 15, 610).transform((cm) => Math.round(cm / CM_PER_IN))
		: numberField('Width (in)', 6, 240, { int: true });
}
/** The step plantings are rounded up to: whole feet, typed in metres on a metric farm. */
function lengthStep(system: UnitSystem) {
	return system === 'metric'
		? numberField('Bed length step', 0.3, 15.2).transform((m) => Math.max(1, Math.round(m / M_PER_FT)))
		: numberField('Bed-foot increment', 1, 50, { int: true });
}

/** How the farm writes dates: a locale tag the runtime knows (its CLDR data gives the day/month order). */
export const dateLocaleSchema = z
	.string()
	.regex(/^[A-Za-z]{2,3}(-[A-Za-z0-9]{2,8}){0,3}$/, 'Date style must be a locale tag such as en-US or de-DE.')
	.refine((tag) => {
		try {
			return Intl.DateTimeFormat.supportedLocalesOf(tag).length > 0;
		} catch {
			return false;
		}
	}, 'Date style must be a locale tag such as en-US or de-DE.');

/** The farm form; `system` is the unit system the form was shown in (the farm's before this save). */
export const farmSettingsSchemaFor = (system: UnitSystem) =>
	z
		.object({
			name: plainText('Farm name', 120),
			latitude: numberField('Latitude', -66, 66),
			timeZone: plainText('Time zone', 64).refine((tz) => {
				try {
					new Intl.DateTimeFormat('en', { timeZone: tz });
					return true;
				} catch {
					return false;
				}
			}, 'Time zone must be an IANA name such as America/New_York.'),
			unitSystem: z.enum(['imperial', 'metric'], { error: 'Choose imperial or metric units.' }),
			// ISO 4217; optional so older forms and imports keep the farm's currency.
			currency: z
				.string()
				.regex(/^[A-Z]{3}$/, 'Currency must be a three-letter ISO 4217 code such as USD or EUR.')
				.refine((c) => {
					try {
						new Intl.NumberFormat('en', { style: 'currency', currency: c });
						return true;
					} catch {
						return false;
					}
				}, 'Currency must be a three-letter ISO 4217 code such as USD or EUR.')
				.optional(),
			// Optional so older forms keep the farm's choice.
			dateLocale: dateLocaleSchema.optional(),
			lastSpringFrost: isoDate('Last spring frost'),
			firstFallFrost: isoDate('First fall frost'),
			bedFootIncrement: lengthStep(system),
			turnaroundDays: numberField('Bed turnaround', 0, 60, { int: true }),
			// Optional so older forms and imports keep the farm's choice.
			frostProbabilityPct: numberField('Frost date probability', 10, 90, { int: true }).optional(),
			tenderDaysAfterFrost: numberField('Tender crops out after the last frost', 0, 60, { int: true }).optional(),
			rotationYears: numberField('Rotation look-back', 1, 10, { int: true }).optional()
		})
		.refine((v) => v.lastSpringFrost < v.firstFallFrost, {
			message: 'First fall frost must come after the last spring frost.',
			path: ['firstFallFrost']
		});
export const farmSettingsSchema = farmSettingsSchemaFor('imperial');

export const bedSchemaFor = (system: UnitSystem) =>
	z.object({
		name: plainText('Bed name', 60),
		blockId: numberField('Block', 1, Number.MAX_SAFE_INTEGER, { int: true }),
		lengthFt: bedLength(system),
		widthIn: bedWidth(system),
		position: numberField('Walking order', 0, 100000, { int: true })
	});
export const bedSchema = bedSchemaFor('imperial');

export const blockSchema = z.object({ name: plainText('Block name', 60) });

/** "12 beds of 100 ft, 30 in wide" in block "North", named N1 … N12. */
export const bulkBedsSchemaFor = (system: UnitSystem) =>
	z.object({
		block: plainText('Block', 60),
		count: numberField('Number of beds', 1, 200, { int: true }),
		lengthFt: bedLength(system),
		widthIn: bedWidth(system),
		prefix: z.preprocess(
			(v) => (typeof v === 'string' ? v.trim() : v),
			z
				.string()
				.max(20, 'Name start must be at most 20 characters.')
				.refine((v) => !/[<>]/.test(v), 'Name start may not contain < or >.')
		),
		firstNumber: numberField('First number', 0, 100_000, { int: true })
	});
export const bulkBedsSchema = bulkBedsSchemaFor('imperial');
export type BulkBedsInput = z.infer<typeof bulkBedsSchema>;

/** The set-up path's first step: where the farm is and its frost dates. */
export const locationSchema = z
	.object({
		latitude: numberField('Latitude', -66, 66),
		timeZone: farmSettingsSchema.shape.timeZone,
		unitSystem: z.enum(['imperial', 'metric'], { error: 'Choose imperial or metric units.' }),
		lastSpringFrost: isoDate('Last spring frost'),
		firstFallFrost: isoDate('First fall frost')
	})
	.refine((v) => v.lastSpringFrost < v.firstFallFrost, {
		message: 'First fall frost must come after the last spring frost.',
		path: ['firstFallFrost']
	});
