// What the grid does with a selected range: copy it as tab-separated text (the way spreadsheets
// exchange ranges), read pasted text cell by cell through each column's check, fill down, clear.
// Each works out the edits; the grid state applies them as one undo step.
import { fieldSpec, plantingFieldNames, type PlantingField } from '$lib/plantings/fields';
import { readCell, type GridColumn, type Lookups } from './columns';
import { defaultValues, nextSuccessionValues, type GridRow, type RowValues } from './rows';

export interface BadCell {
	/** 1-based row number as the user sees it, and the column's label. */
	row: number;
	column: string;
	text: string;
	message: string;
}
export interface PendingPaste {
	changes: CellEdit[];
	newRows: RowValues[];
	bad: BadCell[];
	/** Cells read one way where another was possible (a date's day and month), said before saving. */
	notes: BadCell[];
}

/** A range of the view, inclusive. */
export interface CellRange {
	r0: number;
	r1: number;
	c0: number;
	c1: number;
}

/** One cell's new value. */
export type CellEdit = { key: string; field: PlantingField; value: unknown };

/** The rows and columns in view, the selected range, and which cells the user may change. */
export interface RangeTarget {
	rows: GridRow[];
	columns: GridColumn[];
	range: CellRange;
	canEdit(row: GridRow, col: GridColumn): boolean;
}

/** Fill down: the top row of the range copied into the rows below it. */
export function fillDownEdits({ rows, columns, range, canEdit }: RangeTarget): CellEdit[] {
	const { r0, r1, c0, c1 } = range;
	const list: CellEdit[] = [];
	if (r1 === r0) return list;
	const top = rows[r0];
	for (let c = c0; c <= c1; c++) {
		const col = columns[c];
		if (!col?.field || !top || !canEdit(top, col)) continue;
		for (let r = r0 + 1; r <= r1; r++) list.push({ key: rows[r].key, field: col.field, value: top.values[col.field] });
	}
	return list;
}

/** The fields whose cell may be empty: those whose schema takes null (the bed, notes, actual dates). */
const mayBeEmpty = new Set(plantingFieldNames.filter((f) => fieldSpec(f).schema.safeParse(null).success));

/** Clear: every cell of the range that may be empty, emptied. */
export function clearEdits({ rows, columns, range, canEdit }: RangeTarget): CellEdit[] {
	const { r0, r1, c0, c1 } = range;
	const list: CellEdit[] = [];
	for (let r = r0; r <= r1; r++)
		for (let c = c0; c <= c1; c++) {
			const row = rows[r];
			const col = columns[c];
			if (row && col?.field && canEdit(row, col) && mayBeEmpty.has(col.field))
				list.push({ key: row.key, field: col.field, value: null });
		}
	return list;
}

/** The range as tab-separated text, the way spreadsheets exchange ranges. */
export function copyText(rows: GridRow[], columns: GridColumn[], range: CellRange, lookups: Lookups): string {
	const { r0, r1, c0, c1 } = range;
	const lines: string[] = [];
	for (let r = r0; r <= r1; r++) {
		const row = rows[r];
		if (!row) continue;
		const cells: string[] = [];
		for (let c = c0; c <= c1; c++) cells.push((columns[c]?.text?.(row, lookups) ?? '').replace(/[\t\n\r]+/g, ' '));
		lines.push(cells.join('\t'));
	}
	return lines.join('\n');
}

/** What reading a paste needs of the grid: the rows and columns in view, who pastes, where. */
export interface PasteTarget {
	rows: GridRow[];
	columns: GridColumn[];
	lookups: Lookups;
	at: { r: number; c: number };
	mayAddRows: boolean;
	canEdit(row: GridRow, col: GridColumn): boolean;
	newRow(values: RowValues): GridRow;
}

/** Fields a new row cannot do without: a pasted row whose cell for one of them is bad is left out. */
const requiredForNewRow: readonly PlantingField[] = [
	'varietyId',
	'lengthFt',
	'fieldDate',
	'rows',
	'inRowSpacingIn',
	'method'
];

/**
 * Tab-separated text laid from `at`: every cell checked with its column's schema; rows past the
 * end become new rows (when `mayAddRows`). Nothing changes here: the grid applies the result.
 */
export function readPaste(text: string, t: PasteTarget): PendingPaste {
	const lines = text
		.replace(/\r\n?/g, '\n')
		.replace(/\n$/, '')
		.split('\n')
		.map((l) => l.split('\t'));
	const { r: r0, c: c0 } = t.at;
	const out: PendingPaste = { changes: [], newRows: [], bad: [], notes: [] };
	const template = t.rows[t.rows.length - 1]?.values ?? defaultValues(t.lookups.varieties[0]);
	lines.forEach((cells, i) => {
		const r = r0 + i;
		let row = t.rows[r];
		const isNew = !row;
		if (isNew) {
			if (!t.mayAddRows) {
				out.bad.push({ row: r + 1, column: '—', text: cells.join(' '), message: 'Only the owner adds plantings.' });
				return;
			}
			row = t.newRow(nextSuccessionValues(template));
		}
		let values = { ...row.values };
		const failed: PlantingField[] = [];
		cells.forEach((text, j) => {
			const col = t.columns[c0 + j];
			if (!col) return;
			if (!t.canEdit(row, col)) {
				// Pasting the same text back over a read-only cell is harmless (a copied block round-trips).
				if ((col.text?.(row, t.lookups) ?? '') !== text.trim())
					out.bad.push({
						row: r + 1,
						column: col.label,
						text,
						message: col.field ? 'read-only for your role' : 'worked out, not typed'
					});
				return;
			}
			const check = readCell(col, text, { ...row, values }, t.lookups);
			if (!check.ok) {
				failed.push(col.field!);
				return out.bad.push({ row: r + 1, column: col.label, text, message: check.message });
			}
			if (check.note) out.notes.push({ row: r + 1, column: col.label, text, message: check.note });
			values = { ...values, [col.field!]: check.value };
			if (col.field === 'varietyId')
				values.method = t.lookups.varietyById.get(check.value as number)?.method ?? values.method;
			if (!isNew) out.changes.push({ key: row.key, field: col.field!, value: check.value });
		});
		if (isNew) {
			// A cell that failed its check stays empty: never the previous row's bed or date. A new
			// row cannot be without a variety, a length or a field date, so it is left out, and said.
			if (failed.some((f) => requiredForNewRow.includes(f))) {
				out.bad.push({
					row: r + 1,
					column: '—',
					text: cells.join(' '),
					message: 'This new row is left out: a cell it cannot do without was not valid.'
				});
				return;
			}
			const blank: Partial<Record<PlantingField, unknown>> = { startFt: 0, seedsPerSpot: 1, status: 'planned' };
			const emptied = Object.fromEntries(failed.map((f) => [f, f in blank ? blank[f] : null]));
			out.newRows.push({ ...values, ...emptied });
		}
	});
	return out;
}

/** What the message line says once a paste went in. */
export function pasteMessage(p: PendingPaste, added: number): string {
	const s = (n: number) => (n === 1 ? '' : 's');
	const rows = added ? ` and ${added} new row${s(added)}` : '';
	const bad = p.bad.length ? `; left out ${p.bad.length} bad cell${s(p.bad.length)}` : '';
	return `Pasted ${p.changes.length} cell${s(p.changes.length)}${rows}${bad}.`;
}
