// The planting grid's state: rows, view (filter, sort, group), selection, editing, undo/redo
// and the save queue. Plain class with runes, no DOM, so the unit tests drive it directly.
import { plantingConflicts } from '$lib/planning/planting-derive';
import { weekStart, addDays } from '$lib/planning';
import { editableFields, type PlantingField } from '$lib/schemas/planting';
import type { Role } from '$lib/roles';
import { can } from '$lib/permissions';
import { initialValue, plantingFieldNames } from '$lib/plantings/fields';
import type { PlantingView } from '$lib/types';
import { columns as allColumns, readCell, warningLabels, bedLabel, type GridColumn, type Lookups } from './columns';
import type { GridBed, GridFarm, GridVariety } from '$lib/plantings/derive';
import { rowFromView, withDerived, type GridRow, type RowValues } from './rows';
import { SaveQueue, type GridApi } from './save-queue.svelte';

export type GroupBy = 'none' | 'bed' | 'crop';
export interface Filters {
	crop: string;
	bedId: string;
	block: string;
	status: string;
	fromWeek: string;
	toWeek: string;
	warningsOnly: boolean;
}
export interface GroupTotals {
	bedFeet: number;
	grams: number;
	/** Yield per harvest unit: units are never added together. */
	yield: Record<string, number>;
	count: number;
}
export type Item = { kind: 'group'; label: string; totals: GroupTotals } | { kind: 'row'; row: GridRow; index: number };

export interface CellRef {
	r: number;
	c: number;
}
export interface Change {
	key: string;
	field: PlantingField;
	before: unknown;
	after: unknown;
}
type UndoEntry =
	{ kind: 'cells'; changes: Change[] } | { kind: 'add'; rows: GridRow[] } | { kind: 'remove'; rows: GridRow[] };

export interface BadCell {
	/** 1-based row number as the user sees it, and the column's label. */
	row: number;
	column: string;
	text: string;
	message: string;
}
export interface PendingPaste {
	changes: { key: string; field: PlantingField; value: unknown }[];
	newRows: RowValues[];
	bad: BadCell[];
	/** Cells read one way where another was possible (a date's day and month), said before saving. */
	notes: BadCell[];
}

export interface GridInit {
	plantings: PlantingView[];
	varieties: GridVariety[];
	beds: GridBed[];
	farm: GridFarm;
	role: Role;
	seasonId: number;
	/** How the farm writes dates (its settings): pasted "6/24/2028" is read in this order. */
	dateLocale?: string;
}

export const UNDO_LIMIT = 200;

let newKey = 0;

class RowBox {
	current: GridRow = $state.raw() as unknown as GridRow;
	constructor(row: GridRow) {
		this.current = row;
	}
}

export class GridState {
	rows = $state.raw<GridRow[]>([]);
	filters = $state<Filters>({
		crop: '',
		bedId: '',
		block: '',
		status: '',
		fromWeek: '',
		toWeek: '',
		warningsOnly: false
	});
	sort = $state<{ col: string; desc: boolean } | null>(null);
	groupBy = $state<GroupBy>('none');
	hidden = $state<string[]>([]);
	focus = $state<CellRef>({ r: 0, c: 0 });
	anchor = $state<CellRef>({ r: 0, c: 0 });
	editing = $state<{ key: string; col: string; text: string; typed: boolean } | null>(null);
	pendingPaste = $state.raw<PendingPaste | null>(null);
	message = $state<string>('');
	undoStack = $state.raw<UndoEntry[]>([]);
	redoStack = $state.raw<UndoEntry[]>([]);

	readonly lookups: Lookups;
	readonly farm: GridFarm;
	readonly role: Role;
	readonly editable: ReadonlySet<PlantingField>;
	readonly save: SaveQueue;
	private byKey = new Map<string, GridRow>();
	/** One reactive box per row (its latest GridRow), for the drawn cells: see current(). */
	private boxes = new Map<string, RowBox>();
	/**
	 * The view's row items by key, reused while their row object and position are unchanged:
	 * an edit then hands the virtualised rows the same item objects for every row but the
	 * edited one, so only that row's cells are drawn again (not every visible cell).
	 */
	private itemCache = new Map<string, Item & { kind: 'row' }>();
	/** The last view built with no filter, sort or grouping: its rows and items, to patch on an edit. */
	private lastPlain: { rows: GridRow[]; items: Item[] } | null = null;

