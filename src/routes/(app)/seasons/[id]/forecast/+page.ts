import type { PageLoad } from './$types';
import type { ApiErrorAnswer, ForecastSeriesAnswer } from '$lib/api-answers';
import { inFarmUnits, rowsFromSeries, type ForecastResponse } from './forecast-rows';
import { readFigureQuery } from './forecast-query';

// The figures through SvelteKit's load: run again when the weeks or crops in the address change, and on
// `invalidate('app:plan')` (a save, the window regaining focus). Nothing secret: the JSON API checks
// the session and farm. Only the weeks, crops and family are read here, so a change of chart mode loads nothing.
export const load = (async ({ fetch, params, url, data, depends, parent }) => {
	depends('app:plan');
	const q = readFigureQuery(url.searchParams, data.weeks, data.crops);
	const search = new URLSearchParams({ from: q.from, to: q.to, shape: 'series' });
	if (q.crops.length) search.set('crops', q.crops.join(','));
	const answer = fetch(`/api/seasons/${params.id}/forecast?${search}`, { headers: { accept: 'application/json' } });
	const { display } = await parent();
	let forecast: ForecastResponse | null = null;
	let forecastError: string | null = null;
	/** When the answer arrived (performance.now()): the page measures the chart's render from here. */
	let arrivedAt = 0;
	try {
		const res = await answer;
		const body: unknown = await res.json();
		if (!res.ok)
			forecastError = (body as ApiErrorAnswer).message ?? `The forecast could not be loaded (${res.status}).`;
		else {
			// The answer in hand: turning it back into rows counts as part of the chart's render.
			arrivedAt = performance.now();
			forecast = inFarmUnits(rowsFromSeries(body as ForecastSeriesAnswer), display.unitSystem);
		}
	} catch {
		forecastError = 'The forecast could not be loaded: no connection to the server.';
	}
	return { ...data, forecast, forecastError, arrivedAt };
}) satisfies PageLoad;
