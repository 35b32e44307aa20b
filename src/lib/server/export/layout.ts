// The season workbook's layout: sheet names, column headers (units in the header), widths
// and cell kinds. The export writes it and the import reads it, so a workbook that leaves
// Furrowcast comes back in unchanged. Changing a header here changes both sides at once.

export type CellKind = 'text' | 'int' | 'number' | 'date' | 'money' | 'percent';

export interface ColumnSpec {
	key: string;
	header: string;
	/** Width in characters. Never exactly 9: exceljs takes 9 for its default and leaves the width out. */
	width: number;
	kind: CellKind;
	/** Written for people and left alone on import (derived figures). */
	derived?: boolean;
}

export interface SheetSpec {
	name: string;
	columns: readonly ColumnSpec[];
}

const col = (key: string, header: string, width: number, kind: CellKind, derived = false): ColumnSpec => ({
	key,
	header,
	width,
	kind,
	derived
});

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

export const plantingsSheet: SheetSpec = {
	name: 'Plantings',
	columns: [
		col('crop', 'Crop', 16, 'text'),
		col('variety', 'Variety', 22, 'text'),
		col('block', 'Block', 10, 'text', true),
		col('bed', 'Bed', 8, 'text'),
		col('startFt', 'Start (ft)', 10, 'number'),
		col('lengthFt', 'Length (ft)', 11, 'number'),
		col('rows', 'Rows', 7, 'int'),
		col('inRowSpacingIn', 'In-row spacing (in)', 18, 'number'),
		col('seedsPerSpot', 'Seeds per spot', 14, 'int'),
		col('method', 'Method', 11, 'text'),
		col('traySowDate', 'Tray sowing (date)', 17, 'date'),
		col('fieldDate', 'Field date', 12, 'date'),
		col('fieldWeek', 'Field week (ISO)', 15, 'text', true),
		col('firstHarvest', 'First harvest (date)', 18, 'date'),
		col('lastHarvest', 'Last harvest (date)', 18, 'date'),
		col('expectedYield', 'Expected yield', 14, 'number'),
		col('harvestUnit', 'Yield unit', 10, 'text', true),
		col('seedsNeeded', 'Seeds needed (seeds)', 19, 'int'),
		col('status', 'Status', 12, 'text'),
		col('actualTraySowDate', 'Actual tray sowing (date)', 22, 'date'),
		col('actualFieldDate', 'Actual field date', 16, 'date'),
		col('actualFirstHarvest', 'Actual first harvest (date)', 24, 'date'),
		col('actualLastHarvest', 'Actual last harvest (date)', 24, 'date'),
		col('notes', 'Notes', 40, 'text'),
		// The planting's key: an import into the same season matches rows by it (blank = a new planting).
		col('id', 'Planting id', 12, 'int')
	]
};

export const seedOrderSheet: SheetSpec = {
	name: 'Seed order',
	columns: [
		col('crop', 'Crop', 16, 'text'),
		col('variety', 'Variety', 22, 'text'),
		col('method', 'Method', 11, 'text'),
		col('plantings', 'Plantings', 10, 'int'),
		col('bedFeet', 'Bed-feet (ft)', 13, 'number'),
		col('seeds', 'Seeds (seeds)', 14, 'int'),
		col('grams', 'Seed (g)', 10, 'number'),
		col('seedsPerPacket', 'Seeds per packet', 16, 'int'),
		col('packets', 'Packets', 10, 'int'),
		col('pricePerGram', 'Price ($/g)', 12, 'money'),
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
		col('startFt', 'Start (ft)', 10, 'number'),
		col('lengthFt', 'Length (ft)', 11, 'number'),
		col('date', 'Planned date', 13, 'date'),
		col('quantity', 'Quantity', 11, 'number'),
		col('unit', 'Unit', 8, 'text'),
		col('trays', 'Trays', 8, 'int'),
		col('grams', 'Seed (g)', 10, 'number')
	]
};

export const forecastSheet: SheetSpec = {
	name: 'Forecast',
	columns: [
		col('crop', 'Crop', 16, 'text'),
		col('unit', 'Unit', 8, 'text'),
		col('week', 'Week (ISO)', 11, 'text'),
		col('monday', 'Week starts (date)', 17, 'date'),
		col('supply', 'Planned harvest', 15, 'number'),
		col('demand', 'Demand', 10, 'number'),
		col('shortfall', 'Shortfall', 10, 'number'),
		col('surplus', 'Surplus', 10, 'number')
	]
};

export const cropsSheet: SheetSpec = {
	name: 'Crops & varieties',
	columns: [
		col('crop', 'Crop', 16, 'text'),
		col('family', 'Family', 16, 'text'),
		col('harvestUnit', 'Harvest unit', 12, 'text'),
		col('frostTolerance', 'Frost tolerance', 15, 'text'),
		col('heatLimitF', 'Heat limit (°F)', 14, 'number'),
		col('baseTempF', 'Base temperature (°F)', 20, 'number'),
		col('variety', 'Variety', 22, 'text'),
		col('method', 'Method', 11, 'text'),
		col('daysToMaturity', 'Days to maturity (d)', 19, 'int'),
		col('daysInTray', 'Days in tray (d)', 15, 'int'),
		col('harvestWindowDays', 'Harvest window (d)', 17, 'int'),
		col('yieldPerBedFoot', 'Yield per bed-foot (harvest units)', 30, 'number'),
		col('rows', 'Rows per bed', 12, 'int'),
		col('inRowSpacingIn', 'In-row spacing (in)', 18, 'number'),
		col('seedsPerSpot', 'Seeds per spot', 14, 'int'),
		col('germinationRate', 'Germination (%)', 15, 'percent'),
		col('seedsPerGram', 'Seeds per gram (seeds/g)', 22, 'number'),
		col('seedPrice', 'Seed price ($/g)', 15, 'money'),
		col('seedsPerPacket', 'Seeds per packet', 16, 'int'),
		col('cellsPerTray', 'Cells per tray', 14, 'int'),
		col('margin', 'Extra margin (%)', 15, 'percent'),
		col('gddToMaturity', 'Degree days to maturity (°F·d)', 28, 'int')
	]
};

export const bedsSheet: SheetSpec = {
	name: 'Beds',
	columns: [
		col('block', 'Block', 12, 'text'),
		col('blockPosition', 'Block order', 12, 'int'),
		col('bed', 'Bed', 10, 'text'),
		col('position', 'Walking order', 14, 'int'),
		col('lengthFt', 'Length (ft)', 11, 'number'),
		col('widthIn', 'Width (in)', 11, 'int')
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
