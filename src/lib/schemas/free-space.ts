// The free-space question "which beds are free from week X to week Y, for how many feet?",
// shared by the bed timeline's form (query string), the JSON route and the browser.
import { z } from 'zod';
import { weekStart } from '$lib/planning';
import { isoWeekKey, numberField } from './common';
import { M_PER_FT } from '$lib/planning/units';
import type { UnitSystem } from '$lib/format';

const isoWeekField = isoWeekKey;

const blank = (v: unknown): unknown => (typeof v === 'string' && v.trim() === '' ? undefined : v);

/** The question as a farm types it: the minimum length in feet, or in metres on a metric farm. */
export const freeSpaceQuerySchemaFor = (system: UnitSystem) =>
	z
		.object({
			from: isoWeekField('From week'),
			to: isoWeekField('To week'),
			minFt: z.preprocess(
				blank,
				(system === 'metric'
					? numberField('Minimum length', 0, 30_000).transform((m) => m / M_PER_FT)
					: numberField('Minimum feet', 0, 100_000)
				).optional()
			),
			block: z.preprocess(blank, numberField('Block', 1, 2_147_483_647, { int: true }).optional())
		})
		.superRefine((q, ctx) => {
			// Only compare once both weeks parse; each bad week already has its own message.
			try {
				if (weekStart(q.to) < weekStart(q.from))
					ctx.addIssue({ code: 'custom', path: ['to'], message: 'To week must not be before the from week.' });
			} catch {
				/* reported at the field */
			}
		});

export const freeSpaceQuerySchema = freeSpaceQuerySchemaFor('imperial');
export type FreeSpaceQuery = z.infer<typeof freeSpaceQuerySchema>;
