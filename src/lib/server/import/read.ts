// Reads an uploaded .xlsx (exceljs) or .csv (papaparse) into plain rows keyed by our column
// keys, matched by header text. Nothing is validated here beyond the layout itself: which
// sheets and columns are present.
import Papa from 'papaparse';
import type { ImportIssue, ImportableSheet } from '$lib/schemas/import';
import { readXlsxSheets, XlsxRefused, type XlsxLimits, type XlsxRow } from '../xlsx-read';
import { detectDecimal, parseNumberText } from '$lib/schemas/number-text';
import type { UnitSystem } from '$lib/format';
import {
	bedsSheet,
	columnLetter,
	cropsSheet,
	dollarHeader,
	plantingsSheet,
	seasonSheet,
	type SheetSpec
} from '../export/layout';
import { cellsToCanonical, systemOfHeader } from '../export/units';

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
	/** The unit system each measured column's header names ("Length (m)": metric). */
	systems: Record<string, UnitSystem>;
}

export type Sheets = Partial<Record<'season' | 'crops' | 'beds' | 'plantings', RawSheet>>;
export type ReadResult = { ok: true; sheets: Sheets } | { ok: false; status?: 400 | 413; issues: ImportIssue[] };

const sheetKeys = { Season: 'season', 'Crops & varieties': 'crops', Beds: 'beds', Plantings: 'plantings' } as const;
const specs: SheetSpec[] = [seasonSheet, cropsSheet, bedsSheet, plantingsSheet];

/** Columns without which a sheet cannot be read at all; the others may be left out. */
const requiredHeaders: Record<string, string[]> = {
	Season: ['field', 'value'],
	'Crops & varieties': ['crop', 'family', 'harvestUnit', 'frostTolerance'],
	Beds: ['block', 'bed', 'lengthFt'],
	Plantings: [
		'crop',
		'variety',
		'lengthFt',
		'rows',
		'inRowSpacingIn',
		'method',
		'fieldDate',
		'firstHarvest',
		'lastHarvest'
	]
};

const norm = (s: string): string => s.trim().toLowerCase().replace(/\s+/g, ' ');

function matchHeaders(
	spec: SheetSpec,
	headers: unknown[]
): {
	letters: Record<string, string>;
	index: Record<string, number>;
	systems: Record<string, UnitSystem>;
	issues: ImportIssue[];
} {
	// A measured column is read in either system's units, as its header names them.
	const byHeader = new Map(
		spec.columns.flatMap((c) => [
			[norm(c.header), c] as const,
			...(c.units ? [[norm(c.units.metric), c] as const] : [])
		])
	);
	const letters: Record<string, string> = {};
	const index: Record<string, number> = {};
	const systems: Record<string, UnitSystem> = {};
	headers.forEach((h, i) => {
		// Money in any currency reads alike: "Cost (EUR)" is the layout's "Cost ($)".
		const money = typeof h === 'string' ? byHeader.get(norm(dollarHeader(h))) : undefined;
		const c =
			typeof h === 'string' ? (byHeader.get(norm(h)) ?? (money?.kind === 'money' ? money : undefined)) : undefined;
		if (c && !(c.key in index)) {
			index[c.key] = i;
			letters[c.key] = columnLetter(i + 1);
			if (c.units) systems[c.key] = systemOfHeader(c, dollarHeader(h as string));
		}
	});
	const issues = requiredHeaders[spec.name]
		.filter((k) => !(k in index))
		.map((k): ImportIssue => {
			const c = spec.columns.find((col) => col.key === k)!;
			const header = c.header;
			const either = c.units && c.units.metric !== c.header ? ` (or "${c.units.metric}")` : '';
			return {
				sheet: spec.name,
				row: 1,
				column: null,
				header,
				message: `The column "${header}"${either} is missing from the header row.`
			};
		});
	return { letters, index, systems, issues };
}

function toSheet(
	spec: SheetSpec,
	headerRow: unknown[],
	body: { row: number; values: unknown[] }[]
): { sheet: RawSheet; issues: ImportIssue[] } {
	const { letters, index, systems, issues } = matchHeaders(spec, headerRow);
	const rows: RawRow[] = [];
	for (const r of body) {
		if (r.values.every((v) => v === null || v === undefined || (typeof v === 'string' && v.trim() === ''))) continue;
		const cells: Record<string, unknown> = {};
		for (const [key, i] of Object.entries(index)) cells[key] = r.values[i] ?? null;
		rows.push({ row: r.row, cells });
	}
	return { sheet: { spec, rows, letters, systems }, issues };
}

