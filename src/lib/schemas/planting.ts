// One schema per planting input, shared by the grid's cells (in the browser) and the JSON API.
import { z } from 'zod';
import type { Role } from '$lib/roles';
import { can } from '$lib/permissions';
import {
	fieldSpec,
	plantingFieldNames,
	plantingFieldTable,
	recordFields,
	type PlantingField,
	type PlantingValues,
	type RequiredField
} from '$lib/plantings/fields';

export { plantingStatuses, sowingMethods, plantingFieldNames, recordFields } from '$lib/plantings/fields';
export type { PlantingStatus, PlantingField, PlantingValues } from '$lib/plantings/fields';

type Table = typeof plantingFieldTable;

/** Each editable field by its API name, as one cell of the grid validates it (from the field table). */
export const plantingFields = Object.fromEntries(plantingFieldNames.map((f) => [f, fieldSpec(f).schema])) as {
	[K in PlantingField]: Table[K]['schema'];
};

/** recordFields in words, for messages. */
export const recordFieldsInWords = 'status, actual dates and notes';

/** The fields a role may edit (permissions.ts); the server enforces it, the grid greys the rest out. */
export function editableFields(role: Role): readonly PlantingField[] {
	if (can(role, 'plan.edit')) return plantingFieldNames;
	if (can(role, 'planting.record')) return recordFields;
	return [];
}

/** A new row: the fields without an initial value are required, the rest default (plantings/fields.ts). */
export const plantingCreateSchema = z
	.object(
		Object.fromEntries(
			plantingFieldNames.map((f) => [
				f,
				fieldSpec(f).initial === undefined ? plantingFields[f] : plantingFields[f].optional()
			])
		)
	)
	.strict() as unknown as z.ZodType<PlantingCreate>;
export type PlantingCreate = Pick<PlantingValues, RequiredField> & Partial<Omit<PlantingValues, RequiredField>>;

/** POST body: one row, or many (a paste); errors name `plantings.<row>.<field>`. */
export const plantingBatchSchema = z
	.object({
		plantings: z
			.array(plantingCreateSchema)
			.min(1, 'Send at least one planting.')
			.max(5000, 'At most 5000 plantings at once.')
	})
	.strict();

/** PATCH body: the version the edit was made on, and any editable fields. */
export const plantingPatchSchema = z
	.object({
		version: z
			.number({ error: 'version is required (the version your edit was made on).' })
			.int('version must be a whole number.')
			.positive('version must be positive.'),
		...Object.fromEntries(plantingFieldNames.map((f) => [f, plantingFields[f].optional()]))
	})
	.strict() as unknown as z.ZodType<{ version: number } & Partial<PlantingValues>>;
export type PlantingPatch = { version: number } & Partial<PlantingValues>;

export type CellCheck = { ok: true; value: unknown; note?: string } | { ok: false; message: string };

/** Validates one cell's typed or pasted text with the field's own schema. */
export function checkCell(field: PlantingField, raw: unknown): CellCheck {
	const r = plantingFields[field].safeParse(raw);
	return r.success
		? { ok: true, value: r.data }
		: { ok: false, message: r.error.issues[0]?.message ?? 'Invalid value.' };
}

/** Column widths (px) and hidden columns of the grid, kept per user. */
export const gridPrefsSchema = z
	.object({
		widths: z.record(
			z.string().regex(/^[a-zA-Z]{1,40}$/, 'column ids are letters'),
			z
				.number()
				.int('widths are whole pixels')
				.min(40, 'widths are at least 40 px')
				.max(800, 'widths are at most 800 px')
		),
		hidden: z.array(z.string().regex(/^[a-zA-Z]{1,40}$/, 'column ids are letters')).max(60)
	})
	.strict();
export type GridPrefs = z.infer<typeof gridPrefsSchema>;
