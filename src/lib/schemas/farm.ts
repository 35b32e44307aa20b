import { z } from 'zod';
import { isoDate, numberField, plainText } from './common';

export const farmSettingsSchema = z
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
		lastSpringFrost: isoDate('Last spring frost'),
		firstFallFrost: isoDate('First fall frost'),
		bedFootIncrement: numberField('Bed-foot increment', 1, 50, { int: true }),
		turnaroundDays: numberField('Bed turnaround', 0, 60, { int: true })
	})
	.refine((v) => v.lastSpringFrost < v.firstFallFrost, {
		message: 'First fall frost must come after the last spring frost.',
		path: ['firstFallFrost']
	});

export const bedSchema = z.object({
	name: plainText('Bed name', 60),
	blockId: numberField('Block', 1, Number.MAX_SAFE_INTEGER, { int: true }),
	lengthFt: numberField('Length (ft)', 1, 2000),
	widthIn: numberField('Width (in)', 6, 240, { int: true }),
	position: numberField('Walking order', 0, 100000, { int: true })
});

export const blockSchema = z.object({ name: plainText('Block name', 60) });
