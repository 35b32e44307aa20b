// One schema per planting input, shared by the grid's cells (in the browser) and the JSON API.
import { z } from 'zod';
import type { Role } from '$lib/roles';
import { can } from '$lib/permissions';
import { isoDate, numberField } from './common';

export const plantingStatuses = ['planned', 'sown', 'transplanted', 'harvesting', 'finished', 'failed'] as const;
export const sowingMethods = ['direct', 'transplant'] as const;
export type PlantingStatus = (typeof plantingStatuses)[number];

const optionalDate = (label: string) =>
	z.preprocess((v) => (v === '' || v === undefined ? null : typeof v === 'string' ? v.trim() : v), isoDate(label).nullable());

const notes = z.preprocess(
	(v) => (typeof v === 'string' ? (v.trim() === '' ? null : v.trim()) : v),
	z.string({ error: 'Notes must be text.' }).max(2000, 'Notes must be at most 2000 characters.').nullable()
);

/** Each editable field by its API name, as one cell of the grid validates it. */
export const plantingFields = {
	varietyId: numberField('Variety', 1, 2 ** 31 - 1, { int: true }),
	bedId: z.preprocess((v) => (v === '' ? null : v), numberField('Bed', 1, 2 ** 31 - 1, { int: true }).nullable()),
	startFt: numberField('Start', 0, 10_000),
	lengthFt: numberField('Bed-feet', 0.5, 10_000),
	rows: numberField('Rows', 1, 50, { int: true }),
	inRowSpacingIn: numberField('In-row spacing', 0.1, 240),
	seedsPerSpot: numberField('Seeds per spot', 1, 50, { int: true }),
	method: z.enum(sowingMethods, { error: 'Method must be direct or transplant.' }),
	fieldDate: z.preprocess((v) => (typeof v === 'string' ? v.trim() : v), isoDate('Field date')),
	status: z.enum(plantingStatuses, { error: `Status must be one of ${plantingStatuses.join(', ')}.` }),
	actualTraySowDate: optionalDate('Actual tray sowing'),
	actualFieldDate: optionalDate('Actual field date'),
	actualFirstHarvest: optionalDate('Actual first harvest'),
	actualLastHarvest: optionalDate('Actual last harvest'),
	notes
} as const;

export type PlantingField = keyof typeof plantingFields;
export const plantingFieldNames = Object.keys(plantingFields) as PlantingField[];

/** The record of what happened, never the plan itself: what the 'planting.record' permission may change. */
export const recordFields: readonly PlantingField[] = ['status', 'actualTraySowDate', 'actualFieldDate', 'actualFirstHarvest', 'actualLastHarvest', 'notes'];
/** recordFields in words, for messages. */
export const recordFieldsInWords = 'status, actual dates and notes';

/** The fields a role may edit (permissions.ts); the server enforces it, the grid greys the rest out. */
export function editableFields(role: Role): readonly PlantingField[] {
	if (can(role, 'plan.edit')) return plantingFieldNames;
	if (can(role, 'planting.record')) return recordFields;
	return [];
}

export type PlantingValues = { [K in PlantingField]: z.infer<(typeof plantingFields)[K]> };

/** A new row: a variety, a field date and bed-feet; the rest defaults from the variety. */
export const plantingCreateSchema = z
	.object({
		...plantingFields,
		varietyId: plantingFields.varietyId,
		fieldDate: plantingFields.fieldDate,
		lengthFt: plantingFields.lengthFt,
		bedId: plantingFields.bedId.optional(),
		startFt: plantingFields.startFt.optional(),
		rows: plantingFields.rows.optional(),
		inRowSpacingIn: plantingFields.inRowSpacingIn.optional(),
		seedsPerSpot: plantingFields.seedsPerSpot.optional(),
		method: plantingFields.method.optional(),
		status: plantingFields.status.optional(),
		actualTraySowDate: plantingFields.actualTraySowDate.optional(),
		actualFieldDate: plantingFields.actualFieldDate.optional(),
		actualFirstHarvest: plantingFields.actualFirstHarvest.optional(),
		actualLastHarvest: plantingFields.actualLastHarvest.optional(),
		notes: plantingFields.notes.optional()
	})
	.strict();
export type PlantingCreate = z.infer<typeof plantingCreateSchema>;

/** POST body: one row, or many (a paste); errors name `plantings.<row>.<field>`. */
export const plantingBatchSchema = z
	.object({ plantings: z.array(plantingCreateSchema).min(1, 'Send at least one planting.').max(5000, 'At most 5000 plantings at once.') })
	.strict();

/** PATCH body: the version the edit was made on, and any editable fields. */
export const plantingPatchSchema = z
	.object({
		version: z.number({ error: 'version is required (the version your edit was made on).' }).int('version must be a whole number.').positive('version must be positive.'),
		...Object.fromEntries(plantingFieldNames.map((f) => [f, plantingFields[f].optional()]))
	})
	.strict() as unknown as z.ZodType<{ version: number } & Partial<PlantingValues>>;
export type PlantingPatch = { version: number } & Partial<PlantingValues>;

export type CellCheck = { ok: true; value: unknown; note?: string } | { ok: false; message: string };

/** Validates one cell's typed or pasted text with the field's own schema. */
export function checkCell(field: PlantingField, raw: unknown): CellCheck {
	const r = plantingFields[field].safeParse(raw);
	return r.success ? { ok: true, value: r.data } : { ok: false, message: r.error.issues[0]?.message ?? 'Invalid value.' };
}

/** Column widths (px) and hidden columns of the grid, kept per user. */
export const gridPrefsSchema = z
	.object({
		widths: z.record(z.string().regex(/^[a-zA-Z]{1,40}$/, 'column ids are letters'), z.number().int('widths are whole pixels').min(40, 'widths are at least 40 px').max(800, 'widths are at most 800 px')),
		hidden: z.array(z.string().regex(/^[a-zA-Z]{1,40}$/, 'column ids are letters')).max(60)
	})
	.strict();
export type GridPrefs = z.infer<typeof gridPrefsSchema>;
