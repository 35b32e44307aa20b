// What the grid shows of its rows: filtered, sorted and grouped (with each group's totals), as the
// list of items the virtualised table draws. Plain code, no runes: the grid state derives from it.
import { addDays, weekStart } from '$lib/planning';
import { columns as allColumns, warningLabels, bedLabel, type Lookups } from './columns';
import type { GridRow } from './rows';

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
export interface GridView {
	rows: GridRow[];
	items: Item[];
}
export interface ViewSettings {
	filters: Filters;
	sort: { col: string; desc: boolean } | null;
	groupBy: GroupBy;
}

export const noFilters = (): Filters => ({
	crop: '',
	bedId: '',
	block: '',
	status: '',
	fromWeek: '',
	toWeek: '',
	warningsOnly: false
});

/** Builds views one after another, reusing what the last one built where rows did not change. */
export class ViewBuilder {
	/**
	 * The view's row items by key, reused while their row object and position are unchanged:
	 * an edit then hands the virtualised rows the same item objects for every row but the
	 * edited one, so only that row's cells are drawn again (not every visible cell).
	 */
	private itemCache = new Map<string, Item & { kind: 'row' }>();
	/** The last view built with no filter, sort or grouping: its rows and items, to patch on an edit. */
	private lastPlain: GridView | null = null;

	constructor(private lookups: Lookups) {}

	build(all: GridRow[], { filters: f, sort: s, groupBy: group }: ViewSettings): GridView {
		const l = this.lookups;
		const filtered = isFiltered(f);
		let rows = filtered ? all.filter(rowFilter(f, l)) : all;
		const col = s ? allColumns.find((c) => c.id === s.col) : undefined;
		const groupKey = (r: GridRow): string => groupKeyOf(r, group, l);
		if (col || group !== 'none') {
			const keyed = rows.map((r) => ({ r, g: group === 'none' ? '' : groupKey(r), v: col ? col.sortValue(r, l) : 0 }));
			keyed.sort((a, b) => (a.g < b.g ? -1 : a.g > b.g ? 1 : 0) || (col ? cmp(a.v, b.v) * (s!.desc ? -1 : 1) : 0));
			rows = keyed.map((k) => k.r);
		}
		const plain = !filtered && !col && group === 'none';
		if (plain) {
			const patched = this.patchPlain(rows);
			if (patched) return patched;
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
		this.lastPlain = plain ? { rows, items } : null;
		return { rows, items };
	}

	/**
	 * The usual edit: no filter, sort or grouping, the same rows in the same places but one or
	 * two replaced. Patch the last list of items rather than rebuild thousands of them; null when
	 * a row moved or the count changed.
	 */
	private patchPlain(rows: GridRow[]): GridView | null {
		const last = this.lastPlain;
		if (!last || last.rows.length !== rows.length) return null;
		let items = last.items;
		let copied = false;
		for (let i = 0; i < rows.length; i++) {
			const r = rows[i];
			if (r === last.rows[i]) continue;
			if (r.key !== last.rows[i].key) return null;
			if (!copied) {
				items = last.items.slice();
				copied = true;
			}
			const item = { kind: 'row' as const, row: r, index: i };
			items[i] = item;
			this.itemCache.set(r.key, item);
		}
		this.lastPlain = { rows, items };
		return this.lastPlain;
	}
}

function isFiltered(f: Filters): boolean {
	return !!(
		f.crop ||
		f.bedId ||
		f.block ||
		f.status ||
		f.warningsOnly ||
		safeWeekStart(f.fromWeek) ||
		safeWeekStart(f.toWeek)
	);
}

function rowFilter(f: Filters, l: Lookups): (r: GridRow) => boolean {
	const from = safeWeekStart(f.fromWeek);
	const to = safeWeekStart(f.toWeek);
	const toEnd = to ? addDays(to, 6) : null;
	return (r) => {
		const v = l.varietyById.get(r.values.varietyId);
		if (f.crop && v?.crop !== f.crop) return false;
		if (f.bedId && String(r.values.bedId ?? '') !== f.bedId) return false;
		if (f.block && (r.values.bedId === null || l.bedById.get(r.values.bedId)?.blockName !== f.block)) return false;
		if (f.status && r.values.status !== f.status) return false;
		if (f.warningsOnly && warningLabels(r).length === 0) return false;
		// In the ground during the weeks: field date up to last harvest overlaps the range.
		const end = r.derived?.lastHarvest ?? r.values.fieldDate;
		if (from && end < from) return false;
		if (toEnd && r.values.fieldDate > toEnd) return false;
		return true;
	};
}

function groupKeyOf(r: GridRow, group: GroupBy, l: Lookups): string {
	if (group !== 'bed') return l.varietyById.get(r.values.varietyId)?.crop ?? '?';
	if (r.values.bedId === null) return '~not placed';
	const b = l.bedById.get(r.values.bedId);
	return b ? bedLabel(b) : '?';
}

function cmp(a: string | number, b: string | number): number {
	return a < b ? -1 : a > b ? 1 : 0;
}

function safeWeekStart(w: string): string | null {
	if (!w) return null;
	try {
		return weekStart(w);
	} catch {
		return null;
	}
}

// The view's settings in the page's address (`?crop=Carrot&group=bed&sort=-fieldDate`), so a reload or a
// shared link shows the same rows. Unknown or empty parameters fall back to no filter.
const filterParams: Record<Exclude<keyof Filters, 'warningsOnly'>, string> = {
	crop: 'crop',
	bedId: 'bed',
	block: 'block',
	status: 'status',
	fromWeek: 'from',
	toWeek: 'to'
};
const groupings: GroupBy[] = ['none', 'bed', 'crop'];

export function viewFromParams(params: URLSearchParams): ViewSettings {
	const filters = noFilters();
	for (const [key, name] of Object.entries(filterParams))
		filters[key as keyof typeof filterParams] = params.get(name) ?? '';
	filters.warningsOnly = params.get('warnings') === '1';
	const group = params.get('group') as GroupBy | null;
	const sortCol = params.get('sort');
	const col = sortCol?.replace(/^-/, '');
	return {
		filters,
		groupBy: group && groupings.includes(group) ? group : 'none',
		sort: col && allColumns.some((c) => c.id === col) ? { col, desc: sortCol!.startsWith('-') } : null
	};
}

/** `params` with the view's settings written in (others, like `planting`, kept); defaults left out. */
export function viewToParams(view: ViewSettings, params: URLSearchParams): URLSearchParams {
	const out = new URLSearchParams(params);
	for (const [key, name] of Object.entries(filterParams)) {
		const value = view.filters[key as keyof typeof filterParams];
		if (value) out.set(name, value);
		else out.delete(name);
	}
	if (view.filters.warningsOnly) out.set('warnings', '1');
	else out.delete('warnings');
	if (view.groupBy !== 'none') out.set('group', view.groupBy);
	else out.delete('group');
	if (view.sort) out.set('sort', `${view.sort.desc ? '-' : ''}${view.sort.col}`);
	else out.delete('sort');
	return out;
}
