// The free-space question "which beds are free from week X to week Y, for how many feet?",
// shared by the bed timeline's form (query string), the JSON route and the browser.
import { z } from 'zod';
import { weekStart } from '$lib/planning';
import { isoWeekKey, numberField } from './common';

const isoWeekField = isoWeekKey;

const blank = (v: unknown): unknown => (typeof v === 'string' && v.trim() === '' ? undefined : v);

export const freeSpaceQuerySchema = z
	.object({
		from: isoWeekField('From week'),
		to: isoWeekField('To week'),
		minFt: z.preprocess(blank, numberField('Minimum feet', 0, 100_000).optional()),
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

export type FreeSpaceQuery = z.infer<typeof freeSpaceQuerySchema>;