/** Per upload: far above a real farm's season (the bench's 5,000 plantings), far below harm. */
export const IMPORT_LIMITS: XlsxLimits = {
	maxRows: 20_000,
	maxCells: 600_000,
	maxColumns: 200,
	maxUnpackedBytes: 150 * 1024 * 1024
};

export async function readXlsx(buffer: ArrayBuffer): Promise<ReadResult> {
	let book: Map<string, XlsxRow[]>;
	try {
		book = await readXlsxSheets(new Uint8Array(buffer), (name) => name in sheetKeys, IMPORT_LIMITS);
	} catch (err) {
		if (!(err instanceof XlsxRefused)) throw err;
		return {
			ok: false,
			status: err.status,
			issues: [{ sheet: err.sheet ?? 'file', row: err.row, column: null, header: null, message: err.message }]
		};
	}
	const sheets: Sheets = {};
	const issues: ImportIssue[] = [];
	for (const spec of specs) {
		const rows = book.get(spec.name);
		if (!rows) continue;
		const header = rows[0]?.row === 1 ? rows[0].values : [];
		const read = toSheet(
			spec,
			header,
			rows.filter((r) => r.row > 1)
		);
		sheets[sheetKeys[spec.name as keyof typeof sheetKeys]] = read.sheet;
		issues.push(...read.issues);
	}
	if (!sheets.crops && !sheets.beds && !sheets.plantings) {
		issues.push({
			sheet: 'file',
			row: null,
			column: null,
			header: null,
			message: 'The workbook has none of the sheets "Crops & varieties", "Beds" or "Plantings".'
		});
	}
	issues.push(...readNumbers(sheets));
	toCanonical(sheets);
	return issues.length ? { ok: false, issues } : { ok: true, sheets };
}

const numberKinds = new Set(['int', 'number', 'money', 'percent']);

/**
 * Number cells written as text (a CSV, or a workbook cell typed as text) are read the way the
 * file writes them: the decimal mark is decided once for the whole file from every such cell
 * (a file that writes "1.5" or "1,500.00" anywhere writes "1,000" for one thousand; one that
 * writes "1,5" uses a decimal comma), and a value that still reads two ways is refused, named
 * by row and column. In a "(%)" column "85", "85%" and 0.85 all mean 85 %.
 */
export function readNumbers(sheets: Sheets): ImportIssue[] {
	const cells: { sheet: RawSheet; row: RawRow; key: string; percent: boolean }[] = [];
	for (const sheet of Object.values(sheets)) {
		if (!sheet || sheet.spec === seasonSheet) continue;
		const keys = sheet.spec.columns.filter((c) => numberKinds.has(c.kind) && c.key in sheet.letters);
		for (const row of sheet.rows)
			for (const c of keys) cells.push({ sheet, row, key: c.key, percent: c.kind === 'percent' });
	}
	const texts = function* (): Generator<string> {
		for (const c of cells) {
			const v = c.row.cells[c.key];
			if (typeof v === 'string') yield v.trim().replace(/%$/, '').replace(/^\$/, '');
		}
	};
	const found = detectDecimal(texts());
	const mark = found === 'mixed' ? null : found;
	const issues: ImportIssue[] = [];
	for (const c of cells) {
		const v = c.row.cells[c.key];
		if (typeof v === 'number') {
			if (c.percent && v > 1) c.row.cells[c.key] = v / 100;
			continue;
		}
		if (typeof v !== 'string' || v.trim() === '') continue;
		const t = v.trim();
		const sign = t.endsWith('%');
		const read = parseNumberText(sign ? t.slice(0, -1) : t, mark);
		if (read.kind === 'ambiguous') {
			const header = c.sheet.spec.columns.find((col) => col.key === c.key)!.header;
			const [a, b] = read.readings;
			issues.push({
				sheet: c.sheet.spec.name,
				row: c.row.row,
				column: c.sheet.letters[c.key] ?? null,
				header,
				message: `"${t}" could be ${a.toLocaleString('en-US')} or ${String(b)}, and no other number in the file shows which mark is the decimal one; write it without the thousands separator.`
			});
		} else if (read.kind === 'number') {
			c.row.cells[c.key] = sign || (c.percent && read.value > 1) ? read.value / 100 : read.value;
		}
	}
	return issues;
}

