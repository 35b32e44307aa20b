// The season workbook in the farm's units: rows are worked out in the database's units (rows.ts)
// and converted here, column by column, from the layout's measures; the import converts back.
import type { UnitSystem } from '$lib/format';
import { canonicalHarvestUnit, fromFileValue, toFileValue } from '$lib/format/file-units';
import type { ColumnSpec, SheetSpec } from './layout';
import type { Cell, Row } from './rows';

const imperialConverts = new Set(['seedWeight', 'seedsPerWeight', 'pricePerSeedWeight']);

/** A sheet's rows as a `system` farm's file writes them. An imperial farm's rows change only in seed columns. */
export function rowsIn(spec: SheetSpec, rows: Row[], system: UnitSystem): Row[] {
	const plan = spec.columns
		.map((c, i) => ({ c, i, per: c.units?.per ? spec.columns.findIndex((x) => x.key === c.units!.per) : -1 }))
		// An imperial farm's files keep the database's units except seed (grams stored, ounces shown).
		.filter(({ c }) => c.units && (system === 'metric' || imperialConverts.has(c.units.measure)));
	if (!plan.length) return rows;
	return rows.map((row) => {
		const out = row.slice();
		for (const { c, i, per } of plan) {
			const unit = per >= 0 ? row[per] : null;
			out[i] = toFileValue(c.units!.measure, row[i], system, typeof unit === 'string' ? unit : null) as Cell;
		}
		return out;
	});
}

/** The system a header names, for a column whose header matched one of its two forms. */
export function systemOfHeader(c: ColumnSpec, header: string): UnitSystem {
	const norm = (s: string): string => s.trim().toLowerCase().replace(/\s+/g, ' ');
	return c.units && norm(header) === norm(c.units.metric) && norm(c.units.metric) !== norm(c.header)
		? 'metric'
		: 'imperial';
}

/**
 * One read row's measured cells back to the database's units, in place. `systems` gives each
 * column key the system its header named; a harvest measure's weight is the one its row's unit
 * cell names ("kg" or "lb"; a count converts only its length part). Cells that are not numbers are
 * left for the row's schema to refuse.
 */
export function cellsToCanonical(
	spec: SheetSpec,
	cells: Record<string, unknown>,
	systems: Record<string, UnitSystem>
): void {
	const units: [string, string][] = [];
	for (const c of spec.columns) {
		const u = c.units;
		if (!u || !(c.key in cells)) continue;
		const v = cells[c.key];
		if (u.measure === 'harvestUnit') {
			// Renamed after every figure of the row is read, which needs the name as the file gives it.
			if (typeof v === 'string' && !c.derived) units.push([c.key, canonicalHarvestUnit(v)]);
			continue;
		}
		if (typeof v !== 'number' || !Number.isFinite(v)) continue;
		const system = systems[c.key] ?? 'imperial';
		let unit: string | null = null;
		if (u.per) {
			const cell = cells[u.per];
			// Without its unit cell a harvest figure cannot be told kg from lb: it is left as it stands
			// (the import works expected yields out again from the row's figures anyway).
			if (typeof cell !== 'string') continue;
			unit = cell;
		}
		cells[c.key] = fromFileValue(u.measure, v, system, u.digits, unit);
	}
	for (const [key, unit] of units) cells[key] = unit;
}
