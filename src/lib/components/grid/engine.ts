// The bridge between the grid's rows and the planning engine, used by the browser (instant
// recalculation) and by the server (authoritative figures on save) alike. Pure: no I/O.
import type { Variety } from '$lib/planning';
import { derivePlanting, type DeriveFarm, type DerivedPlanting } from '$lib/planning/planting-derive';

/** A variety as the grid receives it (the crop library's view, plain JSON). */
export interface GridVariety {
	id: number;
	cropId: number;
	crop: string;
	family: string;
	harvestUnit: string;
	frostTolerance: 'tender' | 'hardy';
	heatLimitF: number | null;
	baseTempF: number;
	name: string;
	method: 'direct' | 'transplant';
	daysToMaturity: number;
	daysInTray: number;
	harvestWindowDays: number;
	yieldPerBedFoot: number;
	rows: number;
	inRowSpacingIn: number;
	seedsPerSpot: number;
	germinationRate: number;
	seedsPerGram: number;
	seedPriceCentsPerGram: number;
	seedsPerPacket: number | null;
	cellsPerTray: number;
	margin: number;
	gddToMaturity: number | null;
}

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

const cache = new WeakMap<GridVariety, Variety>();

export function engineVariety(v: GridVariety): Variety {
	let out = cache.get(v);
	if (!out) {
		out = {
			id: String(v.id),
			cropId: String(v.cropId),
			name: v.name,
			crop: v.crop,
			family: v.family,
			method: v.method,
			daysToMaturity: v.daysToMaturity,
			daysInTray: v.daysInTray,
			harvestWindowDays: v.harvestWindowDays,
			yieldPerBedFoot: v.yieldPerBedFoot,
			rows: v.rows,
			inRowSpacingIn: v.inRowSpacingIn,
			seedsPerSpot: v.seedsPerSpot,
			germinationRate: v.germinationRate,
			seedsPerGram: v.seedsPerGram,
			cellsPerTray: v.cellsPerTray,
			frostTender: v.frostTolerance === 'tender',
			heatLimitF: v.heatLimitF ?? undefined,
			baseTempF: v.baseTempF,
			gddToMaturity: v.gddToMaturity ?? undefined,
			seedPriceCentsPerGram: v.seedPriceCentsPerGram,
			seedsPerPacket: v.seedsPerPacket ?? undefined,
			margin: v.margin
		};
		cache.set(v, out);
	}
	return out;
}

export interface DeriveRow {
	method: 'direct' | 'transplant';
	fieldDate: string;
	lengthFt: number;
	rows: number;
	inRowSpacingIn: number;
	seedsPerSpot: number;
}

/** Derived figures, or the engine's complaint (field and message) when the row cannot be worked out. */
export function deriveRow(row: DeriveRow, variety: GridVariety, farm: GridFarm, explain = false): { ok: true; value: DerivedPlanting } | { ok: false; field: string; message: string } {
	try {
		return { ok: true, value: derivePlanting(row, engineVariety(variety), farm, { explain }) };
	} catch (e) {
		const err = e as { field?: string; message?: string };
		return { ok: false, field: err.field ?? 'fieldDate', message: err.message ?? String(e) };
	}
}
