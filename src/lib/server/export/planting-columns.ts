// The season workbook's Plantings sheet, column by column, built from the planting field table
// (plantings/table.ts): every field with a `file` column, in the table's order, and around them
// the columns that are not fields: the names a reference is written as (crop, variety, block,
// bed), the figures the engine works out, the field week and the yield's unit, and last the
// planting's id. Each column says how a planting gives its cell, so a row is built by column,
// never by position; the import reads the same columns back by header (schemas/import.ts).
import { isoWeekOfDay } from '$lib/planning/iso-week';
import { toDayNumber } from '$lib/planning/day-number';
import {
	fieldSpec,
	plantingFieldNames,
	plantingFigureTable,
	type FieldKind,
	type FileColumn,
	type PlantingFigure,
	type StoredPlanting
} from '$lib/plantings/fields';
import type { CellKind, ColumnSpec } from './layout';
import type { Cell } from './rows';

/** A planting as the sheet writes it: its fields and figures, with the names joined in. */
export interface SheetPlanting extends StoredPlanting {
	id: number;
	crop: string;
	variety: string;
	block: string | null;
	bed: string | null;
	harvestUnit: string;
}

export interface PlantingColumn extends ColumnSpec {
	value(p: SheetPlanting): Cell;
}

const cellKinds: Record<FieldKind, CellKind> = {
	ref: 'int',
	number: 'number',
	int: 'int',
	enum: 'text',
	text: 'text',
	date: 'date'
};

function fromFile(key: string, file: FileColumn, kind: FieldKind, value: PlantingColumn['value']): PlantingColumn {
	const { header, width, units } = file;
	return { key, header, width, kind: cellKinds[kind], derived: false, ...(units ? { units } : {}), value };
}

const shown = (key: string, header: string, width: number, value: PlantingColumn['value']): PlantingColumn => ({
	key,
	header,
	width,
	kind: 'text',
	derived: true,
	value
});

const figure = (f: PlantingFigure): PlantingColumn => {
	const spec = plantingFigureTable[f];
	return fromFile(f, spec.file, spec.kind, (p) => p[f]);
};

/** Columns that are not fields, each after the column `after` names (null: the sheet's first ones). */
const others: { after: string | null; column: PlantingColumn }[] = [
	{ after: null, column: { ...shown('crop', 'Crop', 16, (p) => p.crop), derived: false } },
	{ after: null, column: { ...shown('variety', 'Variety', 22, (p) => p.variety), derived: false } },
	{ after: null, column: shown('block', 'Block', 10, (p) => p.block) },
	{ after: null, column: { ...shown('bed', 'Bed', 8, (p) => p.bed), derived: false } },
	{ after: 'method', column: figure('traySowDate') },
	{
		after: 'fieldDate',
		column: shown('fieldWeek', 'Field week (ISO)', 15, (p) => isoWeekOfDay(toDayNumber(p.fieldDate)))
	},
	{ after: 'fieldWeek', column: figure('firstHarvest') },
	{ after: 'firstHarvest', column: figure('lastHarvest') },
	{ after: 'lastHarvest', column: figure('expectedYield') },
	{
		after: 'expectedYield',
		column: {
			...shown('harvestUnit', 'Yield unit', 10, (p) => p.harvestUnit),
			units: { measure: 'harvestUnit', metric: 'Yield unit', digits: 0 }
		}
	},
	{ after: 'harvestUnit', column: figure('seedsNeeded') }
];

/** The planting's key: an import into the same season matches rows by it (blank = a new planting). */
const idColumn: PlantingColumn = {
	key: 'id',
	header: 'Planting id',
	width: 12,
	kind: 'int',
	derived: false,
	value: (p) => p.id
};

function build(): PlantingColumn[] {
	const out: PlantingColumn[] = [];
	const after = (key: string | null): void => {
		for (const o of others)
			if (o.after === key) {
				out.push(o.column);
				after(o.column.key);
			}
	};
	after(null);
	for (const f of plantingFieldNames) {
		const spec = fieldSpec(f);
		if (!spec.file) continue;
		out.push(fromFile(f, spec.file, spec.kind, (p) => p[f] as Cell));
		after(f);
	}
	out.push(idColumn);
	return out;
}

export const plantingColumns: readonly PlantingColumn[] = build();

/** One planting's row of the sheet. */
export const plantingCells = (p: SheetPlanting): Cell[] => plantingColumns.map((c) => c.value(p));

/** A column's name in a message or a preview: its header without a unit that never converts ("(date)"). */
export const columnLabel = (header: string): string => header.replace(/ \((?:date|seeds)\)$/, '');
