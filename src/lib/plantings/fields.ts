// A planting's stored, editable fields in one table. Everything that reads or writes a planting
// field by field is built from it: the cell and API schemas (schemas/planting.ts), the database
// mapping (server/plantings.ts), the grid's row values and plain columns (components/grid), the
// defaults of a new row, and what next season's copy keeps (server/season-copy.ts).
// Adding a field: a migration for its column, one entry here, and tests. See DEVELOPERS.md.
import { z } from 'zod';
import { isoDate, numberField } from '$lib/schemas/common';
import type { VarietyView } from '$lib/types';

export const plantingStatuses = ['planned', 'sown', 'transplanted', 'harvesting', 'finished', 'failed'] as const;
export const sowingMethods = ['direct', 'transplant'] as const;
export type PlantingStatus = (typeof plantingStatuses)[number];

const optionalDate = (label: string) =>
	z.preprocess(
		(v) => (v === '' || v === undefined ? null : typeof v === 'string' ? v.trim() : v),
		isoDate(label).nullable()
	);

const notes = z.preprocess(
	(v) => (typeof v === 'string' ? (v.trim() === '' ? null : v.trim()) : v),
	z.string({ error: 'Notes must be text.' }).max(2000, 'Notes must be at most 2000 characters.').nullable()
);

/** How a field is typed, stored and shown. */
export type FieldKind = 'ref' | 'number' | 'int' | 'enum' | 'date' | 'text';

export interface PlantingFieldSpec<S extends z.ZodType = z.ZodType> {
	/** Column of the plantings table. */
	column: string;
	/** One cell's check, in the browser and on the server alike. */
	schema: S;
	kind: FieldKind;
	/** Who edits it: 'plan' = the plan.edit permission only; 'record' = also planting.record (permissions.ts). */
	edit: 'plan' | 'record';
	/**
	 * Next season's copy: 'keep' the value, 'clear' it back to `blank`, or 'moved' (the copy works it
	 * out itself: the bed and start foot are placed again, the field date shifts by a year, notes drop
	 * a stale "Not placed" reason).
	 */
	nextSeason: 'keep' | 'clear' | 'moved';
	/** The value of a new row that does not give it; a function reads the variety. Absent: required. */
	initial?: string | number | null | ((v: VarietyView | undefined) => string | number | null);
	/** Stored as DECIMAL (mysql2 answers a string): read back with Number(). */
	decimal?: boolean;
	/**
	 * The grid's plain column: id (kept in users' saved widths), label, width in px and, for numbers,
	 * the unit shown after the figure. Absent: the grid draws the field with a column of its own.
	 */
	grid?: { id: string; label: string; width: number; unit?: string };
}

const id = numberField;

