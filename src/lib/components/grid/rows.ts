// A row of the grid: the planting's editable values, its derived figures and its warnings.
import type { BedConflict } from '$lib/planning';
import type { DerivedPlanting } from '$lib/planning/planting-derive';
import {
	initialValue,
	plantingFieldNames,
	recordFields,
	type PlantingField,
	type PlantingValues
} from '$lib/plantings/fields';
import type { PlantingView } from '$lib/types';
import { deriveRow, storedHarvestDays, type GridFarm, type GridVariety } from '$lib/plantings/derive';

/** A row's editable values: the planting's fields as the field table lists them. */
export type RowValues = PlantingValues;

export interface GridRow {
	/** Stable in the browser, also before the server gave the row an id. */
	key: string;
	id: number | null;
	version: number;
	values: RowValues;
	/** Days of harvest the stored planting keeps (its plan may stop the harvest early); null for a new row. */
	harvestDays: number | null;
	derived: DerivedPlanting | null;
	deriveError: string | null;
	conflicts: BedConflict[];
	/** A cell's rejected text and the reason, shown in place until fixed. */
	errors: Partial<Record<PlantingField, { text: string; message: string }>>;
	updatedBy: string | null;
}

export function valuesOf(p: PlantingView): RowValues {
	const view = p as unknown as Record<string, unknown>;
	return Object.fromEntries(plantingFieldNames.map((f) => [f, view[f] ?? null])) as RowValues;
}

/** The row with its derived figures recalculated by the engine (conflicts are set per bed elsewhere). */
export function withDerived(row: GridRow, varieties: Map<number, GridVariety>, farm: GridFarm): GridRow {
	const v = varieties.get(row.values.varietyId);
	if (!v) return { ...row, derived: null, deriveError: 'Unknown variety.' };
	const d = deriveRow({ ...row.values, harvestDays: row.harvestDays }, v, farm);
	return d.ok ? { ...row, derived: d.value, deriveError: null } : { ...row, derived: null, deriveError: d.message };
}

export function rowFromView(p: PlantingView, varieties: Map<number, GridVariety>, farm: GridFarm): GridRow {
	return withDerived(
		{
			key: `p${p.id}`,
			id: p.id,
			version: p.version,
			values: valuesOf(p),
			harvestDays: storedHarvestDays(p.firstHarvest, p.lastHarvest),
			derived: null,
			deriveError: null,
			conflicts: [],
			errors: {},
			updatedBy: p.updatedBy ?? null
		},
		varieties,
		farm
	);
}

/** A new row's values: each field's initial value (plantings/fields.ts), ten bed-feet sown today. */
export function defaultValues(v: GridVariety | undefined): RowValues {
	const out = Object.fromEntries(plantingFieldNames.map((f) => [f, initialValue(f, v)]));
	return { ...out, varietyId: v?.id ?? 0, lengthFt: 10, fieldDate: new Date().toISOString().slice(0, 10) } as RowValues;
}

/**
 * The values of a next succession like `values` (a new row after it, a pasted row past the end):
 * the plan kept, the record of what happened (status, actual dates, notes) back to a new row's.
 */
export function nextSuccessionValues(values: RowValues): RowValues {
	const cleared = Object.fromEntries(recordFields.map((f) => [f, initialValue(f, undefined)]));
	return { ...values, ...cleared } as RowValues;
}