	constructor(init: GridInit, api: GridApi, opts: { debounceMs?: number } = {}) {
		this.lookups = {
			varieties: init.varieties,
			varietyById: new Map(init.varieties.map((v) => [v.id, v])),
			beds: init.beds,
			bedById: new Map(init.beds.map((b) => [b.id, b])),
			locale: init.dateLocale ?? 'en-US'
		};
		this.farm = init.farm;
		this.role = init.role;
		this.editable = new Set(editableFields(init.role));
		const rows = init.plantings.map((p) => rowFromView(p, this.lookups.varietyById, init.farm));
		this.setRows(this.withConflicts(rows, null));
		this.save = new SaveQueue(this, api, init.seasonId, opts.debounceMs ?? 500);
	}

	// ---- rows

	/**
	 * `before`: the rows these replace one for one (an edit), so that only the changed ones are
	 * looked at again rather than every row of a season of thousands.
	 */
	setRows(rows: GridRow[], before?: GridRow[]): void {
		if (before && before.length === rows.length && this.replaceInPlace(rows, before)) return;
		this.rows = rows;
		this.byKey = new Map(rows.map((r) => [r.key, r]));
		for (const r of rows) this.box(r);
		if (this.boxes.size > rows.length) for (const k of this.boxes.keys()) if (!this.byKey.has(k)) this.boxes.delete(k);
	}

	/** setRows for rows that replace `before` position by position; false (nothing done) when a key moved. */
	private replaceInPlace(rows: GridRow[], before: GridRow[]): boolean {
		for (let i = 0; i < rows.length; i++) if (rows[i] !== before[i] && rows[i].key !== before[i].key) return false;
		this.rows = rows;
		for (let i = 0; i < rows.length; i++) {
			const r = rows[i];
			if (r === before[i]) continue;
			this.byKey.set(r.key, r);
			this.box(r);
		}
		return true;
	}

	/** The row's reactive box holds this row object (a new box for a new key). */
	private box(r: GridRow): void {
		const box = this.boxes.get(r.key);
		if (!box) this.boxes.set(r.key, new RowBox(r));
		else if (box.current !== r) box.current = r;
	}

	row(key: string): GridRow | undefined {
		return this.byKey.get(key);
	}

	/**
	 * The row by key, read reactively row by row: a cell drawn from this wakes up only when its
	 * own row changes, so an edit redraws the edited row and nothing else.
	 */
	current(key: string): GridRow | undefined {
		return this.boxes.get(key)?.current;
	}

	/** Conflicts recalculated for the given beds only (all beds when null): an edit touches one or two. */
	private withConflicts(rows: GridRow[], beds: Set<number | null> | null): GridRow[] {
		const affected = beds === null ? rows : rows.filter((r) => beds.has(r.values.bedId));
		const input = affected
			.filter((r) => r.derived)
			.map((r) => ({
				id: r.key,
				bedId: r.values.bedId,
				startFt: r.values.startFt,
				lengthFt: r.values.lengthFt,
				fieldDate: r.values.fieldDate,
				lastHarvest: r.derived!.lastHarvest
			}));
		const found = plantingConflicts(input, this.lookups.beds, this.farm.turnaroundDays);
		return rows.map((r) => {
			if (beds !== null && !beds.has(r.values.bedId)) return r;
			const c = found.get(r.key) ?? [];
			return c.length === 0 && r.conflicts.length === 0 ? r : { ...r, conflicts: c };
		});
	}

	/** Replaces rows by key (recalculating derived figures and bed conflicts), returns nothing. */
	replaceRows(updated: GridRow[], oldBeds: (number | null)[] = []): void {
		const map = new Map(updated.map((r) => [r.key, withDerived(r, this.lookups.varietyById, this.farm)]));
		const beds = new Set<number | null>(oldBeds);
		for (const r of map.values()) beds.add(r.values.bedId);
		const next = this.rows.map((r) => {
			const u = map.get(r.key);
			if (u) beds.add(r.values.bedId);
			return u ?? r;
		});
		this.setRows(this.withConflicts(next, beds), this.rows);
	}

	// ---- view

