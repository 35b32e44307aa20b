// The bridge between the grid's rows and the planning engine, used by the browser (instant
// recalculation) and by the server (authoritative figures on save) alike. Pure: no I/O.
import type { Variety } from '$lib/planning';
import type { VarietyView } from '$lib/types';
import { toEngineVariety } from '$lib/engine-inputs';
import { derivePlanting, type DeriveFarm, type DerivedPlanting } from '$lib/planning/planting-derive';

/** A variety as the grid receives it: the crop library's view, plain JSON. */
export type GridVariety = VarietyView;

export interface GridBed {
	id: number;
	name: string;
	blockId: number;
	blockName: string;
	lengthFt: number;
}

export interface GridFarm extends DeriveFarm {
	turnaroundDays: number;
	bedFootIncrement: number;
}

/** The engine's form of a library variety, shared with the server's planner. */
export const engineVariety: (v: GridVariety) => Variety = toEngineVariety;

export interface DeriveRow {
	method: 'direct' | 'transplant';
	fieldDate: string;
	lengthFt: number;
	rows: number;
	inRowSpacingIn: number;
	seedsPerSpot: number;
	/** Days of harvest the stored planting keeps (see storedHarvestDays); absent for a new row. */
	harvestDays?: number | null;
}

/**
 * Days of harvest a stored planting keeps: last − first harvest + 1, so a planting whose plan
 * stopped its harvest early keeps doing so when the grid or the server derives it again.
 */
export function storedHarvestDays(
	firstHarvest: string | null | undefined,
	lastHarvest: string | null | undefined
): number | null {
	if (!firstHarvest || !lastHarvest) return null;
	const a = Date.parse(`${firstHarvest}T00:00:00Z`);
	const b = Date.parse(`${lastHarvest}T00:00:00Z`);
	if (!Number.isFinite(a) || !Number.isFinite(b) || b < a) return null;
	return Math.round((b - a) / 86_400_000) + 1;
}

/** Derived figures, or the engine's complaint (field and message) when the row cannot be worked out. */
export function deriveRow(
	row: DeriveRow,
	variety: GridVariety,
	farm: GridFarm,
	explain = false
): { ok: true; value: DerivedPlanting } | { ok: false; field: string; message: string } {
	try {
		return { ok: true, value: derivePlanting(row, engineVariety(variety), farm, { explain }) };
	} catch (e) {
		const err = e as { field?: string; message?: string };
		return { ok: false, field: err.field ?? 'fieldDate', message: err.message ?? String(e) };
	}
}
