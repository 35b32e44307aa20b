// A row of the grid: the planting's editable values, its derived figures and its warnings.
import type { BedConflict } from '$lib/planning';
import type { DerivedPlanting } from '$lib/planning/planting-derive';
import type { PlantingField, PlantingStatus } from '$lib/schemas/planting';
import type { PlantingView } from '$lib/types';
import { deriveRow, type GridFarm, type GridVariety } from './engine';

export interface RowValues {
	varietyId: number;
	bedId: number | null;
	startFt: number;
	lengthFt: number;
	rows: number;
	inRowSpacingIn: number;
	seedsPerSpot: number;
	method: 'direct' | 'transplant';
	fieldDate: string;
	status: PlantingStatus;
	actualTraySowDate: string | null;
	actualFieldDate: string | null;
	actualFirstHarvest: string | null;
	actualLastHarvest: string | null;
	notes: string | null;
}

export interface GridRow {
	/** Stable in the browser, also before the server gave the row an id. */
	key: string;
	id: number | null;
	version: number;
	values: RowValues;
	derived: DerivedPlanting | null;
	deriveError: string | null;
	conflicts: BedConflict[];
	/** A cell's rejected text and the reason, shown in place until fixed. */
	errors: Partial<Record<PlantingField, { text: string; message: string }>>;
	updatedBy: string | null;
}

export function valuesOf(p: PlantingView): RowValues {
	return {
		varietyId: p.varietyId,
		bedId: p.bedId,
		startFt: p.startFt,
		lengthFt: p.lengthFt,
		rows: p.rows,
		inRowSpacingIn: p.inRowSpacingIn,
		seedsPerSpot: p.seedsPerSpot,
		method: p.method,
		fieldDate: p.fieldDate,
		status: p.status as PlantingStatus,
		actualTraySowDate: p.actualTraySowDate ?? null,
		actualFieldDate: p.actualFieldDate ?? null,
		actualFirstHarvest: p.actualFirstHarvest ?? null,
		actualLastHarvest: p.actualLastHarvest ?? null,
		notes: p.notes
	};
}

/** The row with its derived figures recalculated by the engine (conflicts are set per bed elsewhere). */
export function withDerived(row: GridRow, varieties: Map<number, GridVariety>, farm: GridFarm): GridRow {
	const v = varieties.get(row.values.varietyId);
	if (!v) return { ...row, derived: null, deriveError: 'Unknown variety.' };
	const d = deriveRow(row.values, v, farm);
	return d.ok ? { ...row, derived: d.value, deriveError: null } : { ...row, derived: null, deriveError: d.message };
}

export function rowFromView(p: PlantingView, varieties: Map<number, GridVariety>, farm: GridFarm): GridRow {
	return withDerived(
		{ key: `p${p.id}`, id: p.id, version: p.version, values: valuesOf(p), derived: null, deriveError: null, conflicts: [], errors: {}, updatedBy: p.updatedBy ?? null },
		varieties,
		farm
	);
}
