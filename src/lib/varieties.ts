// The crop library's variety, as the planning engine takes it. Shared by the server's planner
// and the browser's grid, so both plan from the same figures.
import type { SeasonVariety } from '$lib/planning';
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
		cache.set(v, out);
	}
	return out;
}
