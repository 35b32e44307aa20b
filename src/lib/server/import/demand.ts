// Demand upload: a CSV (papaparse) or .xlsx (exceljs) file in Furrowcast's own layout,
//
//   channel,crop,week,quantity,unit
//   Full share,Carrot,2027-W24,1.5,lb
//   market,Kale,2027-W30,20,bunch
//
// channel is a share size's name (box contents per box), `market` or `restaurant` (weekly
// quantity); crop is a crop's name in the library; week an ISO week; quantity in the crop's
// harvest unit (0 clears the cell); unit may be left empty but, when given, must be the crop's.
// Weights are read in either system: "kg" or "lb" as the unit cell says, and an empty unit cell
// in the farm's own (kg on a metric farm); a download is written in the farm's units.
// Every row is checked before anything is written, and the whole file is written in one
// transaction or not at all; each error names its spreadsheet row (the header is row 1) and column.
import Papa from 'papaparse';
import ExcelJS from 'exceljs';
import { readXlsxSheets, XlsxRefused, type XlsxLimits } from '../xlsx-read';
import { uploadColumns, uploadModeSchema, uploadRowSchema, type HarvestUnit } from '$lib/schemas/demand';
import type { Season } from '../seasons';
import { displayPrefs } from '../farms';
import { fromDisplayQuantity, toDisplayQuantity, unitLabel, type UnitSystem } from '$lib/format';
import { listCrops, listShareSizes, type DemandView } from '../demand';
import { outside, resolveGrid, writeGrids, type GridTarget, type GridWrite } from '../demand-cells';

/** Kept under adapter-node's default 512 KB body limit, so the user sees our message, not a bare 413. */
export const MAX_UPLOAD_BYTES = 256 * 1024;
export const MAX_UPLOAD_ROWS = 10_000;

export interface UploadError {
	row: number;
	column: string;
	message: string;
}

export type ImportResult =
	{ ok: true; rows: number; set: number; cleared: number } | { ok: false; status: 400 | 413; errors: UploadError[] };

interface RawRow {
	row: number;
	cells: string[];
}

function cellText(v: unknown): string {
	if (v === null || v === undefined) return '';
	if (v instanceof Date) return v.toISOString().slice(0, 10);
	return String(v);
}

/** A demand file is a few thousand rows of five columns: far below these. */
const DEMAND_LIMITS: XlsxLimits = {
	maxRows: MAX_UPLOAD_ROWS,
	maxCells: MAX_UPLOAD_ROWS * 10,
	maxColumns: 50,
	maxUnpackedBytes: 20 * 1024 * 1024
};

/** The first sheet's rows holding data, streamed (see xlsx-read.ts). */
async function readXlsx(bytes: ArrayBuffer): Promise<RawRow[]> {
	const book = await readXlsxSheets(new Uint8Array(bytes), (_name, position) => position === 1, DEMAND_LIMITS);
	const [rows] = [...book.values()];
	return (rows ?? []).map((r) => ({
		row: r.row,
		cells: Array.from({ length: Math.max(r.values.length, uploadColumns.length) }, (_, i) =>
			cellText(r.values[i]).trim()
		)
	}));
}

/** Undoes toCsv's formula escape, so a downloaded file uploads again unchanged. */
const escapedFormula = /^'(?=[=+\-@\t\r])/;

function readCsv(text: string): { rows: RawRow[]; errors: UploadError[] } {
	const out = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: false });
	const errors = out.errors.map((e) => ({
		row: (e.row ?? 0) + 1,
		column: '(row)',
		message: `The CSV could not be read here: ${e.message}.`
	}));
	const cell = (c: unknown): string =>
		String(c ?? '')
			.replace(escapedFormula, '')
			.trim();
	return { rows: out.data.map((cells, i) => ({ row: i + 1, cells: cells.map(cell) })), errors };
}

type Refused = { errors: UploadError[]; status: 400 | 413 };

/** The whole file refused, with the one reason (row 0: not a row of it). */
const fileRefused = (status: 400 | 413, message: string, row = 0): Refused => ({
	status,
	errors: [{ row, column: 'file', message }]
});

