// The forecast page's data in the browser: fetched from the API, and fetched again whenever
// the plan may have changed — the window regains focus, the tab becomes visible, or another
// part of the app dispatches `furrowcast:plan-changed` on window.
import type { ForecastApiRow } from '$lib/components/charts/forecast-series';
import type { ForecastAnswer, ForecastSeriesAnswer } from '$lib/api-answers';
import { PLAN_CHANGED_EVENT } from '$lib/plan-changed';
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

export interface Query {
	from: string;
	to: string;
	/** Crop ids, or null for every crop with figures. */
	crops: string[] | null;
}

export class ForecastData {
	// Raw: thousands of rows are replaced whole on each fetch, never mutated, so no deep proxy.
	data = $state.raw<ForecastResponse | null>(null);
	error = $state<string | null>(null);
	loading = $state(false);
	/** How many responses have arrived: lets tests and the bench see a refetch land. */
	fetches = $state(0);
	/** When the latest response arrived (performance.now()), for measuring the chart's render. */
	arrivedAt = 0;
	#seq = 0;
	#seasonId: number;
	#units: UnitSystem;

	constructor(seasonId: number, units: UnitSystem = 'imperial') {
		this.#seasonId = seasonId;
		this.#units = units;
	}

	async load(q: Query): Promise<void> {
		const params = new URLSearchParams({ from: q.from, to: q.to, shape: 'series' });
		if (q.crops) params.set('crops', q.crops.join(','));
		const seq = ++this.#seq;
		this.loading = true;
		try {
			const res = await fetch(`/api/seasons/${this.#seasonId}/forecast?${params}`, {
				headers: { accept: 'application/json' }
			});
			const body = await res.json();
			if (seq !== this.#seq) return; // a newer request is on its way
			if (!res.ok) {
				this.error = body.message ?? `The forecast could not be loaded (${res.status}).`;
				return;
			}
			this.error = null;
			// The response in hand: turning it back into rows counts as part of the chart's render.
			this.arrivedAt = performance.now();
			this.data = inFarmUnits(rowsFromSeries(body as SeriesResponse), this.#units);
			this.fetches++;
		} catch {
			if (seq === this.#seq) this.error = 'The forecast could not be loaded: no connection to the server.';
		} finally {
			if (seq === this.#seq) this.loading = false;
		}
	}

	/** Calls `again` on focus, on becoming visible and on the plan-changed event; returns the cleanup. */
	watch(again: () => void): () => void {
		const visible = (): void => {
			if (document.visibilityState === 'visible') again();
		};
		window.addEventListener('focus', again);
		window.addEventListener(PLAN_CHANGED_EVENT, again);
		document.addEventListener('visibilitychange', visible);
		return () => {
			window.removeEventListener('focus', again);
			window.removeEventListener(PLAN_CHANGED_EVENT, again);
			document.removeEventListener('visibilitychange', visible);
		};
	}
}