/** Every stored, editable field by its API name, in the grid's and the API's order. */
export const plantingFieldTable = {
	varietyId: {
		column: 'variety_id',
		schema: id('Variety', 1, 2 ** 31 - 1, { int: true }),
		kind: 'ref',
		edit: 'plan',
		nextSeason: 'keep'
	},
	bedId: {
		column: 'bed_id',
		schema: z.preprocess((v) => (v === '' ? null : v), id('Bed', 1, 2 ** 31 - 1, { int: true }).nullable()),
		kind: 'ref',
		edit: 'plan',
		nextSeason: 'moved',
		initial: null
	},
	startFt: {
		column: 'start_ft',
		schema: numberField('Start', 0, 10_000),
		kind: 'number',
		edit: 'plan',
		nextSeason: 'moved',
		initial: 0,
		decimal: true,
		grid: { id: 'startFt', label: 'Start', width: 70, unit: 'ft' }
	},
	lengthFt: {
		column: 'length_ft',
		schema: numberField('Bed-feet', 0.5, 10_000),
		kind: 'number',
		edit: 'plan',
		nextSeason: 'keep',
		decimal: true,
		grid: { id: 'lengthFt', label: 'Bed-feet', width: 80, unit: 'ft' }
	},
	rows: {
		column: 'rows',
		schema: numberField('Rows', 1, 50, { int: true }),
		kind: 'int',
		edit: 'plan',
		nextSeason: 'keep',
		initial: (v) => v?.rows ?? 1,
		grid: { id: 'rows', label: 'Rows', width: 64, unit: 'rows' }
	},
	inRowSpacingIn: {
		column: 'in_row_spacing_in',
		schema: numberField('In-row spacing', 0.1, 240),
		kind: 'number',
		edit: 'plan',
		nextSeason: 'keep',
		initial: (v) => v?.inRowSpacingIn ?? 6,
		decimal: true,
		grid: { id: 'spacing', label: 'Spacing', width: 72, unit: 'in' }
	},
	seedsPerSpot: {
		column: 'seeds_per_spot',
		schema: numberField('Seeds per spot', 1, 50, { int: true }),
		kind: 'int',
		edit: 'plan',
		nextSeason: 'keep',
		initial: (v) => v?.seedsPerSpot ?? 1,
		grid: { id: 'seedsPerSpot', label: 'Seeds/spot', width: 80, unit: 'seeds' }
	},
	method: {
		column: 'method',
		schema: z.enum(sowingMethods, { error: 'Method must be direct or transplant.' }),
		kind: 'enum',
		edit: 'plan',
		nextSeason: 'keep',
		initial: (v) => v?.method ?? 'direct'
	},
	fieldDate: {
		column: 'field_date',
		schema: z.preprocess((v) => (typeof v === 'string' ? v.trim() : v), isoDate('Field date')),
		kind: 'date',
		edit: 'plan',
		nextSeason: 'moved'
	},
	status: {
		column: 'status',
		schema: z.enum(plantingStatuses, { error: `Status must be one of ${plantingStatuses.join(', ')}.` }),
		kind: 'enum',
		edit: 'record',
		nextSeason: 'clear',
		initial: 'planned'
	},
	actualTraySowDate: {
		column: 'actual_tray_sow_date',
		schema: optionalDate('Actual tray sowing'),
		kind: 'date',
		edit: 'record',
		nextSeason: 'clear',
		initial: null,
		grid: { id: 'actualTraySow', label: 'Sown in tray', width: 130 }
	},
	actualFieldDate: {
		column: 'actual_field_date',
		schema: optionalDate('Actual field date'),
		kind: 'date',
		edit: 'record',
		nextSeason: 'clear',
		initial: null,
		grid: { id: 'actualField', label: 'In field', width: 130 }
	},
	actualFirstHarvest: {
		column: 'actual_first_harvest',
		schema: optionalDate('Actual first harvest'),
		kind: 'date',
		edit: 'record',
		nextSeason: 'clear',
		initial: null,
		grid: { id: 'actualFirst', label: 'Harvest began', width: 130 }
	},
	actualLastHarvest: {
		column: 'actual_last_harvest',
		schema: optionalDate('Actual last harvest'),
		kind: 'date',
		edit: 'record',
		nextSeason: 'clear',
		initial: null,
		grid: { id: 'actualLast', label: 'Harvest ended', width: 130 }
	},
	notes: {
		column: 'notes',
		schema: notes,
		kind: 'text',
		edit: 'record',
		nextSeason: 'moved',
		initial: null,
		grid: { id: 'notes', label: 'Notes', width: 200 }
	}
} as const satisfies Record<string, PlantingFieldSpec>;

type Table = typeof plantingFieldTable;
export type PlantingField = keyof Table;
export type PlantingValues = { [K in PlantingField]: z.infer<Table[K]['schema']> };
/** Fields a new row must give (no initial value). */
export type RequiredField = { [K in PlantingField]: Table[K] extends { initial: unknown } ? never : K }[PlantingField];

export const plantingFieldNames = Object.keys(plantingFieldTable) as PlantingField[];

/** The field's entry, typed loosely for code that walks every field. */
export function fieldSpec(f: PlantingField): PlantingFieldSpec {
	return plantingFieldTable[f] as PlantingFieldSpec;
}

/** The fields the 'planting.record' permission may change: the record of what happened, never the plan. */
export const recordFields: readonly PlantingField[] = plantingFieldNames.filter((f) => fieldSpec(f).edit === 'record');

/** The value a new row takes for `f` when none is given (undefined: the field is required). */
export function initialValue(f: PlantingField, v: VarietyView | undefined): unknown {
	const init = fieldSpec(f).initial;
	return typeof init === 'function' ? (init as (v: VarietyView | undefined) => unknown)(v) : init;
}

/** Stored values as the table's columns. */
export function toColumns(values: Partial<PlantingValues>): Record<string, unknown> {
	const out: Record<string, unknown> = {};
	for (const f of plantingFieldNames) if (f in values) out[fieldSpec(f).column] = values[f];
	return out;
}

/** A stored row's editable values (decimals read back as numbers). */
export function fromColumns(row: Record<string, unknown>): PlantingValues {
	const out: Record<string, unknown> = {};
	for (const f of plantingFieldNames) {
		const s = fieldSpec(f);
		const raw = row[s.column];
		out[f] = s.decimal && raw !== null && raw !== undefined ? Number(raw) : (raw ?? null);
	}
	return out as PlantingValues;
}

/** Next season's copy of a stored row: 'keep' fields copied, 'clear' ones back to their initial value. */
export function nextSeasonColumns(row: Record<string, unknown>): Record<string, unknown> {
	const values = fromColumns(row);
	const out: Partial<Record<PlantingField, unknown>> = {};
	for (const f of plantingFieldNames) {
		const rule = fieldSpec(f).nextSeason;
		if (rule === 'keep') out[f] = values[f];
		else if (rule === 'clear') out[f] = initialValue(f, undefined);
	}
	return toColumns(out as Partial<PlantingValues>);
}
