// What the forecast page shows, read from its address (`?from=2027-W22&to=2027-W27&crops=3,7&mode=percent`),
// so a reload or a shared link keeps it. The load reads the weeks and crops; the page reads the rest.
import type { ChartMode } from '$lib/components/charts/forecast-series';

export interface ForecastQuery {
	from: string;
	to: string;
	/** Crop ids picked, or none for every crop with figures. */
	crops: string[];
	/** The crop family the picked crops came from ('' when picked one by one). */
	family: string;
	/** null: the page chooses (% of demand when the crops' units differ). */
	mode: ChartMode | null;
	view: 'chart' | 'table';
}

export const isWeek = (w: string | null): w is string => !!w && /^\d{4}-W\d{2}$/.test(w);

type Crop = { id: string; family: string };

/**
 * What the figures depend on: the weeks (the season's first and last where none, or no week, is given)
 * and the crops (a family's, when only the family is given). The load reads only these, since SvelteKit
 * runs a load again when a parameter it read changes.
 */
export function readFigureQuery(
	params: URLSearchParams,
	weeks: string[],
	crops: Crop[]
): Omit<ForecastQuery, 'mode' | 'view'> {
	const from = params.get('from');
	const to = params.get('to');
	const family = params.get('family') ?? '';
	const picked = params.get('crops')?.split(',').filter(Boolean) ?? [];
	return {
		from: isWeek(from) ? from : weeks[0],
		to: isWeek(to) ? to : weeks[weeks.length - 1],
		crops: picked.length || !family ? picked : crops.filter((c) => c.family === family).map((c) => c.id),
		family
	};
}

/** The whole query in `params`. */
export function readForecastQuery(params: URLSearchParams, weeks: string[], crops: Crop[]): ForecastQuery {
	const mode = params.get('mode');
	return {
		...readFigureQuery(params, weeks, crops),
		mode: mode === 'percent' || mode === 'quantity' ? mode : null,
		view: params.get('view') === 'table' ? 'table' : 'chart'
	};
}

/** `params` with the given settings written in; an empty value takes its parameter out. */
export function withParams(params: URLSearchParams, set: Record<string, string>): URLSearchParams {
	const out = new URLSearchParams(params);
	for (const [name, value] of Object.entries(set)) {
		if (value) out.set(name, value);
		else out.delete(name);
	}
	return out;
}