	columns = $derived(allColumns.filter((c) => !this.hidden.includes(c.id)));

	view = $derived.by((): { rows: GridRow[]; items: Item[] } => this.buildView());

	private buildView(): { rows: GridRow[]; items: Item[] } {
		const f = this.filters;
		const l = this.lookups;
		const from = f.fromWeek ? safeWeekStart(f.fromWeek) : null;
		const to = f.toWeek ? safeWeekStart(f.toWeek) : null;
		const toEnd = to ? addDays(to, 6) : null;
		const filtered = !!(f.crop || f.bedId || f.block || f.status || f.warningsOnly || from || toEnd);
		let rows = !filtered
			? this.rows
			: this.rows.filter((r) => {
					const v = l.varietyById.get(r.values.varietyId);
					if (f.crop && v?.crop !== f.crop) return false;
					if (f.bedId && String(r.values.bedId ?? '') !== f.bedId) return false;
					if (f.block && (r.values.bedId === null || l.bedById.get(r.values.bedId)?.blockName !== f.block))
						return false;
					if (f.status && r.values.status !== f.status) return false;
					if (f.warningsOnly && warningLabels(r).length === 0) return false;
					// In the ground during the weeks: field date up to last harvest overlaps the range.
					const end = r.derived?.lastHarvest ?? r.values.fieldDate;
					if (from && end < from) return false;
					if (toEnd && r.values.fieldDate > toEnd) return false;
					return true;
				});
		const s = this.sort;
		const col = s ? allColumns.find((c) => c.id === s.col) : undefined;
		const group = this.groupBy;
		const groupKey = (r: GridRow): string =>
			group === 'bed'
				? r.values.bedId === null
					? '~not placed'
					: (() => {
							const b = l.bedById.get(r.values.bedId!);
							return b ? bedLabel(b) : '?';
						})()
				: (l.varietyById.get(r.values.varietyId)?.crop ?? '?');
		if (col || group !== 'none') {
			const keyed = rows.map((r) => ({ r, g: group === 'none' ? '' : groupKey(r), v: col ? col.sortValue(r, l) : 0 }));
			keyed.sort((a, b) => (a.g < b.g ? -1 : a.g > b.g ? 1 : 0) || (col ? cmp(a.v, b.v) * (s!.desc ? -1 : 1) : 0));
			rows = keyed.map((k) => k.r);
		}
		// The usual edit: no filter, sort or grouping, the same rows in the same places but one or
		// two replaced. Patch the last list of items rather than rebuild thousands of them.
		const last = this.lastPlain;
		if (!filtered && !col && group === 'none' && last && last.rows.length === rows.length) {
			let items: Item[] | null = last.items;
			let copied = false;
			for (let i = 0; i < rows.length; i++) {
				const r = rows[i];
				if (r === last.rows[i]) continue;
				if (r.key !== last.rows[i].key) {
					items = null;
					break;
				}
				if (!copied) {
					items = last.items.slice();
					copied = true;
				}
				const item = { kind: 'row' as const, row: r, index: i };
				items![i] = item;
				this.itemCache.set(r.key, item);
			}
			if (items) {
				this.lastPlain = { rows, items };
				return { rows, items };
			}
		}
		const items: Item[] = [];
		const prevItems = this.itemCache;
		const nextItems = new Map<string, Item & { kind: 'row' }>();
		const rowItem = (row: GridRow, index: number): Item => {
			const old = prevItems.get(row.key);
			const item = old && old.row === row && old.index === index ? old : { kind: 'row' as const, row, index };
			nextItems.set(row.key, item);
			return item;
		};
		if (group === 'none') rows.forEach((row, index) => items.push(rowItem(row, index)));
		else {
			let current: { label: string; totals: GroupTotals } | null = null;
			rows.forEach((row, index) => {
				const label = groupKey(row).replace(/^~/, '');
				if (!current || current.label !== label) {
					current = { label, totals: { bedFeet: 0, grams: 0, yield: {}, count: 0 } };
					items.push({ kind: 'group', ...current });
				}
				const t = current.totals;
				t.count++;
				t.bedFeet += row.values.lengthFt;
				t.grams += row.derived?.seed.grams ?? 0;
				const unit = l.varietyById.get(row.values.varietyId)?.harvestUnit ?? '?';
				t.yield[unit] = (t.yield[unit] ?? 0) + (row.derived?.expectedYield ?? 0);
				items.push(rowItem(row, index));
			});
		}
		this.itemCache = nextItems;
		this.lastPlain = !filtered && !col && group === 'none' ? { rows, items } : null;
		return { rows, items };
	}

