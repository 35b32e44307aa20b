// The crop library's variety, as the planning engine takes it. Shared by the server's planner
// and the browser's grid, so both plan from the same figures.
import {
	seedInputOf,
	seedNeed,
	type GrowingFigures,
	type SeasonVariety,
	type SeededPlanting,
	type SeedNeed
} from '$lib/planning';

export type { SeededPlanting };
import type { VarietyView } from '$lib/types';

/** Just the growing figures of a variety (a library row, an imported one), as the engine reads them. */
export function growingFigures(v: GrowingFigures): GrowingFigures {
	return {
		method: v.method,
		daysToMaturity: v.daysToMaturity,
		harvestWindowDays: v.harvestWindowDays,
		yieldPerBedFoot: v.yieldPerBedFoot,
		rows: v.rows,
		inRowSpacingIn: v.inRowSpacingIn,
		seedsPerSpot: v.seedsPerSpot,
		germinationRate: v.germinationRate,
		seedsPerGram: v.seedsPerGram
	};
}

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
			...growingFigures(v),
			daysInTray: v.daysInTray,
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

/** Seed for one planting from the engine, with the variety's germination, seed size and prices. */
export function plantingSeed(p: SeededPlanting, v: VarietyView): SeedNeed {
	return seedNeed(seedInputOf(p, toEngineVariety(v)));
}
