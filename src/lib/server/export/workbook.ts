// Writes the season workbook with exceljs' streaming writer: each row is committed as soon as
// it is written, so a large season flows out to the response instead of piling up in memory.
import ExcelJS from 'exceljs';
import type { Writable } from 'node:stream';
import { bedsSheet, cropsSheet, forecastSheet, numberFormats, plantingsSheet, seasonSheet, seedOrderSheet, tasksSheet, type SheetSpec } from './layout';
import { excelDate, type Cell, type SheetRows } from './rows';

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

export async function writeWorkbook(rows: SheetRows, stream: Writable): Promise<void> {
	const wb = new ExcelJS.stream.xlsx.WorkbookWriter({ stream, useStyles: true, useSharedStrings: false });
	wb.creator = 'Furrowcast';
	wb.created = new Date();
	for (const [spec, key] of sheetOrder) {
		const ws = wb.addWorksheet(spec.name, { views: [{ state: 'frozen', xSplit: 0, ySplit: 1, topLeftCell: 'A2' }] });
		ws.columns = spec.columns.map((c) => ({ key: c.key, width: c.width }));
		// One style object per column, shared by all its cells: exceljs caches a style's id by
		// object identity, so a shared object costs one lookup per column, not one per cell
		// (at tens of thousands of rows that is most of the writing time).
		const styles = spec.columns.map((c) => (numberFormats[c.kind] ? { numFmt: numberFormats[c.kind] } : {}));
		const dateStyle = { numFmt: numberFormats.date };
		const dateCols = spec.columns.map((c) => c.kind === 'date');
		const header = ws.addRow(spec.columns.map((c) => c.header));
		const bold = { font: { bold: true } };
		header.eachCell((cell) => (cell.style = bold));
		header.commit();
		const data = rows[key];
		for (const r of data) {
			// An empty cell is left out (undefined) rather than written as a null cell.
			const values: (Cell | undefined)[] = r.map((v, i) => (v === null ? undefined : dateCols[i] && typeof v === 'string' && isoDate.test(v) ? excelDate(v) : v));
			const row = ws.addRow(values);
			// Mixed columns (the Season sheet's values) get a date format where a date stands.
			row.eachCell((cell, n) => (cell.style = values[n - 1] instanceof Date ? dateStyle : styles[n - 1]));
			row.commit();
		}
		ws.autoFilter = { from: { row: 1, column: 1 }, to: { row: 1, column: spec.columns.length } };
		ws.commit();
	}
	await wb.commit();
}
