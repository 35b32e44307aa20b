// One schema per row of an imported sheet, and one for the upload's own fields. A cell comes
// as exceljs reads it (number, string, Date) or as CSV text; each schema takes both, so a
// workbook saved by any spreadsheet program and a hand-made CSV pass the same checks.
import { z } from 'zod';
import { isoDate, monthDaySchema, moneyCents, numberField, plainText } from './common';
import { sowingMethods } from './planting';
import { fieldSpec, fileFieldNames, type FieldKind, type FileField, type PlantingValues } from '$lib/plantings/fields';

/** Upload limit: a season of several thousand plantings is well under 1 MB as .xlsx. */
export const IMPORT_MAX_BYTES = 5 * 1024 * 1024;

export const importableSheets = ['Crops & varieties', 'Beds', 'Plantings'] as const;
export type ImportableSheet = (typeof importableSheets)[number];

/** The upload's fields besides the file: which season receives plantings, what a CSV holds. */
export const importOptionsSchema = z
	.object({
		seasonId: z.preprocess(
			(v) => (v === '' || v === null ? undefined : v),
			numberField('Season', 1, 2 ** 31 - 1, { int: true }).optional()
		),
		sheet: z.preprocess(
			(v) => (v === '' || v === null ? undefined : v),
			z.enum(importableSheets, { error: `Sheet must be one of ${importableSheets.join(', ')}.` }).optional()
		)
	})
	.strict();
export type ImportOptions = z.infer<typeof importOptionsSchema>;

const blank = (v: unknown): boolean => v === null || v === undefined || (typeof v === 'string' && v.trim() === '');
const orUndefined = (v: unknown): unknown => (blank(v) ? undefined : v);

const text = (label: string, max: number) =>
	z.preprocess((v) => (typeof v === 'number' ? String(v) : v), plainText(label, max));
const optionalText = (label: string, max: number) =>
	z.preprocess((v) => (blank(v) ? null : typeof v === 'number' ? String(v) : v), plainText(label, max).nullable());

/** Case and spacing do not matter in a choice cell: "Direct", " direct " and "DIRECT" agree. */
const choice = <T extends readonly [string, ...string[]]>(label: string, options: T) =>
	z.preprocess(
		(v) => (typeof v === 'string' ? v.trim().toLowerCase() : v),
		z.enum(options, { error: `${label} must be one of ${options.join(', ')}.` })
	);

const required = (label: string, min: number, max: number, opts: { int?: boolean } = {}) =>
	z.preprocess(orUndefined, numberField(label, min, max, opts));
const optional = (label: string, min: number, max: number, opts: { int?: boolean } = {}) =>
	z.preprocess((v) => (blank(v) ? null : v), numberField(label, min, max, opts).nullable());
const withDefault = (label: string, min: number, max: number, fallback: number, opts: { int?: boolean } = {}) =>
	z.preprocess((v) => (blank(v) ? fallback : v), numberField(label, min, max, opts));

/** Excel's day 25569 is 1970-01-01 (its 1900 date system). */
const EXCEL_EPOCH_DAYS = 25569;

/** A date cell: a real date, an Excel day number, or 'YYYY-MM-DD' text. */
function dateValue(v: unknown): unknown {
	if (v instanceof Date) return Number.isNaN(v.getTime()) ? 'invalid' : v.toISOString().slice(0, 10);
	if (typeof v === 'number' && v > 20_000 && v < 80_000)
		return new Date(Math.round((v - EXCEL_EPOCH_DAYS) * 86_400_000)).toISOString().slice(0, 10);
	return typeof v === 'string' ? v.trim() : v;
}
const date = (label: string) => z.preprocess(dateValue, isoDate(label));
const optionalDate = (label: string) =>
	z.preprocess((v) => (blank(v) ? null : dateValue(v)), isoDate(label).nullable());

/** A rate: 0.85 as a number (a cell formatted as percent holds that), or "85%" / "85 %" as text. */
function rateValue(v: unknown): unknown {
	if (typeof v !== 'string') return v;
	const t = v.trim();
	return t.endsWith('%') ? Number(t.slice(0, -1).trim().replace(',', '.')) / 100 : t;
}
const rate = (label: string, min: number, fallback?: number) =>
	z.preprocess(
		(v) => (blank(v) ? fallback : rateValue(v)),
		numberField(`${label} (a fraction such as 0.85, or 85%)`, min, 1)
	);

/** Money in dollars ("$0.90", "0.90" or 0.9) to whole cents, as the database keeps it. */
const cents = (label: string) => z.preprocess((v) => (blank(v) ? '0' : v), moneyCents(label, 10_000));

export const harvestUnits = ['lb', 'bunch', 'head', 'each'] as const;

/** MM-DD of a date: a spreadsheet that took "10-01" for a date keeps only its month and day. */
function monthDayValue(v: unknown): unknown {
	const d = dateValue(v);
	if (typeof d === 'string' && /^\d{4}-\d{2}-\d{2}$/.test(d)) return d.slice(5);
	return d;
}
/**
 * A crop's field date: MM-DD, blank for none. A file without the column leaves it undefined, so
 * an older workbook keeps the crop's field dates as they are.
 */
const fieldDate = (label: string) =>
	z.preprocess(
		(v) => (v === undefined ? undefined : blank(v) ? null : monthDayValue(v)),
		monthDaySchema(label).nullable().optional()
	);

