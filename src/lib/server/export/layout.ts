// The season workbook's layout: sheet names, column headers (units in the header), widths
// and cell kinds. The export writes it and the import reads it, so a workbook that leaves
// Furrowcast comes back in unchanged. Changing a header here changes both sides at once.
// A measured column names its unit in the header, in the farm's system: `header` is what an
// imperial farm's file says, `units.metric` a metric farm's; the import reads either.
import type { UnitSystem } from '$lib/format';
import type { Measure } from '$lib/format/file-units';
import { plantingColumns } from './planting-columns';

export type CellKind = 'text' | 'int' | 'number' | 'date' | 'money' | 'percent';

export interface ColumnSpec {
	key: string;
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

export interface SheetSpec {
	name: string;
	columns: readonly ColumnSpec[];
}

const col = (
	key: string,
	header: string,
	width: number,
	kind: CellKind,
	derived = false,
	units?: ColumnUnits
): ColumnSpec => ({ key, header, width, kind, derived, ...(units ? { units } : {}) });

/** A measured column: `header` on an imperial farm, `metric` on a metric one. */
const measured = (
	key: string,
	header: string,
	metric: string,
	width: number,
	kind: CellKind,
	measure: Measure,
	digits: number,
	opts: { derived?: boolean; per?: string } = {}
): ColumnSpec => col(key, header, width, kind, opts.derived ?? false, { measure, metric, digits, per: opts.per });

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

export const seasonSheet: SheetSpec = {
	name: 'Season',
	columns: [col('field', 'Field', 22, 'text'), col('value', 'Value', 36, 'text')]
};

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

export const seedOrderSheet: SheetSpec = {
	name: 'Seed order',
	columns: [
		col('crop', 'Crop', 16, 'text'),
		col('variety', 'Variety', 22, 'text'),
		col('method', 'Method', 11, 'text'),
		col('plantings', 'Plantings', 10, 'int'),
		measured('bedFeet', 'Bed-feet (ft)', 'Bed-metres (m)', 13, 'number', 'length', 2),
		col('seeds', 'Seeds (seeds)', 14, 'int'),
		measured('grams', 'Seed (oz)', 'Seed (g)', 10, 'number', 'seedWeight', 2),
		col('seedsPerPacket', 'Seeds per packet', 16, 'int'),
		col('packets', 'Packets', 10, 'int'),
		measured('pricePerGram', 'Price ($/oz)', 'Price ($/g)', 12, 'money', 'pricePerSeedWeight', 2),
		col('cost', 'Cost ($)', 12, 'money'),
		col('cells', 'Cells', 10, 'int'),
		col('trays', 'Trays', 8, 'int')
	]
};

export const tasksSheet: SheetSpec = {
	name: 'Weekly tasks',
	columns: [
		col('week', 'Week (ISO)', 11, 'text'),
		col('monday', 'Week starts (date)', 17, 'date'),
		col('task', 'Task', 14, 'text'),
		col('crop', 'Crop', 16, 'text'),
		col('variety', 'Variety', 22, 'text'),
		col('block', 'Block', 10, 'text'),
		col('bed', 'Bed', 8, 'text'),
		measured('startFt', 'Start (ft)', 'Start (m)', 10, 'number', 'length', 1),
		measured('lengthFt', 'Length (ft)', 'Length (m)', 11, 'number', 'length', 1),
		col('date', 'Planned date', 13, 'date'),
		measured('quantity', 'Quantity', 'Quantity', 11, 'number', 'harvest', 2, { per: 'unit' }),
		measured('unit', 'Unit', 'Unit', 8, 'text', 'harvestUnit', 0),
		col('trays', 'Trays', 8, 'int'),
		measured('grams', 'Seed (oz)', 'Seed (g)', 10, 'number', 'seedWeight', 2)
	]
};

export const forecastSheet: SheetSpec = {
	name: 'Forecast',
	columns: [
		col('crop', 'Crop', 16, 'text'),
		measured('unit', 'Unit', 'Unit', 8, 'text', 'harvestUnit', 0),
		col('week', 'Week (ISO)', 11, 'text'),
		col('monday', 'Week starts (date)', 17, 'date'),
		measured('supply', 'Planned harvest', 'Planned harvest', 15, 'number', 'harvest', 2, { per: 'unit' }),
		measured('demand', 'Demand', 'Demand', 10, 'number', 'harvest', 2, { per: 'unit' }),
		measured('shortfall', 'Shortfall', 'Shortfall', 10, 'number', 'harvest', 2, { per: 'unit' }),
		measured('surplus', 'Surplus', 'Surplus', 10, 'number', 'harvest', 2, { per: 'unit' })
	]
};

export const cropsSheet: SheetSpec = {
	name: 'Crops & varieties',
	columns: [
		col('crop', 'Crop', 16, 'text'),
		col('family', 'Family', 16, 'text'),
		measured('harvestUnit', 'Harvest unit', 'Harvest unit', 12, 'text', 'harvestUnit', 0),
		col('frostTolerance', 'Frost tolerance', 15, 'text'),
		measured('heatLimitF', 'Heat limit (°F)', 'Heat limit (°C)', 14, 'number', 'temp', 1),
		measured('baseTempF', 'Base temperature (°F)', 'Base temperature (°C)', 20, 'number', 'temp', 1),
		col('variety', 'Variety', 22, 'text'),
		col('method', 'Method', 11, 'text'),
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
		measured('inRowSpacingIn', 'In-row spacing (in)', 'In-row spacing (cm)', 18, 'number', 'spacing', 2),
		col('seedsPerSpot', 'Seeds per spot', 14, 'int'),
		col('germinationRate', 'Germination (%)', 15, 'percent'),
		measured(
			'seedsPerGram',
			'Seeds per ounce (seeds/oz)',
			'Seeds per gram (seeds/g)',
			22,
			'number',
			'seedsPerWeight',
			2
		),
		measured('seedPrice', 'Seed price ($/oz)', 'Seed price ($/g)', 15, 'money', 'pricePerSeedWeight', 2),
		col('seedsPerPacket', 'Seeds per packet', 16, 'int'),
		col('cellsPerTray', 'Cells per tray', 14, 'int'),
		col('margin', 'Extra margin (%)', 15, 'percent'),
		measured(
			'gddToMaturity',
			'Degree days to maturity (°F·d)',
			'Degree days to maturity (°C·d)',
			28,
			'int',
			'degreeDays',
			0
		),
		// The crop's field dates (month-day, both or neither): the earliest and latest day of the year it
		// may be sown or set out. Text, so no spreadsheet takes "10-01" for a date of one year.
		col('sowFrom', 'Earliest field date (MM-DD)', 16, 'text'),
		col('sowTo', 'Latest field date (MM-DD)', 16, 'text')
	]
};

export const bedsSheet: SheetSpec = {
	name: 'Beds',
	columns: [
		col('block', 'Block', 12, 'text'),
		col('blockPosition', 'Block order', 12, 'int'),
		col('bed', 'Bed', 10, 'text'),
		col('position', 'Walking order', 14, 'int'),
		measured('lengthFt', 'Length (ft)', 'Length (m)', 11, 'number', 'length', 1),
		measured('widthIn', 'Width (in)', 'Width (cm)', 11, 'int', 'spacing', 0)
	]
};

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
