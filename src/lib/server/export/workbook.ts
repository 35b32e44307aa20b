// Writes the season workbook with exceljs' streaming writer: each row is committed as soon as
// it is written, so a large season flows out to the response instead of piling up in memory.
import ExcelJS from 'exceljs';
import type { Writable } from 'node:stream';
import type { UnitSystem } from '$lib/format';
import {
	bedsSheet,
	cropsSheet,
	forecastSheet,
	headerIn,
	numberFormatIn,
	numberFormats,
	plantingsSheet,
	seasonSheet,
	seedOrderSheet,
	tasksSheet,
	type SheetSpec,
	columnLetter
} from './layout';
import { excelDate, type Cell, type SheetRows } from './rows';
import { rowsIn } from './units';

const sheetOrder: [SheetSpec, keyof SheetRows][] = [
	[seasonSheet, 'season'],
	[plantingsSheet, 'plantings'],
	[seedOrderSheet, 'seedOrder'],
	[tasksSheet, 'tasks'],
	[forecastSheet, 'forecast'],
	[cropsSheet, 'crops'],
	[bedsSheet, 'beds']
];

const isoDate = /^\d{4}-\d{2}-\d{2}$/;

/** Text for a printed page's header: "&" starts a code there, so a literal one is doubled. */
const headerText = (s: string): string => s.replace(/&/g, '&&');

/** A defined name as the workbook part writes it (exceljs' own list cannot scope a name to a sheet). */
interface SheetName {
	name: string;
	localSheetId: number;
	ranges: string[];
}

export async function writeWorkbook(
	rows: SheetRows,
	stream: Writable,
	titles: { farm: string; season: string },
	system: UnitSystem = 'imperial',
	currency = 'USD'
): Promise<void> {
	const wb = new ExcelJS.stream.xlsx.WorkbookWriter({ stream, useStyles: true, useSharedStrings: false });
	wb.creator = 'Furrowcast';
	wb.created = new Date();
	// Each sheet's autofilter also needs its hidden "_xlnm._FilterDatabase" name, scoped to the
	// sheet: spreadsheet programs that find the filter without it drop the filter buttons on save.
	const filterNames: SheetName[] = [];
	Object.defineProperty((wb as unknown as { _definedNames: object })._definedNames, 'model', {
		get: () => filterNames
	});
	for (const [index, [spec, key]] of sheetOrder.entries()) {
		const ws = wb.addWorksheet(spec.name, {
			views: [{ state: 'frozen', xSplit: 0, ySplit: 1, topLeftCell: 'A2' }],
			// Printed: landscape, as wide as one page and as long as it takes, the header row on every
			// page, and each page headed with the farm, the season and the sheet (&A), numbered below.
			pageSetup: {
				orientation: 'landscape',
				fitToPage: true,
				fitToWidth: 1,
				fitToHeight: 0,
				printTitlesRow: '1:1',
				margins: { left: 0.4, right: 0.4, top: 0.6, bottom: 0.5, header: 0.3, footer: 0.3 }
			},
			headerFooter: {
				oddHeader: `&L${headerText(titles.farm)}&C${headerText(titles.season)}&R&A`,
				oddFooter: '&CPage &P of &N'
			}
		});
		ws.columns = spec.columns.map((c) => ({ key: c.key, width: c.width }));
		// One style object per column, shared by all its cells: exceljs caches a style's id by
		// object identity, so a shared object costs one lookup per column, not one per cell
		// (at tens of thousands of rows that is most of the writing time).
		const styles = spec.columns.map((c) => {
			const numFmt = numberFormatIn(c, system, currency);
			return numFmt ? { numFmt } : {};
		});
		const dateStyle = { numFmt: numberFormats.date };
		const dateCols = spec.columns.map((c) => c.kind === 'date');
		const header = ws.addRow(spec.columns.map((c) => headerIn(c, system, currency)));
		const bold = { font: { bold: true } };
		header.eachCell((cell) => (cell.style = bold));
		header.commit();
		// Worked out in the database's units; written in the farm's.
		const data = rowsIn(spec, rows[key], system);
		for (const r of data) {
			// An empty cell is left out (undefined) rather than written as a null cell.
			const values: (Cell | undefined)[] = r.map((v, i) =>
				v === null ? undefined : dateCols[i] && typeof v === 'string' && isoDate.test(v) ? excelDate(v) : v
			);
			const row = ws.addRow(values);
			// Mixed columns (the Season sheet's values) get a date format where a date stands.
			row.eachCell((cell, n) => (cell.style = values[n - 1] instanceof Date ? dateStyle : styles[n - 1]));
			row.commit();
		}
		const last = Math.max(2, data.length + 1);
		ws.autoFilter = { from: { row: 1, column: 1 }, to: { row: last, column: spec.columns.length } };
		const range = `'${spec.name.replace(/'/g, "''")}'!$A$1:$${columnLetter(spec.columns.length)}$${last}`;
		filterNames.push({ name: '_xlnm._FilterDatabase', localSheetId: index, ranges: [range] });
		ws.commit();
	}
	await wb.commit();
}