	canEdit(row: GridRow | undefined, col: GridColumn): boolean {
		return !!row && !!col.field && this.editable.has(col.field);
	}

	// ---- selection

	/** Derived once per move, not once per cell that asks. */
	range = $derived.by((): { r0: number; r1: number; c0: number; c1: number } => ({
		r0: Math.min(this.anchor.r, this.focus.r),
		r1: Math.max(this.anchor.r, this.focus.r),
		c0: Math.min(this.anchor.c, this.focus.c),
		c1: Math.max(this.anchor.c, this.focus.c)
	}));

	moveTo(r: number, c: number, extend = false): void {
		const rows = this.view.rows.length;
		const cols = this.columns.length;
		this.focus = { r: clamp(r, 0, Math.max(0, rows - 1)), c: clamp(c, 0, Math.max(0, cols - 1)) };
		if (!extend) this.anchor = { ...this.focus };
	}

	move(dr: number, dc: number, extend = false): void {
		this.moveTo(this.focus.r + dr, this.focus.c + dc, extend);
	}

	/** Tab walks across, wrapping to the next row's first column. */
	tab(back: boolean): void {
		const cols = this.columns.length;
		let { r, c } = this.focus;
		c += back ? -1 : 1;
		if (c >= cols) [r, c] = [r + 1, 0];
		if (c < 0) [r, c] = [r - 1, cols - 1];
		this.moveTo(r, c);
	}

	/** Focuses and selects the row of a planting (the timeline links here); false when it is not shown. */
	selectPlanting(id: number): boolean {
		const index = this.view.rows.findIndex((r) => r.id === id);
		if (index < 0) {
			this.message = `Planting #${id} is not in this view of the season.`;
			return false;
		}
		this.moveTo(index, this.focus.c);
		return true;
	}

	focusRow(): GridRow | undefined {
		return this.view.rows[this.focus.r];
	}

	focusColumn(): GridColumn | undefined {
		return this.columns[this.focus.c];
	}

	// ---- editing

	beginEdit(initial?: string): boolean {
		const row = this.focusRow();
		const col = this.focusColumn();
		if (!row || !col) return false;
		if (!this.canEdit(row, col)) {
			this.message = col.field
				? `${col.label} is read-only for your role.`
				: `${col.label} is worked out from the other columns.`;
			return false;
		}
		const err = col.field ? row.errors[col.field] : undefined;
		this.editing = {
			key: row.key,
			col: col.id,
			text: initial ?? err?.text ?? col.text?.(row, this.lookups) ?? '',
			typed: initial !== undefined
		};
		return true;
	}

	cancelEdit(): void {
		this.editing = null;
	}

	/** Commits the editor's text; false (and the editor stays open) when the text is invalid. */
	commitEdit(): boolean {
		const e = this.editing;
		if (!e) return true;
		const row = this.row(e.key);
		const col = allColumns.find((c) => c.id === e.col);
		if (!row || !col?.field) return ((this.editing = null), true);
		const check = readCell(col, e.text, row, this.lookups);
		if (!check.ok) {
			this.replaceRows([{ ...row, errors: { ...row.errors, [col.field]: { text: e.text, message: check.message } } }]);
			this.message = `${col.label}: ${check.message}`;
			return false;
		}
		this.editing = null;
		this.applyChanges([{ key: row.key, field: col.field, value: check.value }]);
		return true;
	}

