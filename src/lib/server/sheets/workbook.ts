// The week's crew sheets as an .xlsx (exceljs): one worksheet per task kind, header row frozen,
// units in the headers, dates as real dates and numbers as numbers, with empty Done / Actual date
// / Notes columns to fill in by hand.
import ExcelJS from 'exceljs';
import type { SheetRow, SheetSection, WeekSheet } from './week';
import { formatQuantity, lengthUnit, seedWeightUnit, spacingUnit, type UnitSystem } from '$lib/format';
import { toFileValue, type Measure } from '$lib/format/file-units';

interface Column {
	header: string;
	width: number;
	value: (r: SheetRow, group: string) => string | number | Date | null;
	/** Excel number format, e.g. '0.00' or 'yyyy-mm-dd'. */
	format?: string;
	/** Left blank to write in by hand: ruled, so the lines print. */
	fillIn?: boolean;
}

/** A calendar date as a UTC-midnight Date, which Excel stores as a whole-day serial. */
function excelDate(d: string | undefined): Date | null {
	return d ? new Date(`${d}T00:00:00Z`) : null;
}

/** The sheets' columns in the farm's units: lengths in ft or m, spacing in in or cm, seed in oz or g. */
function sheetColumns(system: UnitSystem): Record<SheetSection['kind'], Column[]> {
	const ft = lengthUnit(system);
	// Figures as every file writes them in the farm's units (file-units.ts).
	const inFile = (measure: Measure, value: number, unit?: string | null) => toFileValue(measure, value, system, unit);
	const metric = system === 'metric';
	const where: Column[] = [
		{ header: 'Block · bed', width: 18, value: (_r, g) => g },
		{
			header: `From (${ft})`,
			width: 10,
			value: (r) => inFile('length', r.startFt),
			format: metric ? '0.0#' : '0.#'
		},
		{ header: `To (${ft})`, width: 10, value: (r) => inFile('length', r.endFt), format: metric ? '0.0#' : '0.#' }
	];
	const crop: Column[] = [
		{ header: 'Crop', width: 16, value: (r) => r.crop },
		{ header: 'Variety', width: 20, value: (r) => r.variety }
	];
	const fillIn: Column[] = [
		{ header: 'Done (✓)', width: 9, value: () => null, fillIn: true },
		{
			header: 'Actual date',
			width: 13,
			value: (r) => excelDate(r.doneOn ?? undefined),
			format: 'yyyy-mm-dd',
			fillIn: true
		},
		{ header: 'Notes', width: 30, value: () => null, fillIn: true }
	];
	const planned = (label: string): Column => ({
		header: label,
		width: 13,
		value: (r) => excelDate(r.date),
		format: 'yyyy-mm-dd'
	});
	const seed: Column = {
		header: `Seed (${seedWeightUnit(system)})`,
		width: 10,
		value: (r) => (r.seed ? inFile('seedWeight', r.seed.grams) : null),
		format: metric ? '#,##0.00' : '#,##0.000'
	};
	const spacing: Column = {
		header: `In-row spacing (${spacingUnit(system)})`,
		width: 17,
		value: (r) => inFile('spacing', r.inRowSpacingIn),
		format: '0.##'
	};
	return {
		tray_sow: [
			...crop,
			planned('Sow on'),
			{ header: 'Cells', width: 9, value: (r) => r.seed?.cells ?? null, format: '0' },
			{ header: 'Cells per tray', width: 13, value: (r) => r.cellsPerTray, format: '0' },
			{ header: 'Trays', width: 8, value: (r) => r.seed?.trays ?? null, format: '0' },
			{ header: 'Seeds per cell', width: 13, value: (r) => r.seedsPerSpot, format: '0' },
			seed,
			{ header: 'For bed', width: 16, value: (r) => (r.bed ? `${r.block} · ${r.bed}` : 'not placed') },
			...fillIn
		],
		direct_sow: [
			...where,
			...crop,
			planned('Sow on'),
			{ header: 'Rows', width: 7, value: (r) => r.rows, format: '0' },
			spacing,
			{ header: 'Seeds per spot', width: 13, value: (r) => r.seedsPerSpot, format: '0' },
			{ header: 'Seeds', width: 10, value: (r) => r.seed?.seeds ?? null, format: '#,##0' },
			seed,
			...fillIn
		],
		transplant: [
			...where,
			...crop,
			planned('Transplant on'),
			{ header: 'Plants', width: 9, value: (r) => r.seed?.plants ?? null, format: '#,##0' },
			{ header: 'Rows', width: 7, value: (r) => r.rows, format: '0' },
			spacing,
			...fillIn
		],
		harvest: [
			...where,
			...crop,
			{
				header: 'Expected this week',
				width: 17,
				value: (r) => (r.weekQuantity === undefined ? null : inFile('harvest', r.weekQuantity, r.unit)),
				format: '#,##0.0'
			},
			// Counts keep their word ("bunch"); a weight is named in the farm's unit.
			{ header: 'Unit', width: 8, value: (r) => toFileValue('harvestUnit', r.unit ?? null, system) },
			{
				header: 'For (share size or channel)',
				width: 40,
				value: (r) =>
					(r.demand ?? []).map((d) => `${d.for}: ${formatQuantity(d.quantity, d.unit, system)}`).join('; ') ||
					'no demand listed'
			},
			{ header: 'Window ends', width: 13, value: (r) => excelDate(r.lastHarvest), format: 'yyyy-mm-dd' },
			{ header: 'Picked (qty)', width: 12, value: () => null, fillIn: true },
			...fillIn
		]
	};
}

