import { z } from 'zod';

const share = z.object({
	varietyId: z
		.number({ error: 'varietyId must be a number.' })
		.int('varietyId must be a whole number.')
		.positive('varietyId must be positive.'),
	fromWeek: z
		.number({ error: 'fromWeek must be a number.' })
		.int()
		.min(1, 'fromWeek must be 1-53.')
		.max(53, 'fromWeek must be 1-53.')
		.optional(),
	toWeek: z
		.number({ error: 'toWeek must be a number.' })
		.int()
		.min(1, 'toWeek must be 1-53.')
		.max(53, 'toWeek must be 1-53.')
		.optional(),
	fraction: z
		.number({ error: 'fraction must be a number.' })
		.gt(0, 'fraction must be above 0.')
		.max(1, 'fraction must be at most 1.')
		.optional()
});

/** Options of a plan run; every field may be left out for the farm's defaults. */
export const planRequestSchema = z
	.object({
		intervalWeeks: z
			.number({ error: 'intervalWeeks must be a number.' })
			.int('intervalWeeks must be a whole number of weeks.')
			.min(1, 'intervalWeeks must be 1-4.')
			.max(4, 'intervalWeeks must be 1-4.')
			.optional(),
		margin: z
			.number({ error: 'margin must be a number.' })
			.min(0, 'margin must be 0-1 (a fraction).')
			.max(1, 'margin must be 0-1 (a fraction).')
			.optional(),
		/** Which varieties carry each crop's targets, by crop id. */
		varietyPlan: z
			.record(
				z.string().regex(/^\d+$/, 'varietyPlan keys must be crop ids.'),
				z.array(share).min(1, 'each crop needs at least one variety share.')
			)
			.optional()
	})
	.strict();

export type PlanRequest = z.infer<typeof planRequestSchema>;

/** An apply may carry the fingerprint of the preview it was made from; a stale one is refused (409). */
export const applyRequestSchema = planRequestSchema
	.extend({
		fingerprint: z
			.string()
			.regex(/^[0-9a-f]{32}$/, 'fingerprint must be the one a preview returned.')
			.optional()
	})
	.strict();