	/** Sets fields of rows as one undo step, then queues the save. */
	applyChanges(list: { key: string; field: PlantingField; value: unknown }[], record = true): Change[] {
		const byRow = new Map<string, GridRow>();
		const changes: Change[] = [];
		const oldBeds: (number | null)[] = [];
		for (const c of list) {
			const cur = byRow.get(c.key) ?? this.row(c.key);
			if (!cur || !this.editable.has(c.field)) continue;
			const before = cur.values[c.field];
			const errors = { ...cur.errors };
			delete errors[c.field];
			let values = { ...cur.values, [c.field]: c.value } as RowValues;
			// A new variety brings its own method along (direct or transplant).
			if (c.field === 'varietyId' && before !== c.value) {
				const v = this.lookups.varietyById.get(c.value as number);
				if (v) values = { ...values, method: v.method };
			}
			if (c.field === 'bedId') oldBeds.push(cur.values.bedId);
			byRow.set(c.key, { ...cur, values, errors });
			if (before !== c.value) changes.push({ key: c.key, field: c.field, before, after: c.value });
			if (c.field === 'varietyId' && values.method !== cur.values.method)
				changes.push({ key: c.key, field: 'method', before: cur.values.method, after: values.method });
		}
		if (byRow.size === 0) return [];
		this.replaceRows([...byRow.values()], oldBeds);
		if (changes.length) {
			if (record) this.pushUndo({ kind: 'cells', changes });
			for (const ch of changes) this.save.markDirty(ch.key, ch.field);
		}
		return changes;
	}

	private pushUndo(e: UndoEntry): void {
		const next = [...this.undoStack, e];
		this.undoStack = next.length > UNDO_LIMIT ? next.slice(next.length - UNDO_LIMIT) : next;
		this.redoStack = [];
	}

	undo(): void {
		const e = this.undoStack.at(-1);
		if (!e) return;
		this.undoStack = this.undoStack.slice(0, -1);
		this.redoStack = [...this.redoStack, e];
		this.replay(e, true);
	}

	redo(): void {
		const e = this.redoStack.at(-1);
		if (!e) return;
		this.redoStack = this.redoStack.slice(0, -1);
		this.undoStack = [...this.undoStack, e];
		this.replay(e, false);
	}

	private replay(e: UndoEntry, backwards: boolean): void {
		if (e.kind === 'cells') {
			const list = (backwards ? [...e.changes].reverse() : e.changes).map((c) => ({
				key: c.key,
				field: c.field,
				value: backwards ? c.before : c.after
			}));
			this.applyChanges(list, false);
		} else if ((e.kind === 'add') === backwards) this.dropRows(e.rows.map((r) => r.key));
		else this.insertRows(e.rows.map((r) => ({ ...r, id: null, version: 0 })));
		this.message = `${backwards ? 'Undid' : 'Redid'} ${e.kind === 'cells' ? `${e.changes.length} change${e.changes.length === 1 ? '' : 's'}` : e.kind === 'add' ? 'adding rows' : 'removing rows'}.`;
	}

	// ---- rows added and removed

	private insertRows(rows: GridRow[], after?: string): void {
		const fresh = rows.map((r) => withDerived(r, this.lookups.varietyById, this.farm));
		const list = [...this.rows];
		const at = after ? list.findIndex((r) => r.key === after) + 1 : list.length;
		list.splice(at > 0 ? at : list.length, 0, ...fresh);
		this.setRows(this.withConflicts(list, new Set(fresh.map((r) => r.values.bedId))));
		for (const r of fresh) this.save.markNew(r.key);
	}

	private dropRows(keys: string[]): void {
		const gone = keys.map((k) => this.row(k)).filter((r): r is GridRow => !!r);
		this.setRows(
			this.withConflicts(
				this.rows.filter((r) => !keys.includes(r.key)),
				new Set(gone.map((r) => r.values.bedId))
			)
		);
		for (const r of gone) this.save.markRemoved(r);
	}

	/** Ctrl+Enter: a new row like the focused one (the next succession is usually the same crop). */
	addRow(): boolean {
		if (!can(this.role, 'plan.edit')) return ((this.message = 'Only the owner adds plantings.'), false);
		const base = this.focusRow();
		const values: RowValues = base
			? {
					...base.values,
					status: 'planned',
					actualTraySowDate: null,
					actualFieldDate: null,
					actualFirstHarvest: null,
					actualLastHarvest: null,
					notes: null
				}
			: defaultValues(this.lookups.varieties[0]);
		const row = this.newRow(values);
		this.insertRows([row], base?.key);
		this.pushUndo({ kind: 'add', rows: [row] });
		const index = this.view.rows.findIndex((r) => r.key === row.key);
		if (index >= 0) this.moveTo(index, this.focus.c);
		return true;
	}

