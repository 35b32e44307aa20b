// Reads uploaded .xlsx workbooks without trusting what they declare. A spreadsheet program may
// save a sheet as "A1:X1048576" with one empty row at the very bottom, and a hostile file may
// unpack to gigabytes: so the zip's directory is checked before anything is unpacked, the
// sheets are streamed (exceljs' WorkbookReader) a row at a time, only rows holding data are
// kept, and reading stops with a clear refusal past the row, column or cell limits.
import ExcelJS from 'exceljs';
import { Readable } from 'node:stream';
import { inflateRawSync } from 'node:zlib';

export interface XlsxLimits {
	/** Rows holding data, per sheet read. */
	maxRows: number;
	/** Cells holding data, over every sheet read. */
	maxCells: number;
	/** The rightmost column a row may reach. */
	maxColumns: number;
	/** Σ of the unpacked sizes of the zip's entries. */
	maxUnpackedBytes: number;
}

export interface XlsxRow {
	/** Row number as the spreadsheet shows it. */
	row: number;
	values: unknown[];
}

/** A workbook refused before or while reading: the message says why, for the person uploading. */
export class XlsxRefused extends Error {
	constructor(
		message: string,
		public status: 400 | 413,
		public sheet: string | null = null,
		public row: number | null = null
	) {
		super(message);
	}
}

/** A zip's end-of-central-directory record: where its directory starts and how many entries it lists. */
function endOfDirectory(bytes: Uint8Array): { view: DataView; directory: number; entries: number } | null {
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	// The record is 22 bytes and may be followed by a comment of up to 65,535 bytes.
	const stop = Math.max(0, bytes.length - 22 - 65_535);
	for (let i = bytes.length - 22; i >= stop; i--)
		if (view.getUint32(i, true) === 0x06054b50)
			return { view, directory: view.getUint32(i + 16, true), entries: view.getUint16(i + 10, true) };
	return null;
}

/**
 * Σ of the unpacked sizes in a zip's central directory and its entry count, or null when the
 * directory cannot be found (then the file is not a zip we read).
 */
export function zipUnpackedSize(bytes: Uint8Array): { bytes: number; entries: number } | null {
	const record = endOfDirectory(bytes);
	if (!record) return null;
	const { view, entries } = record;
	let at = record.directory;
	let total = 0;
	for (let n = 0; n < entries; n++) {
		if (at + 46 > bytes.length || view.getUint32(at, true) !== 0x02014b50) return null;
		const size = view.getUint32(at + 24, true);
		// 0xFFFFFFFF means a zip64 size: far past any limit we allow.
		total += size === 0xffffffff ? Number.MAX_SAFE_INTEGER / 2 : size;
		at += 46 + view.getUint16(at + 28, true) + view.getUint16(at + 30, true) + view.getUint16(at + 32, true);
	}
	return { bytes: total, entries };
}

