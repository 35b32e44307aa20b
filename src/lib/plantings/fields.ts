// Helpers over the planting field table (plantings/table.ts): a stored row to values and back,
// a new row's defaults, the crew lead's fields, and what next season's copy keeps.
import type { z } from 'zod';
import type { VarietyView } from '$lib/types';
import { plantingFigureTable, plantingFieldTable, type PlantingFieldSpec } from './table';

export * from './table';
export { pick } from '$lib/pick';

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

type Figures = typeof plantingFigureTable;
export type PlantingFigure = keyof Figures;
/** The figures the engine works out and the database stores (tray sowing, harvest dates, yield, seed). */
export interface PlantingFigures {
	traySowDate: string | null;
	firstHarvest: string;
	lastHarvest: string;
	expectedYield: number;
	seedsNeeded: number;
}
export const plantingFigureNames = Object.keys(plantingFigureTable) as PlantingFigure[];
/** A stored planting: its fields and its figures. */
export type StoredPlanting = PlantingValues & PlantingFigures;

/** Every stored column of a planting's fields and figures, for a SELECT (`p.` before each). */
export const storedColumnNames: readonly string[] = [
	...plantingFieldNames.map((f) => fieldSpec(f).column),
	...plantingFigureNames.map((f) => plantingFigureTable[f].column)
];

/** The plantings table's column of a field or a figure. */
export function storedColumn(f: PlantingField | PlantingFigure): string {
	return f in plantingFigureTable
		? plantingFigureTable[f as PlantingFigure].column
		: fieldSpec(f as PlantingField).column;
}

/** Stored values as the table's columns. */
export function toColumns(values: Partial<PlantingValues>): Record<string, unknown> {
	const out: Record<string, unknown> = {};
	for (const f of plantingFieldNames) if (f in values) out[fieldSpec(f).column] = values[f];
	return out;
}

function readColumns(
	row: Record<string, unknown>,
	specs: [string, { column: string; decimal?: boolean }][],
	out: Record<string, unknown> = {}
): Record<string, unknown> {
	for (const [f, s] of specs) {
		const raw = row[s.column];
		out[f] = s.decimal && raw !== null && raw !== undefined ? Number(raw) : (raw ?? null);
	}
	return out;
}

/** A stored row's editable values (decimals read back as numbers). */
export function fromColumns(row: Record<string, unknown>): PlantingValues {
	return readColumns(row, Object.entries(plantingFieldTable)) as PlantingValues;
}

/** A stored row's fields and figures. */
export function fromStored(row: Record<string, unknown>): StoredPlanting {
	return readColumns(row, Object.entries(plantingFigureTable), { ...fromColumns(row) }) as unknown as StoredPlanting;
}

/** Figures as the table's columns. */
export function figureColumns(figures: PlantingFigures): Record<string, unknown> {
	return Object.fromEntries(plantingFigureNames.map((f) => [plantingFigureTable[f].column, figures[f]]));
}

/** A planting's fields and figures as the table's columns. */
export function toStored(p: StoredPlanting): Record<string, unknown> {
	return { ...toColumns(p), ...figureColumns(p) };
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

/** The stored figures of what the engine worked out for a planting (derivePlanting, a plan's proposal). */
export function figuresOf(d: {
	traySowDate: string | null;
	firstHarvest: string;
	lastHarvest: string;
	expectedYield: number;
	seed: { seeds: number };
}): PlantingFigures {
	return {
		traySowDate: d.traySowDate,
		firstHarvest: d.firstHarvest,
		lastHarvest: d.lastHarvest,
		expectedYield: d.expectedYield,
		seedsNeeded: d.seed.seeds
	};
}

/** The fields the workbook's Plantings sheet holds a column of (all but the variety and bed references). */
export type FileField = { [K in PlantingField]: Table[K] extends { file: unknown } ? K : never }[PlantingField];
export const fileFieldNames = plantingFieldNames.filter((f) => fieldSpec(f).file) as FileField[];