	newRow(values: RowValues): GridRow {
		return {
			key: `n${++newKey}`,
			id: null,
			version: 0,
			values,
			harvestDays: null,
			derived: null,
			deriveError: null,
			conflicts: [],
			errors: {},
			updatedBy: null
		};
	}

	/** Removes the selected rows (owner); undo puts them back as new rows. */
	removeSelected(): boolean {
		if (!can(this.role, 'plan.edit')) return ((this.message = 'Only the owner removes plantings.'), false);
		const { r0, r1 } = this.range;
		const rows = this.view.rows.slice(r0, r1 + 1);
		if (!rows.length) return false;
		this.dropRows(rows.map((r) => r.key));
		this.pushUndo({ kind: 'remove', rows });
		this.moveTo(r0, this.focus.c);
		this.message = `Removed ${rows.length} planting${rows.length === 1 ? '' : 's'} (Ctrl+Z puts ${rows.length === 1 ? 'it' : 'them'} back).`;
		return true;
	}

	// ---- range operations

	private selectedCells(): { row: GridRow; col: GridColumn; r: number; c: number }[] {
		const { r0, r1, c0, c1 } = this.range;
		const out = [];
		for (let r = r0; r <= r1; r++)
			for (let c = c0; c <= c1; c++) {
				const row = this.view.rows[r];
				const col = this.columns[c];
				if (row && col) out.push({ row, col, r, c });
			}
		return out;
	}

	/** Ctrl+D: the top row of the selection copied into the rows below it. */
	fillDown(): void {
		const { r0, r1, c0, c1 } = this.range;
		if (r1 === r0) return;
		const top = this.view.rows[r0];
		const list: { key: string; field: PlantingField; value: unknown }[] = [];
		for (let c = c0; c <= c1; c++) {
			const col = this.columns[c];
			if (!col || !this.canEdit(top, col)) continue;
			for (let r = r0 + 1; r <= r1; r++)
				list.push({ key: this.view.rows[r].key, field: col.field!, value: top.values[col.field!] });
		}
		this.applyChanges(list);
	}

	/** Delete: clears the cells that may be empty (bed, notes, actual dates). */
	clearSelected(): void {
		const nullable: PlantingField[] = [
			'bedId',
			'notes',
			'actualTraySowDate',
			'actualFieldDate',
			'actualFirstHarvest',
			'actualLastHarvest'
		];
		const list = this.selectedCells()
			.filter(({ row, col }) => this.canEdit(row, col) && nullable.includes(col.field!))
			.map(({ row, col }) => ({ key: row.key, field: col.field!, value: null }));
		if (!list.length) this.message = 'Nothing here can be left empty.';
		this.applyChanges(list);
	}

	/** Ctrl+C: the selection as tab-separated text, the way spreadsheets exchange ranges. */
	copyText(): string {
		const { r0, r1, c0, c1 } = this.range;
		const lines: string[] = [];
		for (let r = r0; r <= r1; r++) {
			const row = this.view.rows[r];
			if (!row) continue;
			const cells: string[] = [];
			for (let c = c0; c <= c1; c++)
				cells.push((this.columns[c]?.text?.(row, this.lookups) ?? '').replace(/[\t\n\r]+/g, ' '));
			lines.push(cells.join('\t'));
		}
		return lines.join('\n');
	}

