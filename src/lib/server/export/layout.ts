// The season workbook's layout: sheet names, column headers (units in the header), widths
// and cell kinds. The export writes it and the import reads it, so a workbook that leaves
// Furrowcast comes back in unchanged. Changing a header here changes both sides at once.
// A measured column names its unit in the header, in the farm's system: `header` is what an
// imperial farm's file says, `units.metric` a metric farm's; the import reads either.
import type { UnitSystem } from '$lib/format';
import type { Measure } from '$lib/format/file-units';
import { plantingColumns } from './planting-columns';
import type { Cell, Row } from './rows';

export type CellKind = 'text' | 'int' | 'number' | 'date' | 'money' | 'percent';

export interface ColumnSpec<K extends string = string> {
	key: K;
	header: string;
	/** Width in characters. Never exactly 9: exceljs takes 9 for its default and leaves the width out. */
	width: number;
	kind: CellKind;
	/** Written for people and left alone on import (derived figures). */
	derived?: boolean;
	units?: ColumnUnits;
}

/** A measured column: what it measures and how a metric farm's file heads it. */
export interface ColumnUnits {
	measure: Measure;
	/** The header of a metric farm's file (`header` is an imperial farm's). */
	metric: string;
	/** Decimals the database keeps: a value read back is rounded to them. */
	digits: number;
	/** Harvest measures: the key of the column that holds the row's harvest unit. */
	per?: string;
}

export interface SheetSpec<K extends string = string> {
	name: string;
	columns: readonly ColumnSpec<K>[];
}

/** A row of a sheet keyed by its columns' keys (rows.ts builds them); a column left out is an empty cell. */
export type RowOf<S extends SheetSpec> = Partial<Record<S['columns'][number]['key'], Cell>>;

/** A keyed row as its sheet's cells in column order, what the writer takes; a column left out is empty. */
export function cellsOf<S extends SheetSpec>(spec: S, row: RowOf<S>): Row {
	const cells = row as Record<string, Cell | undefined>;
	return spec.columns.map((c) => cells[c.key] ?? null);
}

const col = <K extends string>(
	key: K,
	header: string,
	width: number,
	kind: CellKind,
	derived = false,
	units?: ColumnUnits
): ColumnSpec<K> => ({ key, header, width, kind, derived, ...(units ? { units } : {}) });

/** A measured column: `header` on an imperial farm, `metric` on a metric one. */
const measured = <K extends string>(
	key: K,
	header: string,
	metric: string,
	width: number,
	kind: CellKind,
	measure: Measure,
	digits: number,
	opts: { derived?: boolean; per?: string } = {}
): ColumnSpec<K> => col(key, header, width, kind, opts.derived ?? false, { measure, metric, digits, per: opts.per });

/** The unit a header names for a measure, on an imperial farm and on a metric one. */
const headerUnits: Partial<Record<Measure, [imperial: string, metric: string]>> = {
	length: ['ft', 'm'],
	spacing: ['in', 'cm'],
	temp: ['°F', '°C'],
	degreeDays: ['°F·d', '°C·d'],
	seedWeight: ['oz', 'g'],
	pricePerSeedWeight: ['$/oz', '$/g']
};

/** A measured column headed "label (unit)", the unit in the farm's system. */
const inUnits = <K extends string>(
	key: K,
	label: string,
	width: number,
	kind: CellKind,
	measure: keyof typeof headerUnits,
	digits: number
): ColumnSpec<K> => {
	const [imperial, metric] = headerUnits[measure]!;
	return measured(key, `${label} (${imperial})`, `${label} (${metric})`, width, kind, measure, digits);
};

/** A harvest quantity in the row's unit (the `unit` column): a weight converts, a count does not. */
const harvest = <K extends string>(key: K, header: string, width: number): ColumnSpec<K> =>
	measured(key, header, header, width, 'number', 'harvest', 2, { per: 'unit' });

const sheet = <K extends string>(name: string, columns: readonly ColumnSpec<K>[]): SheetSpec<K> => ({ name, columns });