/**
 * Measured figures in the database's units: each column as its header names them (a metric
 * farm's "Length (m)" and an imperial farm's "Length (ft)" both read), after readNumbers.
 */
function toCanonical(sheets: Sheets): void {
	for (const sheet of Object.values(sheets))
		if (sheet) for (const row of sheet.rows) cellsToCanonical(sheet.spec, row.cells, sheet.systems);
}

/** Which sheet a CSV holds, from its header row, when the upload does not say. */
function guessSheet(headers: string[]): SheetSpec | undefined {
	const h = new Set(headers.map(norm));
	if (h.has('field date') || h.has('first harvest (date)')) return plantingsSheet;
	if (h.has('family') || h.has('days to maturity (d)')) return cropsSheet;
	if (h.has('bed') && (h.has('length (ft)') || h.has('length (m)'))) return bedsSheet;
	return undefined;
}

export function readCsv(text: string, sheet?: ImportableSheet): ReadResult {
	// Blank lines are kept (and skipped later) so row numbers match what a spreadsheet shows.
	// preview stops the parser one row past the limit, so a huge file is never held whole as rows.
	const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), {
		skipEmptyLines: false,
		preview: IMPORT_LIMITS.maxRows + 2
	});
	const [headerRow, ...rest] = parsed.data;
	const filled = rest.filter((r) => r.some((c) => c.trim() !== ''));
	if (filled.length > IMPORT_LIMITS.maxRows) {
		const message = `The CSV has more than ${IMPORT_LIMITS.maxRows.toLocaleString('en-US')} rows; at most that many are read at once.`;
		return { ok: false, status: 413, issues: [{ sheet: 'file', row: null, column: null, header: null, message }] };
	}
	if (
		filled.reduce((n, r) => n + r.length, 0) > IMPORT_LIMITS.maxCells ||
		(headerRow?.length ?? 0) > IMPORT_LIMITS.maxColumns
	) {
		const message = `The CSV has more than ${IMPORT_LIMITS.maxColumns} columns or ${IMPORT_LIMITS.maxCells.toLocaleString('en-US')} cells; at most that many are read.`;
		return { ok: false, status: 413, issues: [{ sheet: 'file', row: null, column: null, header: null, message }] };
	}
	if (!headerRow)
		return {
			ok: false,
			issues: [{ sheet: 'file', row: null, column: null, header: null, message: 'The CSV file is empty.' }]
		};
	const spec = sheet ? specs.find((s) => s.name === sheet) : guessSheet(headerRow);
	if (!spec) {
		return {
			ok: false,
			issues: [
				{
					sheet: 'upload',
					row: 1,
					column: null,
					header: 'sheet',
					message: 'Could not tell which sheet this CSV holds: choose Crops & varieties, Beds or Plantings (sheet).'
				}
			]
		};
	}
	// A header with nothing under it would import nothing: say so instead of "0 rows imported".
	if (rest.every((values) => values.every((v) => v.trim() === ''))) {
		const message = sheet
			? `The CSV has a header row but no ${sheet} rows under it.`
			: 'The CSV has a header row but no rows under it; say which sheet it holds (sheet) and add its rows.';
		return {
			ok: false,
			issues: [
				{ sheet: sheet ? spec.name : 'upload', row: null, column: null, header: sheet ? null : 'sheet', message }
			]
		};
	}
	const issues: ImportIssue[] = parsed.errors
		.filter((e) => e.type !== 'Delimiter')
		.map((e) => ({
			sheet: spec.name,
			row: (e.row ?? 0) + 1,
			column: null,
			header: null,
			message: `CSV: ${e.message}`
		}));
	const read = toSheet(
		spec,
		headerRow,
		rest.map((values, i) => ({ row: i + 2, values }))
	);
	issues.push(...read.issues);
	const sheets: Sheets = { [sheetKeys[spec.name as keyof typeof sheetKeys]]: read.sheet };
	issues.push(...readNumbers(sheets));
	toCanonical(sheets);
	if (issues.length) return { ok: false, issues };
	return { ok: true, sheets };
}