	/**
	 * Ctrl+V: tab-separated text laid from the focused cell. Every cell is checked with the
	 * column's schema; rows past the end become new rows (owner). With bad cells nothing is
	 * saved until the user confirms saving the good ones (`confirmPaste`).
	 */
	paste(text: string): PendingPaste {
		const lines = text
			.replace(/\r\n?/g, '\n')
			.replace(/\n$/, '')
			.split('\n')
			.map((l) => l.split('\t'));
		const { r: r0, c: c0 } = this.focus;
		const out: PendingPaste = { changes: [], newRows: [], bad: [], notes: [] };
		const template = this.view.rows[this.view.rows.length - 1]?.values ?? defaultValues(this.lookups.varieties[0]);
		lines.forEach((cells, i) => {
			const r = r0 + i;
			let row = this.view.rows[r];
			const isNew = !row;
			if (isNew) {
				if (!can(this.role, 'plan.edit')) {
					out.bad.push({ row: r + 1, column: '—', text: cells.join(' '), message: 'Only the owner adds plantings.' });
					return;
				}
				row = this.newRow({
					...template,
					status: 'planned',
					notes: null,
					actualTraySowDate: null,
					actualFieldDate: null,
					actualFirstHarvest: null,
					actualLastHarvest: null
				});
			}
			let values = { ...row.values };
			const failed: PlantingField[] = [];
			cells.forEach((text, j) => {
				const col = this.columns[c0 + j];
				if (!col) return;
				if (!this.canEdit(row, col)) {
					// Pasting the same text back over a read-only cell is harmless (a copied block round-trips).
					if ((col.text?.(row, this.lookups) ?? '') !== text.trim())
						out.bad.push({
							row: r + 1,
							column: col.label,
							text,
							message: col.field ? 'read-only for your role' : 'worked out, not typed'
						});
					return;
				}
				const check = readCell(col, text, { ...row, values }, this.lookups);
				if (!check.ok) {
					failed.push(col.field!);
					return out.bad.push({ row: r + 1, column: col.label, text, message: check.message });
				}
				if (check.note) out.notes.push({ row: r + 1, column: col.label, text, message: check.note });
				values = { ...values, [col.field!]: check.value };
				if (col.field === 'varietyId')
					values.method = this.lookups.varietyById.get(check.value as number)?.method ?? values.method;
				if (!isNew) out.changes.push({ key: row.key, field: col.field!, value: check.value });
			});
			if (isNew) {
				// A cell that failed its check stays empty: never the previous row's bed or date. A new
				// row cannot be without a variety, a length or a field date, so it is left out, and said.
				const required = failed.filter(
					(f) =>
						f === 'varietyId' ||
						f === 'lengthFt' ||
						f === 'fieldDate' ||
						f === 'rows' ||
						f === 'inRowSpacingIn' ||
						f === 'method'
				);
				if (required.length) {
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
		if (out.bad.length === 0 && out.notes.length === 0) this.applyPaste(out);
		else this.pendingPaste = out;
		return out;
	}

	confirmPaste(): void {
		if (this.pendingPaste) this.applyPaste(this.pendingPaste);
		this.pendingPaste = null;
	}

	cancelPaste(): void {
		this.pendingPaste = null;
		this.message = 'Paste cancelled: nothing changed.';
	}

	private applyPaste(p: PendingPaste): void {
		const changed = this.applyChanges(p.changes, false);
		const rows = p.newRows.map((v) => this.newRow(v));
		if (rows.length) this.insertRows(rows);
		if (changed.length) this.pushUndo({ kind: 'cells', changes: changed });
		if (rows.length) this.pushUndo({ kind: 'add', rows });
		this.message = `Pasted ${p.changes.length} cell${p.changes.length === 1 ? '' : 's'}${rows.length ? ` and ${rows.length} new row${rows.length === 1 ? '' : 's'}` : ''}${p.bad.length ? `; left out ${p.bad.length} bad cell${p.bad.length === 1 ? '' : 's'}` : ''}.`;
	}

	/** The server's answer for a row: id, version, authoritative values (unless edited meanwhile). */
	acceptServer(key: string, p: PlantingView, keepValues: boolean): void {
		const cur = this.row(key);
		if (!cur) return;
		const values = keepValues ? cur.values : rowFromView(p, this.lookups.varietyById, this.farm).values;
		this.replaceRows(
			[{ ...cur, id: p.id, version: p.version, values, updatedBy: p.updatedBy ?? null }],
			[cur.values.bedId]
		);
	}
}

/** A new row's values: each field's initial value (plantings/fields.ts), ten bed-feet sown today. */
export function defaultValues(v: GridVariety | undefined): RowValues {
	const out = Object.fromEntries(plantingFieldNames.map((f) => [f, initialValue(f, v)]));
	return { ...out, varietyId: v?.id ?? 0, lengthFt: 10, fieldDate: new Date().toISOString().slice(0, 10) } as RowValues;
}

function clamp(x: number, lo: number, hi: number): number {
	return Math.min(hi, Math.max(lo, x));
}

function cmp(a: string | number, b: string | number): number {
	return a < b ? -1 : a > b ? 1 : 0;
}

function safeWeekStart(w: string): string | null {
	try {
		return weekStart(w);
	} catch {
		return null;
	}
}