export const cropRowSchema = z.object({
	crop: text('Crop', 80),
	family: text('Family', 40),
	harvestUnit: choice('Harvest unit', harvestUnits),
	frostTolerance: choice('Frost tolerance', ['tender', 'hardy'] as const),
	heatLimitF: optional('Heat limit', -40, 130),
	baseTempF: withDefault('Base temperature', 0, 80, 40),
	sowFrom: fieldDate('Earliest field date'),
	sowTo: fieldDate('Latest field date')
});

export const varietyRowSchema = z.object({
	variety: text('Variety', 80),
	method: choice('Method', sowingMethods),
	daysToMaturity: required('Days to maturity', 1, 400, { int: true }),
	daysInTray: withDefault('Days in tray', 0, 200, 0, { int: true }),
	harvestWindowDays: required('Harvest window', 1, 365, { int: true }),
	yieldPerBedFoot: required('Yield per bed-foot', 0, 100_000),
	rows: required('Rows per bed', 1, 50, { int: true }),
	inRowSpacingIn: required('In-row spacing', 0.1, 240),
	seedsPerSpot: withDefault('Seeds per spot', 1, 50, 1, { int: true }),
	germinationRate: rate('Germination', 0.01),
	seedsPerGram: required('Seeds per gram', 0.01, 10_000_000),
	seedPrice: cents('Seed price'),
	seedsPerPacket: optional('Seeds per packet', 1, 10_000_000, { int: true }),
	cellsPerTray: withDefault('Cells per tray', 1, 2000, 128, { int: true }),
	margin: rate('Extra margin', 0, 0.1),
	gddToMaturity: optional('Degree days to maturity', 1, 20_000, { int: true })
});

export const bedRowSchema = z.object({
	block: text('Block', 60),
	blockPosition: z.preprocess(
		(v) => (blank(v) ? null : v),
		numberField('Block order', 0, 10_000, { int: true }).nullable()
	),
	bed: text('Bed', 60),
	position: withDefault('Walking order', 0, 100_000, 0, { int: true }),
	lengthFt: required('Length', 0.5, 10_000),
	widthIn: withDefault('Width', 1, 1_000, 30, { int: true })
});

/** A field's cell as the file gives it (exceljs' value, or CSV text), in the form its schema reads. */
function fieldCell(kind: FieldKind, v: unknown): unknown {
	if (kind === 'date') return dateValue(v);
	// Case and spacing do not matter in a choice cell, as in `choice` above.
	if (kind === 'enum') return typeof v === 'string' ? v.trim().toLowerCase() : v;
	if (kind === 'text') return typeof v === 'number' ? String(v) : v;
	return v;
}

/**
 * Each field's cell on the Plantings sheet, from the field table: the field's own schema (or its
 * file's), a blank cell taking the file's blank value or the field's initial value (none: required).
 */
const fieldCells = Object.fromEntries(
	fileFieldNames.map((f) => {
		const spec = fieldSpec(f);
		const blankAs =
			spec.file?.blank !== undefined ? spec.file.blank : typeof spec.initial === 'function' ? undefined : spec.initial;
		return [f, z.preprocess((v) => (blank(v) ? blankAs : fieldCell(spec.kind, v)), spec.file?.schema ?? spec.schema)];
	})
) as unknown as { [K in FileField]: z.ZodType<PlantingValues[K]> };

export const plantingRowSchema = z.object({
	crop: text('Crop', 80),
	variety: text('Variety', 80),
	bed: optionalText('Bed', 60),
	...fieldCells,
	// The engine's figures: worked out again from the row's fields on import (as a grid edit is), so a
	// new row may leave them blank.
	traySowDate: optionalDate('Tray sowing'),
	firstHarvest: optionalDate('First harvest'),
	lastHarvest: optionalDate('Last harvest'),
	expectedYield: withDefault('Expected yield', 0, 1_000_000_000, 0),
	seedsNeeded: withDefault('Seeds needed', 0, 2 ** 31 - 1, 0, { int: true }),
	id: optional('Planting id', 1, 2 ** 31 - 1, { int: true })
});

export const seasonRowsSchema = z.object({
	name: text('Season name', 80),
	year: required('Year', 2000, 2100, { int: true }),
	startsOn: date('Starts on'),
	endsOn: date('Ends on')
});

export type CropRow = z.infer<typeof cropRowSchema>;
export type VarietyRow = z.infer<typeof varietyRowSchema>;
export type BedRow = z.infer<typeof bedRowSchema>;
export type PlantingRow = z.infer<typeof plantingRowSchema>;
export type SeasonRows = z.infer<typeof seasonRowsSchema>;

/** One refused cell (or row, or sheet), as the import lists it. */
export interface ImportIssue {
	sheet: string;
	/** Row number as the spreadsheet shows it (the header is row 1); null for the whole sheet. */
	row: number | null;
	/** Column letter and header; null when the issue is the row's or the file's. */
	column: string | null;
	header: string | null;
	message: string;
}

export function describeIssue(i: ImportIssue): string {
	const at = [
		i.sheet,
		i.row !== null ? `row ${i.row}` : null,
		i.column ? `column ${i.column}${i.header ? ` (${i.header})` : ''}` : null
	]
		.filter(Boolean)
		.join(', ');
	return `${at}: ${i.message}`;
}
