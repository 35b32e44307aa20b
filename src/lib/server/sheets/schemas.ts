// Inputs of the crew sheets: marking a task done and e-mailing the week's sheets.
import { z } from 'zod';
import { email, isoDate } from '$lib/schemas/common';

export const taskKinds = ['tray_sow', 'direct_sow', 'transplant', 'harvest', 'finish'] as const;
export type TaskKind = (typeof taskKinds)[number];

const wholeId = (label: string) =>
	z.preprocess(
		(v) => (typeof v === 'string' && v.trim() !== '' ? Number(v) : v),
		z
			.number({ error: `${label} is required.` })
			.int(`${label} must be a whole number.`)
			.positive(`${label} must be positive.`)
	);

export const markDoneSchema = z.object({
	plantingId: wholeId('Planting'),
	kind: z.enum(taskKinds, { error: `Task must be one of ${taskKinds.join(', ')}.` }),
	date: z.preprocess((v) => (typeof v === 'string' ? v.trim() : v), isoDate('Actual date')),
	// The version the sheet was shown with; a stale one is refused (409), never merged.
	version: z.preprocess(
		(v) => (v === '' || v === undefined || v === null ? undefined : Number(v)),
		z.number().int('Version must be a whole number.').positive().optional()
	),
	note: z.preprocess(
		(v) => (typeof v === 'string' ? (v.trim() === '' ? undefined : v.trim()) : v),
		z.string().max(500, 'Note must be at most 500 characters.').optional()
	)
});
export type MarkDone = z.infer<typeof markDoneSchema>;

/** Taking back a tick: which one (its id from the sheet). */
export const undoMarkSchema = z.object({ markId: wholeId('Tick') });

/** Extra addresses as typed: separated by commas, semicolons, spaces or new lines. */
export function splitAddresses(raw: string): string[] {
	return raw
		.split(/[\s,;]+/)
		.map((s) => s.trim())
		.filter(Boolean);
}

export const sendSheetsSchema = z
	.object({
		team: z.preprocess((v) => v === 'on' || v === 'true' || v === true, z.boolean()),
		extra: z.preprocess(
			(v) => (typeof v === 'string' ? splitAddresses(v) : (v ?? [])),
			z.array(email).max(50, 'At most 50 extra addresses at once.')
		)
	})
	.refine((v) => v.team || v.extra.length > 0, {
		message: 'Choose the crew or type at least one address.',
		path: ['extra']
	});
export type SendSheets = z.infer<typeof sendSheetsSchema>;
