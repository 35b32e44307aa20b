import { forecast } from './forecast';
import type { KeptPlanting } from './season-types';

/** What the kept plantings supply, per crop id and ISO week (curves and cut-short windows followed). */
export function keptSupply(kept: KeptPlanting[]): Map<string, Map<string, number>> {
	const out = new Map<string, Map<string, number>>();
	if (kept.length === 0) return out;
	const rows = forecast(
		kept.map((k) => ({
			crop: k.cropId,
			firstHarvest: k.firstHarvest,
			lastHarvest: k.lastHarvest,
			bedFeet: k.lengthFt,
			yieldPerBedFoot: k.yieldPerBedFoot,
			curve: k.curve,
			windowDays: k.windowDays
		})),
		[]
	);
	for (const r of rows) (out.get(r.crop) ?? out.set(r.crop, new Map()).get(r.crop)!).set(r.week, r.supply);
	return out;
}