const ruled: Partial<ExcelJS.Borders> = {
	top: { style: 'thin' },
	bottom: { style: 'thin' },
	left: { style: 'thin' },
	right: { style: 'thin' }
};
/** "&" starts a code in a printed page header: a literal one is doubled. */
const headerText = (s: string): string => s.replace(/&/g, '&&');

/**
 * Builds the .xlsx of a week's sheets; `title` goes in the workbook's properties. Printed, each
 * page is headed with the task kind, the week and the farm, the header row repeats, and the
 * fill-in columns are ruled. A kind with no tasks gets no sheet (the first sheet says so).
 */
export async function weekWorkbook(sheet: WeekSheet, title: string, farmName = ''): Promise<Buffer> {
	const wb = new ExcelJS.Workbook();
	wb.creator = 'Furrowcast';
	wb.title = title;
	wb.created = new Date();
	const empty = sheet.sections.filter((s) => s.count === 0).map((s) => s.title);
	const busy = sheet.sections.filter((s) => s.count > 0);
	const columns = sheetColumns(sheet.unitSystem ?? 'imperial');
	for (const section of busy.length ? busy : sheet.sections.slice(0, 1)) {
		const cols = columns[section.kind];
		const ws = wb.addWorksheet(section.title, {
			views: [{ state: 'frozen', ySplit: 1 }],
			pageSetup: { orientation: 'landscape', fitToPage: true, fitToWidth: 1, fitToHeight: 0, printTitlesRow: '1:1' },
			headerFooter: {
				oddHeader: `&L&B${headerText(section.title)}&B · ${sheet.week}&C${headerText(farmName)}&R${sheet.monday} to ${sheet.sunday}`,
				oddFooter: `&L${headerText(section.title)} · ${sheet.week}&RPage &P of &N`
			}
		});
		ws.columns = cols.map((c, i) => ({
			header: c.header,
			key: `c${i}`,
			width: c.width,
			style: c.format ? { numFmt: c.format } : {}
		}));
		ws.getRow(1).font = { bold: true };
		for (const group of section.groups) {
			for (const r of group.rows) {
				const row = ws.addRow(cols.map((c) => c.value(r, group.label)));
				cols.forEach((c, i) => {
					if (c.fillIn) row.getCell(i + 1).border = ruled;
				});
				row.height = 20;
			}
		}
		// The first page says which kinds have nothing this week (they get no sheet).
		if (section === busy[0] && empty.length) {
			ws.headerFooter.oddFooter = `&L${headerText(`Nothing this week for ${empty.join(', ')}: no sheet for ${empty.length === 1 ? 'it' : 'them'}.`)}&RPage &P of &N`;
		}
	}
	return Buffer.from(await wb.xlsx.writeBuffer());
}