// Columns several sheets hold, made once so that their header, width and kind agree.
const crop = col('crop', 'Crop', 16, 'text');
const variety = col('variety', 'Variety', 22, 'text');
const method = col('method', 'Method', 11, 'text');
const week = col('week', 'Week (ISO)', 11, 'text');
const monday = col('monday', 'Week starts (date)', 17, 'date');
const unit = measured('unit', 'Unit', 'Unit', 8, 'text', 'harvestUnit', 0);
const seedWeight = inUnits('grams', 'Seed', 10, 'number', 'seedWeight', 2);
const seedsPerPacket = col('seedsPerPacket', 'Seeds per packet', 16, 'int');
const trays = col('trays', 'Trays', 8, 'int');
const length = inUnits('lengthFt', 'Length', 11, 'number', 'length', 1);

/**
 * The header a file of a `system` farm writes for this column; money is named by the farm's
 * currency code when it is not US dollars ("Cost (EUR)", "Seed price (EUR/g)").
 */
export function headerIn(c: ColumnSpec, system: UnitSystem, currency = 'USD'): string {
	const h = system === 'metric' && c.units ? c.units.metric : c.header;
	return currency === 'USD' ? h : h.replace('($', `(${currency}`);
}

/** A header with its currency as the layout writes it ("Cost (EUR)" → "Cost ($)"), for matching on import. */
export function dollarHeader(header: string): string {
	return header.replace(/\((?:[A-Z]{3}|[^\w\s()/%]{1,3})(?=[/)])/, '($');
}

/** The money cell format in `currency` (ISO 4217): its symbol before the figure, its decimals. */
export function moneyFormat(currency: string): string {
	if (currency === 'USD') return numberFormats.money!;
	try {
		const f = new Intl.NumberFormat('en-US', { style: 'currency', currency });
		const symbol = f.formatToParts(1).find((p) => p.type === 'currency')?.value ?? currency;
		const digits = f.resolvedOptions().maximumFractionDigits ?? 2;
		return `"${symbol.replace(/"/g, '')}"#,##0${digits > 0 ? '.' + '0'.repeat(digits) : ''}`;
	} catch {
		return numberFormats.money!;
	}
}

/**
 * The cell format of a column in a `system` farm's file: converted lengths and widths keep
 * decimals (76.2 cm), small ounces of seed three.
 */
export function numberFormatIn(c: ColumnSpec, system: UnitSystem, currency = 'USD'): string | undefined {
	const m = c.units?.measure;
	if (m === 'seedWeight' && system === 'imperial') return '#,##0.000';
	if (c.kind === 'money') return moneyFormat(currency);
	if (m && system === 'metric' && c.kind === 'int' && m !== 'degreeDays') return numberFormats.number;
	return numberFormats[c.kind];
}

/** Excel number formats per kind. Dates are real dates with an ISO-like display. */
export const numberFormats: Record<CellKind, string | undefined> = {
	text: undefined,
	int: '#,##0',
	number: '#,##0.00',
	date: 'yyyy-mm-dd',
	money: '"$"#,##0.00',
	percent: '0.0%'
};

export const seasonSheet = sheet('Season', [col('field', 'Field', 22, 'text'), col('value', 'Value', 36, 'text')]);

/** Rows of the Season sheet, by their label in the Field column. */
export const seasonFields = {
	name: 'Season name',
	year: 'Year',
	startsOn: 'Starts on',
	endsOn: 'Ends on',
	farm: 'Farm',
	exportedOn: 'Exported on'
} as const;

/** Built from the planting field table, column by column (planting-columns.ts). */
export const plantingsSheet: SheetSpec = { name: 'Plantings', columns: plantingColumns };

export const seedOrderSheet = sheet('Seed order', [
	crop,
	variety,
	method,
	col('plantings', 'Plantings', 10, 'int'),
	measured('bedFeet', 'Bed-feet (ft)', 'Bed-metres (m)', 13, 'number', 'length', 2),
	col('seeds', 'Seeds (seeds)', 14, 'int'),
	seedWeight,
	seedsPerPacket,
	col('packets', 'Packets', 10, 'int'),
	inUnits('pricePerGram', 'Price', 12, 'money', 'pricePerSeedWeight', 2),
	col('cost', 'Cost ($)', 12, 'money'),
	col('cells', 'Cells', 10, 'int'),
	trays
]);

