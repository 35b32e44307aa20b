// The crop library's variety, as the planning engine takes it. Shared by the server's planner
// and the browser's grid, so both plan from the same figures.
import { seedNeed, type SeasonVariety, type SeedNeed } from '$lib/planning';
import type { VarietyView } from '$lib/types';

const cache = new WeakMap<VarietyView, SeasonVariety>();

export function toEngineVariety(v: VarietyView): SeasonVariety {
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
			// Frost tolerance and heat limit are the crop's; the engine reads them per variety.
			frostTender: v.frostTolerance === 'tender',
			heatLimitF: v.heatLimitF ?? undefined,
			baseTempF: v.baseTempF,
			gddToMaturity: v.gddToMaturity ?? undefined,
			seedPriceCentsPerGram: v.seedPriceCentsPerGram,
			seedsPerPacket: v.seedsPerPacket ?? undefined,
			margin: v.margin
		};
		if (v.sowFrom && v.sowTo) {
			out.sowFrom = v.sowFrom;
			out.sowTo = v.sowTo;
		}
		if (v.harvestCurve && v.harvestCurve !== 'flat') {
			out.harvestCurve = { shape: v.harvestCurve };
			if (v.harvestCurve === 'cuts' && v.cutIntervalDays) out.harvestCurve.intervalDays = v.cutIntervalDays;
		}
		// The loss is a fraction a week; the store model takes at most all of it (as the forecast's does).
		if (v.storageWeeks && v.storageWeeks > 0)
			out.storage = {
				keepWeeks: Math.floor(v.storageWeeks),
				lossPerWeek: Math.min(0.99, Math.max(0, v.storageLossPerWeek ?? 0))
			};
		cache.set(v, out);
	}
	return out;
}

/** The fields of a planting that size its seed: its own bed-feet, rows and spacing. */
export interface SeededPlanting {
	method: 'direct' | 'transplant';
	lengthFt: number;
	rows: number;
	inRowSpacingIn: number;
	seedsPerSpot: number;
}

/** Seed for one planting from the engine, with the variety's germination, seed size and prices. */
export function plantingSeed(p: SeededPlanting, v: VarietyView): SeedNeed {
	return seedNeed({
		method: p.method,
		bedFeet: p.lengthFt,
		rows: p.rows,
		inRowSpacingIn: p.inRowSpacingIn,
		seedsPerSpot: p.seedsPerSpot,
		germinationRate: v.germinationRate,
		seedsPerGram: v.seedsPerGram,
		margin: v.margin,
		cellsPerTray: v.cellsPerTray,
		seedPriceCentsPerGram: v.seedPriceCentsPerGram,
		seedsPerPacket: v.seedsPerPacket ?? undefined
	});
}
