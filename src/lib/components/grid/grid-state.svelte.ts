// The planting grid's state: the focused cell and selection, the cell being edited, and the edits
// themselves (cells, rows added and removed, paste, undo), each queued for saving. Plain class with
// runes, no DOM, so the unit tests drive it directly. Its parts live beside it: grid-rows (the rows),
// grid-view (filter, sort, group), edit-history (undo/redo), clipboard (copy, paste), save-queue.
import { editableFields, type PlantingField } from '$lib/schemas/planting';
import type { CellEdit } from './clipboard';
import type { Role } from '$lib/roles';
import { can } from '$lib/permissions';
import type { PlantingView } from '$lib/types';
import { columns as allColumns, readCell, type GridColumn, type Lookups } from './columns';
import type { GridBed, GridFarm, GridVariety } from '$lib/plantings/derive';
import { defaultValues, nextSuccessionValues, rowFromView, type GridRow, type RowValues } from './rows';
import { GridRows, newRow } from './grid-rows.svelte';
import { noFilters, ViewBuilder, type Filters, type GridView, type GroupBy } from './grid-view';
import { EditHistory, replayMessage, type Change, type EditStep } from './edit-history.svelte';
import {
	clearEdits,
	copyText,
	fillDownEdits,
	pasteMessage,
	readPaste,
	type PendingPaste,
	type RangeTarget
} from './clipboard';
import { SaveQueue, type GridApi } from './save-queue.svelte';

export type { Item } from './grid-view';
export { UNDO_LIMIT } from './edit-history.svelte';
export { defaultValues } from './rows';

export interface CellRef {
	r: number;
	c: number;
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
	/** The farm's unit system: lengths and spacing shown and typed in it. */
	unitSystem?: 'imperial' | 'metric';
}

export class GridState {
	filters = $state<Filters>(noFilters());
	sort = $state<{ col: string; desc: boolean } | null>(null);
	groupBy = $state<GroupBy>('none');
	hidden = $state<string[]>([]);
	focus = $state<CellRef>({ r: 0, c: 0 });
	anchor = $state<CellRef>({ r: 0, c: 0 });
	editing = $state<{ key: string; col: string; text: string; typed: boolean } | null>(null);
	pendingPaste = $state.raw<PendingPaste | null>(null);
	message = $state<string>('');

	readonly lookups: Lookups;
	readonly farm: GridFarm;
	readonly role: Role;
	readonly editable: ReadonlySet<PlantingField>;
	readonly save: SaveQueue;
	private readonly store: GridRows;
	private readonly history = new EditHistory();
	private readonly viewBuilder: ViewBuilder;

	constructor(init: GridInit, api: GridApi, opts: { debounceMs?: number; onSaved?: () => void } = {}) {
		this.lookups = {
			varieties: init.varieties,
			varietyById: new Map(init.varieties.map((v) => [v.id, v])),
			beds: init.beds,
			bedById: new Map(init.beds.map((b) => [b.id, b])),
			locale: init.dateLocale ?? 'en-US',
			units: init.unitSystem ?? 'imperial'
		};
		this.farm = init.farm;
		this.role = init.role;
		this.editable = new Set(editableFields(init.role));
		this.store = new GridRows(this.lookups, init.farm);
		this.viewBuilder = new ViewBuilder(this.lookups);
		const rows = init.plantings.map((p) => rowFromView(p, this.lookups.varietyById, init.farm));
		this.store.set(this.store.withConflicts(rows, null));
		this.save = new SaveQueue(this, api, init.seasonId, opts.debounceMs ?? 500, opts.onSaved);
	}

	// ---- rows (grid-rows.svelte.ts)

	/** Every row of the season, in the order they were loaded and added. */
	get rows(): GridRow[] {
		return this.store.list;
	}

	row(key: string): GridRow | undefined {
		return this.store.get(key);
	}

	/** The row by key, read reactively row by row: a cell drawn from it redraws with its own row only. */
	current(key: string): GridRow | undefined {
		return this.store.current(key);
	}

	/** Replaces rows by key (recalculating derived figures and bed conflicts). */
	replaceRows(updated: GridRow[], oldBeds: (number | null)[] = []): void {
		this.store.replace(updated, oldBeds);
	}

	// ---- view (grid-view.ts)

	columns = $derived(allColumns.filter((c) => !this.hidden.includes(c.id)));

