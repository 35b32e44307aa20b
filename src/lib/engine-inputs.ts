// The planning engine's inputs from a farm's records, built in one place: the farm as the engine
// takes it (here), a variety as the engine takes it and a planting's seed need (varieties.ts,
// re-exported). The server's plan, the grid's context, the season copy and the demo seed all build
// them through this module, so the engine sees one farm whoever asks. Pure: no I/O, and no
// SvelteKit (the demo seed runs outside it).
import type { Farm } from '$lib/planning';

export { growingFigures, plantingSeed, toEngineVariety, type SeededPlanting } from '$lib/varieties';

/** The farm's own figures the engine reads (frost normals, latitude, the tender crops' wait). */
export interface FarmFacts {
	lastSpringFrost: string;
	firstFallFrost: string;
	latitude: number;
	tenderDaysAfterFrost?: number;
	frostProbabilityPct?: number;
}

/** Weekly normal mean temperatures by ISO week number as the engine keys them ("W05": a normal of every year). */
export function weeklyNormals(temps: Record<number, number>): Record<string, number> {
	return Object.fromEntries(Object.entries(temps).map(([w, t]) => [`W${String(w).padStart(2, '0')}`, t]));
}

/** The farm as the engine takes it, with its weekly normals (by ISO week number). */
export function engineFarm(farm: FarmFacts, temps: Record<number, number>): Farm {
	return {
		lastSpringFrost: farm.lastSpringFrost,
		firstFallFrost: farm.firstFallFrost,
		tenderDaysAfterFrost: farm.tenderDaysAfterFrost,
		frostProbabilityPct: farm.frostProbabilityPct,
		latitude: farm.latitude,
		weeklyMeanTempF: weeklyNormals(temps)
	};
}
