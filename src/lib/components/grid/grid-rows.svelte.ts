// The grid's rows: the season's plantings as GridRows, found by key, with their derived figures and
// bed conflicts kept up to date. Each row also sits in a reactive holder of its own (`current`) so a
// drawn cell wakes only when its own row changes.
import { plantingConflicts } from '$lib/planning/planting-derive';
import type { GridFarm } from '$lib/plantings/derive';
import type { Lookups } from './columns';
import type { PlantingView } from '$lib/types';
import { rowFromView, withDerived, type GridRow, type RowValues } from './rows';

let newKey = 0;

/** A new row, not yet saved (no id), keyed `n<counter>` in this browser. */
export function newRow(values: RowValues): GridRow {
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

/** One row's latest GridRow, as reactive state of its own. */
class LiveRow {
	current: GridRow = $state.raw() as unknown as GridRow;
	constructor(row: GridRow) {
		this.current = row;
	}
}

export class GridRows {
	list = $state.raw<GridRow[]>([]);
	private byKey = new Map<string, GridRow>();
	private live = new Map<string, LiveRow>();

	constructor(
		private lookups: Lookups,
		private farm: GridFarm
	) {}

	/**
	 * `before`: the rows these replace one for one (an edit), so that only the changed ones are
	 * looked at again rather than every row of a season of thousands.
	 */
	set(rows: GridRow[], before?: GridRow[]): void {
		if (before && before.length === rows.length && this.replaceInPlace(rows, before)) return;
		this.list = rows;
		this.byKey = new Map(rows.map((r) => [r.key, r]));
		for (const r of rows) this.hold(r);
		if (this.live.size > rows.length) for (const k of this.live.keys()) if (!this.byKey.has(k)) this.live.delete(k);
	}

	/** set() for rows that replace `before` position by position; false (nothing done) when a key moved. */
	private replaceInPlace(rows: GridRow[], before: GridRow[]): boolean {
		for (let i = 0; i < rows.length; i++) if (rows[i] !== before[i] && rows[i].key !== before[i].key) return false;
		this.list = rows;
		for (let i = 0; i < rows.length; i++) {
			const r = rows[i];
			if (r === before[i]) continue;
			this.byKey.set(r.key, r);
			this.hold(r);
		}
		return true;
	}

	/** The row's live holder holds this row object (a new holder for a new key). */
	private hold(r: GridRow): void {
		const live = this.live.get(r.key);
		if (!live) this.live.set(r.key, new LiveRow(r));
		else if (live.current !== r) live.current = r;
	}

	get(key: string): GridRow | undefined {
		return this.byKey.get(key);
	}

	/** The row by key, read reactively row by row: an edit redraws the edited row and nothing else. */
	current(key: string): GridRow | undefined {
		return this.live.get(key)?.current;
	}

	/** Conflicts recalculated for the given beds only (all beds when null): an edit touches one or two. */
	withConflicts(rows: GridRow[], beds: Set<number | null> | null): GridRow[] {
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

	/** Replaces rows by key, recalculating derived figures and the conflicts of their old and new beds. */
	replace(updated: GridRow[], oldBeds: (number | null)[] = []): void {
		const map = new Map(updated.map((r) => [r.key, withDerived(r, this.lookups.varietyById, this.farm)]));
		const beds = new Set<number | null>(oldBeds);
		for (const r of map.values()) beds.add(r.values.bedId);
		const next = this.list.map((r) => {
			const u = map.get(r.key);
			if (u) beds.add(r.values.bedId);
			return u ?? r;
		});
		this.set(this.withConflicts(next, beds), this.list);
	}

	/** Puts rows in after the row keyed `after` (at the end without one); returns them as derived. */
	insert(rows: GridRow[], after?: string): GridRow[] {
		const fresh = rows.map((r) => withDerived(r, this.lookups.varietyById, this.farm));
		const list = [...this.list];
		const at = after ? list.findIndex((r) => r.key === after) + 1 : list.length;
		list.splice(at > 0 ? at : list.length, 0, ...fresh);
		this.set(this.withConflicts(list, new Set(fresh.map((r) => r.values.bedId))));
		return fresh;
	}

	/** Takes rows out by key; returns those that were there. */
	drop(keys: string[]): GridRow[] {
		const gone = keys.map((k) => this.get(k)).filter((r): r is GridRow => !!r);
		const out = new Set(keys);
		this.set(
			this.withConflicts(
				this.list.filter((r) => !out.has(r.key)),
				new Set(gone.map((r) => r.values.bedId))
			)
		);
		return gone;
	}

	/** The server's answer for a row: id, version, authoritative values (unless edited meanwhile). */
	accept(key: string, p: PlantingView, keepValues: boolean): void {
		const cur = this.get(key);
		if (!cur) return;
		const values = keepValues ? cur.values : rowFromView(p, this.lookups.varietyById, this.farm).values;
		this.replace(
			[{ ...cur, id: p.id, version: p.version, values, updatedBy: p.updatedBy ?? null }],
			[cur.values.bedId]
		);
	}

	/**
	 * The server's plantings laid over these rows, matched by id: a newer version replaces the row's
	 * values (its key stays, so the focus and an open editor stay on it); rows the server has and this
	 * list has not come in at the end; saved rows the server no longer has go. New rows (no id) stay.
	 */
	merge(plantings: PlantingView[]): void {
		const byId = new Map<number, GridRow>();
		for (const r of this.list) if (r.id !== null) byId.set(r.id, r);
		const seen = new Set<number>();
		const changed: GridRow[] = [];
		const oldBeds: (number | null)[] = [];
		const added: GridRow[] = [];
		for (const p of plantings) {
			seen.add(p.id);
			const cur = byId.get(p.id);
			if (!cur) added.push(rowFromView(p, this.lookups.varietyById, this.farm));
			else if (p.version > cur.version) {
				changed.push({ ...rowFromView(p, this.lookups.varietyById, this.farm), key: cur.key });
				oldBeds.push(cur.values.bedId);
			}
		}
		const gone = this.list.filter((r) => r.id !== null && !seen.has(r.id)).map((r) => r.key);
		if (changed.length) this.replace(changed, oldBeds);
		if (gone.length) this.drop(gone);
		if (added.length) this.insert(added);
	}
}