	view = $derived.by((): GridView =>
		this.viewBuilder.build(this.store.list, { filters: this.filters, sort: this.sort, groupBy: this.groupBy })
	);

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
	applyChanges(list: CellEdit[], record = true): Change[] {
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
			if (record) this.history.push({ kind: 'cells', changes });
			for (const ch of changes) this.save.markDirty(ch.key, ch.field);
		}
		return changes;
	}

	// ---- undo and redo (edit-history.svelte.ts)

	get undoStack(): EditStep[] {
		return this.history.undoStack;
	}

	get redoStack(): EditStep[] {
		return this.history.redoStack;
	}

	undo(): void {
		const e = this.history.takeUndo();
		if (e) this.replay(e, true);
	}

	redo(): void {
		const e = this.history.takeRedo();
		if (e) this.replay(e, false);
	}

	private replay(e: EditStep, backwards: boolean): void {
		if (e.kind === 'cells') {
			const list = (backwards ? [...e.changes].reverse() : e.changes).map((c) => ({
				key: c.key,
				field: c.field,
				value: backwards ? c.before : c.after
			}));
			this.applyChanges(list, false);
		} else if ((e.kind === 'add') === backwards) this.dropRows(e.rows.map((r) => r.key));
		else this.insertRows(e.rows.map((r) => ({ ...r, id: null, version: 0 })));
		this.message = replayMessage(e, backwards);
	}

	// ---- rows added and removed

	private insertRows(rows: GridRow[], after?: string): void {
		for (const r of this.store.insert(rows, after)) this.save.markNew(r.key);
	}

	private dropRows(keys: string[]): void {
		for (const r of this.store.drop(keys)) this.save.markRemoved(r);
	}

	/** Ctrl+Enter: a new row like the focused one (the next succession is usually the same crop). */
	addRow(): boolean {
		if (!can(this.role, 'plan.edit')) return ((this.message = 'Only the owner adds plantings.'), false);
		const base = this.focusRow();
		const values = base ? nextSuccessionValues(base.values) : defaultValues(this.lookups.varieties[0]);
		const row = newRow(values);
		this.insertRows([row], base?.key);
		this.history.push({ kind: 'add', rows: [row] });
		const index = this.view.rows.findIndex((r) => r.key === row.key);
		if (index >= 0) this.moveTo(index, this.focus.c);
		return true;
	}

	/** Removes the selected rows (owner); undo puts them back as new rows. */
	removeSelected(): boolean {
		if (!can(this.role, 'plan.edit')) return ((this.message = 'Only the owner removes plantings.'), false);
		const { r0, r1 } = this.range;
		const rows = this.view.rows.slice(r0, r1 + 1);
		if (!rows.length) return false;
		this.dropRows(rows.map((r) => r.key));
		this.history.push({ kind: 'remove', rows });
		this.moveTo(r0, this.focus.c);
		const n = rows.length;
		this.message = `Removed ${n} planting${n === 1 ? '' : 's'} (Ctrl+Z puts ${n === 1 ? 'it' : 'them'} back).`;
		return true;
	}

	// ---- range operations

	/** Ctrl+D: the top row of the selection copied into the rows below it. */
	fillDown(): void {
		this.applyChanges(fillDownEdits(this.rangeTarget()));
	}

	/** Delete: clears the cells that may be empty (bed, notes, actual dates). */
	clearSelected(): void {
		const list = clearEdits(this.rangeTarget());
		if (!list.length) this.message = 'Nothing here can be left empty.';
		this.applyChanges(list);
	}

	private rangeTarget(): RangeTarget {
		return { rows: this.view.rows, columns: this.columns, range: this.range, canEdit: (r, c) => this.canEdit(r, c) };
	}

	// ---- clipboard (clipboard.ts)

	/** Ctrl+C: the selection as tab-separated text. */
	copyText(): string {
		return copyText(this.view.rows, this.columns, this.range, this.lookups);
	}

	/**
	 * Ctrl+V: tab-separated text laid from the focused cell. With bad cells nothing is saved until
	 * the user confirms saving the good ones (`confirmPaste`).
	 */
	paste(text: string): PendingPaste {
		const out = readPaste(text, {
			rows: this.view.rows,
			columns: this.columns,
			lookups: this.lookups,
			at: this.focus,
			mayAddRows: can(this.role, 'plan.edit'),
			canEdit: (row, col) => this.canEdit(row, col),
			newRow
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
		const rows = p.newRows.map((v) => newRow(v));
		if (rows.length) this.insertRows(rows);
		if (changed.length) this.history.push({ kind: 'cells', changes: changed });
		if (rows.length) this.history.push({ kind: 'add', rows });
		this.message = pasteMessage(p, rows.length);
	}

	// ---- the server's answers (save-queue.svelte.ts)

	/** The server's answer for a row: id, version, authoritative values (unless edited meanwhile). */
	acceptServer(key: string, p: PlantingView, keepValues: boolean): void {
		this.store.accept(key, p, keepValues);
	}

	/**
	 * The season as the server has it now, laid over the rows (GridRows.merge). Not while an edit waits
	 * or a save round began since the reload was asked (`roundsAsked`): that round asks for its own.
	 */
	refresh(plantings: PlantingView[], roundsAsked = this.save.rounds): boolean {
		if (this.save.unsaved || this.save.rounds !== roundsAsked) return false;
		this.store.merge(plantings);
		return true;
	}
}

function clamp(x: number, lo: number, hi: number): number {
	return Math.min(hi, Math.max(lo, x));
}
