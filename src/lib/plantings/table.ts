// A planting's stored, editable fields in one table: the only list of them in the code. Everything
// that reads or writes a planting field by field is built from it (plantings/fields.ts has the
// helpers): the cell and API schemas (schemas/planting.ts), the database mapping and the grid's
// JSON answer (server/plantings.ts, server/plantings-json.ts), the grid's row values and plain
// columns (components/grid), a new row's defaults, the season workbook's Plantings sheet and its
// import (server/export/planting-columns.ts, schemas/import.ts) and next season's copy.
// Adding a field: a migration for its column, one entry here, and tests. See DEVELOPERS.md.
import { z } from 'zod';
import { isoDate, numberField } from '$lib/schemas/common';
import type { Measure } from '$lib/format/file-units';
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

/** A field's column on the season workbook's Plantings sheet (exported, and read back on import). */
export interface FileColumn {
	/** The header an imperial farm's file writes; a measured column names its unit in it. */
	header: string;
	/** Width in characters. Never exactly 9: exceljs takes 9 for its default and leaves the width out. */
	width: number;
	/** A measured column: what it measures, a metric farm's header, the decimals the database keeps. */
	units?: { measure: Measure; metric: string; digits: number; per?: string };
	/** The import's check of a cell, where it differs from `schema` (another label, say). */
	schema?: z.ZodType;
	/** What a blank cell imports as, where it is not the field's `initial` value. */
	blank?: string | number | null;
}

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
	/**
	 * The field's column on the workbook's Plantings sheet. Absent on the two references (variety,
	 * bed): the file names them ("Crop", "Variety", "Bed") and the import looks the names up.
	 */
	file?: FileColumn;
}

const id = numberField;

/**
 * A date the crew records of what happened (the actual dates): blank until then, edited with the
 * 'record' permission, cleared for next season, a 130 px grid column, and a file column headed with
 * its label and, unless the label says so already, "(date)".
 */
const actualDate = (column: string, label: string, [id, gridLabel]: [string, string], fileWidth: number) =>
	({
		column,
		schema: optionalDate(label),
		kind: 'date',
		edit: 'record',
		nextSeason: 'clear',
		initial: null,
		grid: { id, label: gridLabel, width: 130 },
		file: { header: / date$/.test(label) ? label : `${label} (date)`, width: fileWidth }
	}) as const;

/**
 * A figure a new planting takes from its variety (`fallback` without one): edited in the plan and
 * kept by next season's copy.
 */
