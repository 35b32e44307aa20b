// The forecast API's series answer turned back into the rows the charts and table read, in the farm's units.
import type { ForecastApiRow } from '$lib/components/charts/forecast-series';
import type { ForecastAnswer, ForecastSeriesAnswer } from '$lib/api-answers';
import { toDisplayQuantity, unitLabel, type UnitSystem } from '$lib/format';

/** The forecast as the page draws it: the API's answer, one row per crop-week. */
export type ForecastResponse = Omit<ForecastAnswer, 'season'>;
type SeriesResponse = Omit<ForecastSeriesAnswer, 'season'>;

/** Back to one row per crop-week (in the API's order: by crop, then week), as the charts and table read them. */
export function rowsFromSeries(body: SeriesResponse): ForecastResponse {
	const rows: ForecastApiRow[] = [];
	for (const s of body.series) {
		const actual = new Set(s.actual);
		for (let i = 0; i < body.weeks.length; i++) {
			const supply = s.supply[i];
			if (supply === null) continue;
			const demand = s.demand[i];
			// The engine's own arithmetic, so the figures match the rows shape exactly.
			rows.push({
				crop: s.crop,
				week: body.weeks[i],
				supply,
				demand,
				shortfall: Math.max(0, demand - supply),
				surplus: Math.max(0, supply - demand),
				actual: actual.has(i),
				fromStore: s.fromStore?.[i] ?? 0
			});
		}
	}
	return { from: body.from, to: body.to, weeks: body.weeks, currentWeek: body.currentWeek, crops: body.crops, rows };
}

/** The answer in the farm's units: on a metric farm pounds become kilograms (counts stay as they are). */
export function inFarmUnits(body: ForecastResponse, units: UnitSystem): ForecastResponse {
	if (units === 'imperial') return body;
	const unitOf = new Map(body.crops.map((c) => [c.id, c.unit]));
	const q = (n: number, crop: string): number => toDisplayQuantity(n, unitOf.get(crop) ?? '', units);
	return {
		...body,
		crops: body.crops.map((c) => ({ ...c, unit: unitLabel(c.unit, units, 1) })),
		rows: body.rows.map((r) => ({
			...r,
			supply: q(r.supply, r.crop),
			demand: q(r.demand, r.crop),
			shortfall: q(r.shortfall, r.crop),
			surplus: q(r.surplus, r.crop),
			fromStore: q(r.fromStore, r.crop)
		}))
	};
}