/** Reads the file into rows of text; the header row is checked against the layout. */
async function readRows(file: File): Promise<{ rows: RawRow[]; header: Map<string, number> } | Refused> {
	if (file.size === 0) return fileRefused(400, 'The file is empty.');
	if (file.size > MAX_UPLOAD_BYTES)
		return fileRefused(
			413,
			`The file is ${Math.ceil(file.size / 1024)} KB; at most ${MAX_UPLOAD_BYTES / 1024} KB may be uploaded.`
		);
	const bytes = await file.arrayBuffer();
	const head = new Uint8Array(bytes.slice(0, 4));
	// An .xlsx is a zip archive: it starts with "PK\x03\x04", whatever its name says.
	const isZip = head[0] === 0x50 && head[1] === 0x4b && head[2] === 0x03 && head[3] === 0x04;
	const name = file.name.toLowerCase();
	let rows: RawRow[];
	if (isZip) {
		try {
			rows = await readXlsx(bytes);
		} catch (err) {
			if (!(err instanceof XlsxRefused)) throw err;
			// A zip that is not a workbook (no sheet at all) says so, not "no rows".
			return fileRefused(err.status, err.message, err.row ?? 0);
		}
	} else if (name.endsWith('.xlsx') || name.endsWith('.xls')) {
		return fileRefused(400, 'The file is not an .xlsx workbook (old .xls files are not read: save as .xlsx or CSV).');
	} else {
		const csv = readCsv(new TextDecoder('utf-8').decode(bytes));
		if (csv.errors.length) return { status: 400, errors: csv.errors };
		rows = csv.rows;
	}
	rows = rows.filter((r) => r.cells.some((c) => c !== ''));
	const [first, ...data] = rows;
	if (!first) return fileRefused(400, 'The file has no rows.', 1);
	if (data.length > MAX_UPLOAD_ROWS)
		return fileRefused(413, `The file has ${data.length} rows; at most ${MAX_UPLOAD_ROWS} may be uploaded at once.`);
	const header = new Map<string, number>();
	const errors: UploadError[] = [];
	first.cells.forEach((c, i) => {
		const name = c.toLowerCase();
		if (name === '') return;
		if (!(uploadColumns as readonly string[]).includes(name))
			errors.push({
				row: first.row,
				column: c,
				message: `Unknown column "${c}": the columns are ${uploadColumns.join(', ')}.`
			});
		else if (header.has(name)) errors.push({ row: first.row, column: c, message: `Column "${c}" appears twice.` });
		else header.set(name, i);
	});
	for (const col of uploadColumns.filter((c) => c !== 'unit'))
		if (!header.has(col))
			errors.push({ row: first.row, column: col, message: `The header row has no "${col}" column.` });
	if (errors.length) return { status: 400, errors };
	return { rows: data, header };
}

/** Checks every row of the file and, only when all are good, writes them in one transaction. */
export async function importDemand(
	farmId: number,
	season: Season,
	file: File,
	mode: 'merge' | 'replace'
): Promise<ImportResult> {
	const read = await readRows(file);
	if ('errors' in read) return { ok: false, status: read.status, errors: read.errors };
	const [crops, shares, prefs] = await Promise.all([
		listCrops(farmId),
		listShareSizes(farmId, season.id),
		displayPrefs(farmId)
	]);
	const cropByName = new Map(crops.map((c) => [c.name.toLowerCase(), c]));
	const targets = new Map<string, GridTarget>();
	for (const s of shares) targets.set(s.name.toLowerCase(), await resolveGrid(farmId, season, `share:${s.id}`));
	for (const ch of ['market', 'restaurant'] as const)
		if (!targets.has(ch)) targets.set(ch, await resolveGrid(farmId, season, ch));

	const errors: UploadError[] = [];
	const writes = new Map<GridTarget, GridWrite>();
	const seen = new Map<string, number>();
	for (const r of read.rows) {
		const raw = Object.fromEntries([...read.header].map(([col, i]) => [col, r.cells[i] ?? '']));
		const parsed = uploadRowSchema.safeParse(raw);
		const bad = new Set<string>();
		if (!parsed.success) {
			for (const issue of parsed.error.issues) {
				const column = String(issue.path[0] ?? '(row)');
				if (bad.has(column)) continue;
				bad.add(column);
				errors.push({ row: r.row, column, message: issue.message });
			}
		}
		// Names are looked up even when another column is bad, so every bad cell is reported at once.
		const target = raw.channel ? targets.get(raw.channel.toLowerCase()) : undefined;
		if (raw.channel && !bad.has('channel') && !target) {
			errors.push({
				row: r.row,
				column: 'channel',
				message: `"${raw.channel}" is neither a share size of ${season.name} (${shares.map((s) => s.name).join(', ') || 'none yet'}) nor market or restaurant.`
			});
			bad.add('channel');
		}
		const crop = raw.crop ? cropByName.get(raw.crop.toLowerCase()) : undefined;
		if (raw.crop && !bad.has('crop') && !crop) {
			errors.push({ row: r.row, column: 'crop', message: `"${raw.crop}" is not a crop in the library.` });
			bad.add('crop');
		}
		if (!parsed.success || !target || !crop) continue;
		const row = parsed.data;
		const away = outside(target, row.week);
		if (away) errors.push({ row: r.row, column: 'week', message: `${row.week} is ${away}.` });
		// A weight in kg or lb, as the cell says (empty: the farm's own unit); a count must be the crop's.
		const kg = crop.unit === 'lb' && (row.unit === 'kg' || (!row.unit && prefs.unitSystem === 'metric'));
		const unitOk = !row.unit || row.unit === crop.unit || (row.unit === 'kg' && crop.unit === 'lb');
		if (!unitOk) {
			const named = crop.unit === 'lb' ? 'kg or lb' : crop.unit;
			errors.push({ row: r.row, column: 'unit', message: `${crop.name} is counted in ${named}, not ${row.unit}.` });
		}
		const key = `${target.label}|${crop.id}|${row.week}`;
		const dup = seen.get(key);
		if (dup !== undefined)
			errors.push({
				row: r.row,
				column: 'week',
				message: `Row ${dup} already gives ${crop.name} for ${target.label} in ${row.week}.`
			});
		else seen.set(key, r.row);
		if (away || !unitOk || dup !== undefined) continue;
		const w = writes.get(target) ?? { target, set: [], clear: [] };
		writes.set(target, w);
		// Kept in lb to the hundredth, as the database does.
		const quantity = kg ? Math.round(fromDisplayQuantity(row.quantity, 'lb', 'metric') * 100) / 100 : row.quantity;
		if (quantity === 0) w.clear.push({ cropId: crop.id, week: row.week });
		else w.set.push({ cropId: crop.id, week: row.week, quantity, unit: crop.unit as HarvestUnit });
	}
	if (errors.length) return { ok: false, status: 400, errors: errors.sort((a, b) => a.row - b.row) };
	const list = [...writes.values()];
	await writeGrids(farmId, season.id, list, mode === 'replace');
	return {
		ok: true,
		rows: read.rows.length,
		set: list.reduce((n, w) => n + w.set.length, 0),
		cleared: list.reduce((n, w) => n + w.clear.length, 0)
	};
}