/** One small entry of a zip, unpacked (stored or deflated), or null when absent or too large. */
function zipEntry(bytes: Uint8Array, wanted: string, maxBytes = 4 * 1024 * 1024): string | null {
	const record = endOfDirectory(bytes);
	if (!record) return null;
	const { view } = record;
	let at = record.directory;
	for (let n = record.entries; n > 0; n--) {
		if (at + 46 > bytes.length || view.getUint32(at, true) !== 0x02014b50) return null;
		const nameLength = view.getUint16(at + 28, true);
		const name = new TextDecoder().decode(bytes.subarray(at + 46, at + 46 + nameLength)).replace(/^\//, '');
		if (name === wanted) {
			const method = view.getUint16(at + 10, true);
			const size = view.getUint32(at + 20, true);
			const local = view.getUint32(at + 42, true);
			if (view.getUint32(at + 24, true) > maxBytes || local + 30 > bytes.length) return null;
			const start = local + 30 + view.getUint16(local + 26, true) + view.getUint16(local + 28, true);
			const raw = bytes.subarray(start, start + size);
			try {
				return new TextDecoder().decode(method === 8 ? inflateRawSync(raw, { maxOutputLength: maxBytes }) : raw);
			} catch {
				return null;
			}
		}
		at += 46 + nameLength + view.getUint16(at + 30, true) + view.getUint16(at + 32, true);
	}
	return null;
}

const attr = (tag: string, name: string): string | undefined => new RegExp(`\\b${name}="([^"]*)"`).exec(tag)?.[1];
const xmlText = (s: string): string =>
	s
		.replace(/&quot;/g, '"')
		.replace(/&apos;/g, "'")
		.replace(/&lt;/g, '<')
		.replace(/&gt;/g, '>')
		.replace(/&amp;/g, '&');

/**
 * Sheet names by worksheet part number ("3" for xl/worksheets/sheet3.xml), read from the
 * workbook part and its relationships: exceljs' streaming reader knows a sheet's name only when
 * the workbook part comes before the sheets in the zip, and writers differ in that order.
 */
function sheetNames(bytes: Uint8Array): Map<string, string> {
	const out = new Map<string, string>();
	const book = zipEntry(bytes, 'xl/workbook.xml');
	const rels = zipEntry(bytes, 'xl/_rels/workbook.xml.rels');
	if (!book || !rels) return out;
	const targets = new Map<string, string>();
	for (const m of rels.matchAll(/<Relationship\b[^>]*>/g)) {
		const id = attr(m[0], 'Id');
		const target = attr(m[0], 'Target');
		if (id && target) targets.set(id, target);
	}
	for (const m of book.matchAll(/<sheet\b[^>]*>/g)) {
		const name = attr(m[0], 'name');
		const target = targets.get(attr(m[0], 'r:id') ?? '');
		const no = target ? /sheet(\d+)\.xml$/.exec(target)?.[1] : undefined;
		if (name && no) out.set(no, xmlText(name));
	}
	return out;
}

/**
 * The zip's entries in the order a streaming reader needs them: relationships, workbook, shared
 * strings and styles before the sheets. exceljs' WorkbookReader parks sheets that come first in
 * temporary files to read later (and, seen in tests, sometimes fails doing so); given the parts
 * in this order it reads every sheet straight from the stream. Each piece runs from an entry's
 * local header to the next one, so data descriptors travel with their entry.
 */
function inReadingOrder(bytes: Uint8Array): Buffer[] | null {
	const record = endOfDirectory(bytes);
	if (!record) return null;
	const { view, directory } = record;
	const entries: { name: string; offset: number }[] = [];
	let at = directory;
	for (let n = record.entries; n > 0; n--) {
		if (at + 46 > bytes.length || view.getUint32(at, true) !== 0x02014b50) return null;
		const nameLength = view.getUint16(at + 28, true);
		entries.push({
			name: new TextDecoder().decode(bytes.subarray(at + 46, at + 46 + nameLength)).replace(/^\//, ''),
			offset: view.getUint32(at + 42, true)
		});
		at += 46 + nameLength + view.getUint16(at + 30, true) + view.getUint16(at + 32, true);
	}
	const byOffset = [...entries].sort((a, b) => a.offset - b.offset);
	const end = new Map(byOffset.map((e, i) => [e.name, i + 1 < byOffset.length ? byOffset[i + 1].offset : directory]));
	const rank = (name: string): number =>
		['xl/_rels/workbook.xml.rels', 'xl/workbook.xml', 'xl/sharedStrings.xml', 'xl/styles.xml'].indexOf(name) + 1 ||
		(name.startsWith('xl/worksheets/') ? 6 : 5);
	const ordered = [...entries].sort((a, b) => rank(a.name) - rank(b.name) || a.offset - b.offset);
	const buf = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	return ordered.map((e) => buf.subarray(e.offset, Math.max(e.offset, end.get(e.name)!)));
}

/** An exceljs cell value as a plain value: a formula's result, a rich text's text. */
export function plainCell(v: ExcelJS.CellValue): unknown {
	if (v === null || v === undefined) return null;
	if (v instanceof Date || typeof v !== 'object') return v;
	if ('result' in v) return v.result instanceof Date || typeof v.result !== 'object' ? v.result : null;
	if ('richText' in v) return v.richText.map((t) => t.text).join('');
	if ('text' in v) return v.text;
	if ('error' in v) return `#${String(v.error)}`;
	return null;
}

const isBlank = (v: unknown): boolean => v === null || v === undefined || (typeof v === 'string' && v.trim() === '');

/**
 * The rows holding data of the sheets `want` picks (by name and 1-based position), as plain
 * values. Other sheets are skipped unread. Throws XlsxRefused past a limit or for a file that
 * is not a workbook.
 */
export async function readXlsxSheets(
	bytes: Uint8Array,
	want: (name: string, position: number) => boolean,
	limits: XlsxLimits
): Promise<Map<string, XlsxRow[]>> {
	const zip = zipUnpackedSize(bytes);
	if (!zip) throw new XlsxRefused('The file is not an .xlsx workbook (its zip directory could not be read).', 400);
	if (zip.bytes > limits.maxUnpackedBytes) {
		const mb = (n: number): string => `${Math.ceil(n / 1024 / 1024)} MB`;
		throw new XlsxRefused(
			`The workbook unpacks to ${mb(zip.bytes)}; at most ${mb(limits.maxUnpackedBytes)} is read.`,
			413
		);
	}
	const names = sheetNames(bytes);
	const out = new Map<string, XlsxRow[]>();
	let cells = 0;
	let position = 0;
	const pieces = inReadingOrder(bytes);
	if (!pieces) throw new XlsxRefused('The file is not an .xlsx workbook (its zip directory could not be read).', 400);
	const input = Readable.from(pieces);
	const reader = new ExcelJS.stream.xlsx.WorkbookReader(input, {
		worksheets: 'emit',
		sharedStrings: 'cache',
		styles: 'cache',
		hyperlinks: 'ignore',
		entries: 'ignore'
	});
	// A workbook without shared strings (ours has none) has nothing to wait for: with this set, the
	// reader streams its sheets instead of parking them in temporary files.
	(reader as unknown as { sharedStrings: string[] }).sharedStrings = [];
	try {
		for await (const sheet of reader) {
			position++;
			// exceljs' typings give the reader no name or id; at run time it carries the sheet's name
			// when it found it, and otherwise its part number as id.
			const found = sheet as unknown as { name?: string; id?: string | number };
			const name = found.name ?? names.get(String(found.id)) ?? `Sheet${position}`;
			if (!want(name, position)) continue;
			const rows: XlsxRow[] = [];
			out.set(name, rows);
			for await (const row of sheet as unknown as AsyncIterable<ExcelJS.Row>) {
				if (row.cellCount > limits.maxColumns) {
					throw new XlsxRefused(
						`Sheet "${name}", row ${row.number} reaches column ${row.cellCount}; at most ${limits.maxColumns} columns are read.`,
						413,
						name,
						row.number
					);
				}
				const values: unknown[] = [];
				let filled = 0;
				for (let c = 1; c <= row.cellCount; c++) {
					const v = plainCell(row.getCell(c).value);
					values.push(v);
					if (!isBlank(v)) filled++;
				}
				if (!filled) continue;
				cells += filled;
				rows.push({ row: row.number, values });
				if (rows.length > limits.maxRows) {
					throw new XlsxRefused(
						`Sheet "${name}" has more than ${limits.maxRows.toLocaleString('en-US')} rows; at most that many are read at once.`,
						413,
						name,
						row.number
					);
				}
				if (cells > limits.maxCells) {
					throw new XlsxRefused(
						`The workbook holds more than ${limits.maxCells.toLocaleString('en-US')} filled cells; at most that many are read at once.`,
						413,
						name,
						row.number
					);
				}
			}
		}
		if (position === 0)
			throw new XlsxRefused('The file is a zip archive but not an .xlsx workbook: it holds no sheet.', 400);
	} catch (err) {
		input.destroy();
		if (err instanceof XlsxRefused) throw err;
		throw new XlsxRefused('The file could not be read as an .xlsx workbook.', 400);
	}
	return out;
}