const fromVariety = <const T extends Omit<PlantingFieldSpec, 'edit' | 'nextSeason' | 'initial'>>(
	figure: 'rows' | 'inRowSpacingIn' | 'seedsPerSpot' | 'method',
	fallback: string | number,
	spec: T
) => ({
	...spec,
	edit: 'plan' as const,
	nextSeason: 'keep' as const,
	initial: (v: VarietyView | undefined) => v?.[figure] ?? fallback
});

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
		grid: { id: 'startFt', label: 'Start', width: 70, unit: 'ft' },
		file: { header: 'Start (ft)', width: 10, units: { measure: 'length', metric: 'Start (m)', digits: 1 } }
	},
	lengthFt: {
		column: 'length_ft',
		schema: numberField('Bed-feet', 0.5, 10_000),
		kind: 'number',
		edit: 'plan',
		nextSeason: 'keep',
		decimal: true,
		grid: { id: 'lengthFt', label: 'Bed-feet', width: 80, unit: 'ft' },
		file: {
			header: 'Length (ft)',
			width: 11,
			units: { measure: 'length', metric: 'Length (m)', digits: 1 },
			schema: numberField('Length', 0.5, 10_000)
		}
	},
	rows: fromVariety('rows', 1, {
		column: 'rows',
		schema: numberField('Rows', 1, 50, { int: true }),
		kind: 'int',
		grid: { id: 'rows', label: 'Rows', width: 64, unit: 'rows' },
		file: { header: 'Rows', width: 7 }
	}),
	inRowSpacingIn: fromVariety('inRowSpacingIn', 6, {
		column: 'in_row_spacing_in',
		schema: numberField('In-row spacing', 0.1, 240),
		kind: 'number',
		decimal: true,
		grid: { id: 'spacing', label: 'Spacing', width: 72, unit: 'in' },
		file: {
			header: 'In-row spacing (in)',
			width: 18,
			units: { measure: 'spacing', metric: 'In-row spacing (cm)', digits: 2 }
		}
	}),
	seedsPerSpot: fromVariety('seedsPerSpot', 1, {
		column: 'seeds_per_spot',
		schema: numberField('Seeds per spot', 1, 50, { int: true }),
		kind: 'int',
		grid: { id: 'seedsPerSpot', label: 'Seeds/spot', width: 80, unit: 'seeds' },
		file: { header: 'Seeds per spot', width: 14, blank: 1 }
	}),
	method: fromVariety('method', 'direct', {
		column: 'method',
		schema: z.enum(sowingMethods, { error: 'Method must be direct or transplant.' }),
		kind: 'enum',
		file: { header: 'Method', width: 11 }
	}),
	fieldDate: {
		column: 'field_date',
		schema: z.preprocess((v) => (typeof v === 'string' ? v.trim() : v), isoDate('Field date')),
		kind: 'date',
		edit: 'plan',
		nextSeason: 'moved',
		file: { header: 'Field date', width: 12 }
	},
	status: {
		column: 'status',
		schema: z.enum(plantingStatuses, { error: `Status must be one of ${plantingStatuses.join(', ')}.` }),
		kind: 'enum',
		edit: 'record',
		nextSeason: 'clear',
		initial: 'planned',
		file: { header: 'Status', width: 12 }
	},
	actualTraySowDate: actualDate('actual_tray_sow_date', 'Actual tray sowing', ['actualTraySow', 'Sown in tray'], 22),
	actualFieldDate: actualDate('actual_field_date', 'Actual field date', ['actualField', 'In field'], 16),
	actualFirstHarvest: actualDate('actual_first_harvest', 'Actual first harvest', ['actualFirst', 'Harvest began'], 24),
	actualLastHarvest: actualDate('actual_last_harvest', 'Actual last harvest', ['actualLast', 'Harvest ended'], 24),
	notes: {
		column: 'notes',
		schema: notes,
		kind: 'text',
		edit: 'record',
		nextSeason: 'moved',
		initial: null,
		grid: { id: 'notes', label: 'Notes', width: 200 },
		file: { header: 'Notes', width: 40 }
	}
} as const satisfies Record<string, PlantingFieldSpec>;

/** A figure the engine works out from the fields on every save, stored beside them. */
export interface PlantingFigureSpec {
	column: string;
	kind: 'number' | 'int' | 'date';
	decimal?: boolean;
	file: FileColumn;
}

/** The stored figures (plantings/derive.ts works them out), by their API name. */
export const plantingFigureTable = {
	traySowDate: { column: 'tray_sow_date', kind: 'date', file: { header: 'Tray sowing (date)', width: 17 } },
	firstHarvest: { column: 'first_harvest', kind: 'date', file: { header: 'First harvest (date)', width: 18 } },
	lastHarvest: { column: 'last_harvest', kind: 'date', file: { header: 'Last harvest (date)', width: 18 } },
	expectedYield: {
		column: 'expected_yield',
		kind: 'number',
		decimal: true,
		file: {
			header: 'Expected yield',
			width: 14,
			units: { measure: 'harvest', metric: 'Expected yield', digits: 2, per: 'harvestUnit' }
		}
	},
	seedsNeeded: { column: 'seeds_needed', kind: 'int', file: { header: 'Seeds needed (seeds)', width: 19 } }
} as const satisfies Record<string, PlantingFigureSpec>;