/**
 * The season's demand in the upload layout, so a download can be edited and uploaded again; in the
 * farm's units. A weight in kg keeps three decimals: read back, it gives the stored lb to the hundredth.
 */
export function demandRows(view: DemandView, system: UnitSystem = 'imperial'): string[][] {
	const crop = new Map(view.crops.map((c) => [c.id, c]));
	const share = new Map(view.shareSizes.map((s) => [s.id, s.name]));
	const cells = (quantity: number, unit: string): [string, string] =>
		unit === 'lb' && system === 'metric'
			? [String(Math.round(toDisplayQuantity(quantity, 'lb', system) * 1000) / 1000), unitLabel('lb', system)]
			: [String(quantity), unit];
	const rows: string[][] = [];
	for (const b of view.boxItems)
		rows.push([share.get(b.shareSizeId) ?? '', crop.get(b.cropId)?.name ?? '', b.week, ...cells(b.quantity, b.unit)]);
	for (const c of view.channelDemand)
		rows.push([
			c.channel,
			crop.get(c.cropId)?.name ?? '',
			c.week,
			...cells(c.quantity, crop.get(c.cropId)?.unit ?? '')
		]);
	return rows;
}

/** Cells that would start a formula (= + - @, tab, CR) get a leading `'`, so a spreadsheet program
 *  opening the file shows the text instead of running it (OWASP: CSV injection). */
export function toCsv(rows: string[][]): string {
	return Papa.unparse({ fields: [...uploadColumns], data: rows }, { newline: '\r\n', escapeFormulae: true }) + '\r\n';
}

export async function toXlsx(rows: string[][]): Promise<Buffer> {
	const book = new ExcelJS.Workbook();
	const sheet = book.addWorksheet('Demand');
	sheet.addRow([...uploadColumns]).font = { bold: true };
	for (const r of rows) sheet.addRow([r[0], r[1], r[2], Number(r[3]), r[4]]);
	sheet.columns.forEach((c, i) => (c.width = [16, 18, 11, 10, 8][i]));
	return Buffer.from(await book.xlsx.writeBuffer());
}

export type UploadForm =
	{ ok: true; file: File; mode: 'merge' | 'replace' } | { ok: false; field: string; message: string };

/** The file and mode of an upload form (multipart), as the page action and the API both take it. */
export async function uploadFromForm(request: Request): Promise<UploadForm> {
	let form: FormData;
	try {
		form = await request.formData();
	} catch {
		return { ok: false, field: 'file', message: 'Send the file as multipart/form-data in a field named file.' };
	}
	const file = form.get('file');
	if (!(file instanceof File) || file.name === '')
		return { ok: false, field: 'file', message: 'Choose a CSV or .xlsx file to upload.' };
	const mode = uploadModeSchema.safeParse(form.get('mode') ?? 'merge');
	if (!mode.success) return { ok: false, field: 'mode', message: mode.error.issues[0].message };
	return { ok: true, file, mode: mode.data };
}
