// Reads an uploaded .xlsx (exceljs) or .csv (papaparse) into plain rows keyed by our column
// keys, matched by header text. Nothing is validated here beyond the layout itself: which
// sheets and columns are present.
import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import type { ImportIssue, ImportableSheet } from '$lib/schemas/import';
import { bedsSheet, columnLetter, cropsSheet, plantingsSheet, seasonSheet, type SheetSpec } from '../export/layout';

export interface RawRow {
	/** Row number as the spreadsheet shows it. */
	row: number;
	cells: Record<string, unknown>;
}

export interface RawSheet {
	spec: SheetSpec;
	rows: RawRow[];
	/** Column letter of each key found in the header row. */
	letters: Record<string, string>;
}

export type Sheets = Partial<Record<'season' | 'crops' | 'beds' | 'plantings', RawSheet>>;
export type ReadResult = { ok: true; sheets: Sheets } | { ok: false; issues: ImportIssue[] };

const sheetKeys = { Season: 'season', 'Crops & varieties': 'crops', Beds: 'beds', Plantings: 'plantings' } as const;
const specs: SheetSpec[] = [seasonSheet, cropsSheet, bedsSheet, plantingsSheet];

/** Columns without which a sheet cannot be read at all; the others may be left out. */
const requiredHeaders: Record<string, string[]> = {
	Season: ['field', 'value'],
	'Crops & varieties': ['crop', 'family', 'harvestUnit', 'frostTolerance'],
	Beds: ['block', 'bed', 'lengthFt'],
	Plantings: ['crop', 'variety', 'lengthFt', 'rows', 'inRowSpacingIn', 'method', 'fieldDate', 'firstHarvest', 'lastHarvest']
};

const norm = (s: string): string => s.trim().toLowerCase().replace(/\s+/g, ' ');

function matchHeaders(spec: SheetSpec, headers: unknown[]): { letters: Record<string, string>; index: Record<string, number>; issues: ImportIssue[] } {
	const byHeader = new Map(spec.columns.map((c) => [norm(c.header), c]));
	const letters: Record<string, string> = {};
	const index: Record<string, number> = {};
	headers.forEach((h, i) => {
		const c = typeof h === 'string' ? byHeader.get(norm(h)) : undefined;
		if (c && !(c.key in index)) {
			index[c.key] = i;
			letters[c.key] = columnLetter(i + 1);
		}
	});
	const issues = requiredHeaders[spec.name]
		.filter((k) => !(k in index))
		.map((k): ImportIssue => {
			const header = spec.columns.find((c) => c.key === k)!.header;
			return { sheet: spec.name, row: 1, column: null, header, message: `The column "${header}" is missing from the header row.` };
		});
	return { letters, index, issues };
}

/** An exceljs cell value as a plain value: a formula's result, a rich text's text. */
function plain(v: ExcelJS.CellValue): unknown {
	if (v === null || v === undefined) return null;
	if (v instanceof Date || typeof v !== 'object') return v;
	if ('result' in v) return v.result instanceof Date || typeof v.result !== 'object' ? v.result : null;
	if ('richText' in v) return v.richText.map((t) => t.text).join('');
	if ('text' in v) return v.text;
	if ('error' in v) return `#${String(v.error)}`;
	return null;
}

function toSheet(spec: SheetSpec, headerRow: unknown[], body: { row: number; values: unknown[] }[]): { sheet: RawSheet; issues: ImportIssue[] } {
	const { letters, index, issues } = matchHeaders(spec, headerRow);
	const rows: RawRow[] = [];
	for (const r of body) {
		if (r.values.every((v) => v === null || v === undefined || (typeof v === 'string' && v.trim() === ''))) continue;
		const cells: Record<string, unknown> = {};
		for (const [key, i] of Object.entries(index)) cells[key] = r.values[i] ?? null;
		rows.push({ row: r.row, cells });
	}
	return { sheet: { spec, rows, letters }, issues };
}

export async function readXlsx(buffer: ArrayBuffer): Promise<ReadResult> {
	const wb = new ExcelJS.Workbook();
	try {
		await wb.xlsx.load(buffer);
	} catch {
		return { ok: false, issues: [{ sheet: 'file', row: null, column: null, header: null, message: 'The file could not be read as an .xlsx workbook.' }] };
	}
	const sheets: Sheets = {};
	const issues: ImportIssue[] = [];
	for (const spec of specs) {
		const ws = wb.getWorksheet(spec.name);
		if (!ws) continue;
		const width = Math.max(ws.columnCount, spec.columns.length);
		const valuesOf = (n: number): unknown[] => Array.from({ length: width }, (_, i) => plain(ws.getRow(n).getCell(i + 1).value));
		const body: { row: number; values: unknown[] }[] = [];
		for (let n = 2; n <= ws.rowCount; n++) body.push({ row: n, values: valuesOf(n) });
		const read = toSheet(spec, valuesOf(1), body);
		sheets[sheetKeys[spec.name as keyof typeof sheetKeys]] = read.sheet;
		issues.push(...read.issues);
	}
	if (!sheets.crops && !sheets.beds && !sheets.plantings) {
		issues.push({ sheet: 'file', row: null, column: null, header: null, message: 'The workbook has none of the sheets "Crops & varieties", "Beds" or "Plantings".' });
	}
	return issues.length ? { ok: false, issues } : { ok: true, sheets };
}

/** Which sheet a CSV holds, from its header row, when the upload does not say. */
function guessSheet(headers: string[]): SheetSpec | undefined {
	const h = new Set(headers.map(norm));
	if (h.has('field date') || h.has('first harvest (date)')) return plantingsSheet;
	if (h.has('family') || h.has('days to maturity (d)')) return cropsSheet;
	if (h.has('bed') && h.has('length (ft)')) return bedsSheet;
	return undefined;
}

export function readCsv(text: string, sheet?: ImportableSheet): ReadResult {
	// Blank lines are kept (and skipped later) so row numbers match what a spreadsheet shows.
	const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: false });
	const [headerRow, ...rest] = parsed.data;
	if (!headerRow) return { ok: false, issues: [{ sheet: 'file', row: null, column: null, header: null, message: 'The CSV file is empty.' }] };
	const spec = sheet ? specs.find((s) => s.name === sheet) : guessSheet(headerRow);
	if (!spec) {
		return { ok: false, issues: [{ sheet: 'upload', row: 1, column: null, header: 'sheet', message: 'Could not tell which sheet this CSV holds: choose Crops & varieties, Beds or Plantings (sheet).' }] };
	}
	// A header with nothing under it would import nothing: say so instead of "0 rows imported".
	if (rest.every((values) => values.every((v) => v.trim() === ''))) {
		const message = sheet ? `The CSV has a header row but no ${sheet} rows under it.` : 'The CSV has a header row but no rows under it; say which sheet it holds (sheet) and add its rows.';
		return { ok: false, issues: [{ sheet: sheet ? spec.name : 'upload', row: null, column: null, header: sheet ? null : 'sheet', message }] };
	}
	const issues: ImportIssue[] = parsed.errors
		.filter((e) => e.type !== 'Delimiter')
		.map((e) => ({ sheet: spec.name, row: (e.row ?? 0) + 1, column: null, header: null, message: `CSV: ${e.message}` }));
	const read = toSheet(spec, headerRow, rest.map((values, i) => ({ row: i + 2, values })));
	issues.push(...read.issues);
	if (issues.length) return { ok: false, issues };
	return { ok: true, sheets: { [sheetKeys[spec.name as keyof typeof sheetKeys]]: read.sheet } };
}