export const tasksSheet = sheet('Weekly tasks', [
	week,
	monday,
	col('task', 'Task', 14, 'text'),
	crop,
	variety,
	col('block', 'Block', 10, 'text'),
	col('bed', 'Bed', 8, 'text'),
	inUnits('startFt', 'Start', 10, 'number', 'length', 1),
	length,
	col('date', 'Planned date', 13, 'date'),
	harvest('quantity', 'Quantity', 11),
	unit,
	trays,
	seedWeight
]);

export const forecastSheet = sheet('Forecast', [
	crop,
	unit,
	week,
	monday,
	harvest('supply', 'Planned harvest', 15),
	harvest('demand', 'Demand', 10),
	harvest('shortfall', 'Shortfall', 10),
	harvest('surplus', 'Surplus', 10)
]);

export const cropsSheet = sheet('Crops & varieties', [
	crop,
	col('family', 'Family', 16, 'text'),
	measured('harvestUnit', 'Harvest unit', 'Harvest unit', 12, 'text', 'harvestUnit', 0),
	col('frostTolerance', 'Frost tolerance', 15, 'text'),
	inUnits('heatLimitF', 'Heat limit', 14, 'number', 'temp', 1),
	inUnits('baseTempF', 'Base temperature', 20, 'number', 'temp', 1),
	variety,
	method,
	col('daysToMaturity', 'Days to maturity (d)', 19, 'int'),
	col('daysInTray', 'Days in tray (d)', 15, 'int'),
	col('harvestWindowDays', 'Harvest window (d)', 17, 'int'),
	measured(
		'yieldPerBedFoot',
		'Yield per bed-foot (harvest units)',
		'Yield per bed-metre (harvest units)',
		30,
		'number',
		'harvestPerLength',
		3,
		{ per: 'harvestUnit' }
	),
	col('rows', 'Rows per bed', 12, 'int'),
	inUnits('inRowSpacingIn', 'In-row spacing', 18, 'number', 'spacing', 2),
	col('seedsPerSpot', 'Seeds per spot', 14, 'int'),
	col('germinationRate', 'Germination (%)', 15, 'percent'),
	measured('seedsPerGram', 'Seeds per ounce (seeds/oz)', 'Seeds per gram (seeds/g)', 22, 'number', 'seedsPerWeight', 2),
	inUnits('seedPrice', 'Seed price', 15, 'money', 'pricePerSeedWeight', 2),
	seedsPerPacket,
	col('cellsPerTray', 'Cells per tray', 14, 'int'),
	col('margin', 'Extra margin (%)', 15, 'percent'),
	inUnits('gddToMaturity', 'Degree days to maturity', 28, 'int', 'degreeDays', 0),
	// The crop's field dates (month-day, both or neither): the earliest and latest day of the year it
	// may be sown or set out. Text, so no spreadsheet takes "10-01" for a date of one year.
	col('sowFrom', 'Earliest field date (MM-DD)', 16, 'text'),
	col('sowTo', 'Latest field date (MM-DD)', 16, 'text')
]);

export const bedsSheet = sheet('Beds', [
	col('block', 'Block', 12, 'text'),
	col('blockPosition', 'Block order', 12, 'int'),
	col('bed', 'Bed', 10, 'text'),
	col('position', 'Walking order', 14, 'int'),
	length,
	inUnits('widthIn', 'Width', 11, 'int', 'spacing', 0)
]);

/** Sheets in the order the workbook holds them. */
export const workbookSheets: readonly SheetSpec[] = [
	seasonSheet,
	plantingsSheet,
	seedOrderSheet,
	tasksSheet,
	forecastSheet,
	cropsSheet,
	bedsSheet
];

/** The sheets an import reads (the rest are reports, recomputed from the plan). */
export const importSheets: readonly SheetSpec[] = [seasonSheet, cropsSheet, bedsSheet, plantingsSheet];

/** A column's letter (1 → A, 27 → AA), for naming a cell in an error. */
export function columnLetter(n: number): string {
	let s = '';
	for (let i = n; i > 0; i = Math.floor((i - 1) / 26)) s = String.fromCharCode(65 + ((i - 1) % 26)) + s;
	return s;
}
