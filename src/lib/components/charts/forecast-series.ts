// Turns the forecast API's rows into what the charts draw: one stacked layer per crop, the
// demand line over it, and the week's surplus and shortfall. Pure, so the numbers drawn are
// the numbers in the table beside the chart.
import { stack } from 'd3-shape';
import { familyStyle, type FamilyStyle } from '$lib/families';
import type { ForecastCrop, SeasonForecastRow } from '$lib/server/forecast';

export type ChartMode = 'quantity' | 'percent';

/** A row and a crop of the forecast API's answer (types only: nothing of the server runs here). */
export type ForecastApiRow = SeasonForecastRow;
export type ChartCrop = ForecastCrop;

export interface LayerPoint {
	week: string;
	y0: number;
	y1: number;
	/** The figure the layer stands for in this mode (supply, or percent of the crop's demand share). */
	value: number;
}

export interface Layer {
	crop: ChartCrop;
	style: FamilyStyle;
	/** 0, 1, 2… among the chosen crops of the same family: sets the shade, so neighbours differ. */
	shade: number;
	points: LayerPoint[];
}

/** What a forecast chart takes: the series, the week picked (bound both ways) and its label. */
export interface SeriesChartProps {
	series: Series;
	hovered: string | null;
	label: string;
}

export interface Series {
	mode: ChartMode;
	weeks: string[];
	layers: Layer[];
	demand: { week: string; value: number | null }[];
	balance: { week: string; surplus: number; shortfall: number }[];
	max: number;
	/** The unit of the value axis: a harvest unit, "mixed units (…)", or "% of demand". */
	unitLabel: string;
	mixedUnits: boolean;
}

export const shadeOpacity = [1, 0.7, 0.5, 0.35];

const key = (crop: string, week: string): string => `${crop}\u0000${week}`;

/**
 * Quantity mode stacks each crop's supply in its own unit. Percent mode weighs every crop
 * with demand that week alike: a layer is supply ÷ demand × 100 ÷ (crops with demand), so the
 * stack reaches the 100 % line when, on average, each crop meets its demand.
 */
export function buildSeries(rows: ForecastApiRow[], crops: ChartCrop[], weeks: string[], mode: ChartMode): Series {
	const byKey = new Map(rows.map((r) => [key(r.crop, r.week), r]));
	// Family by family, so each family's colour sits together in the stack.
	const ordered = [...crops].sort((a, b) =>
		a.family === b.family ? a.name.localeCompare(b.name) : a.family.localeCompare(b.family)
	);
	const withDemand = weeks.map((w) => ordered.filter((c) => (byKey.get(key(c.id, w))?.demand ?? 0) > 0).length);
	const value = (c: ChartCrop, w: string, i: number): number => {
		const r = byKey.get(key(c.id, w));
		if (!r) return 0;
		if (mode === 'quantity') return r.supply;
		return r.demand > 0 ? ((r.supply / r.demand) * 100) / withDemand[i] : 0;
	};
	const table = weeks.map(
		(w, i) => Object.fromEntries(ordered.map((c) => [c.id, value(c, w, i)])) as Record<string, number>
	);
	const stacked = stack<Record<string, number>>().keys(ordered.map((c) => c.id))(table);
	const shades = new Map<string, number>();
	const layers: Layer[] = ordered.map((crop, j) => {
		const shade = shades.get(crop.family) ?? 0;
		shades.set(crop.family, shade + 1);
		return {
			crop,
			style: familyStyle(crop.family),
			shade,
			points: weeks.map((week, i) => ({ week, y0: stacked[j][i][0], y1: stacked[j][i][1], value: table[i][crop.id] }))
		};
	});
	const demand = weeks.map((week, i) => {
		if (mode === 'percent') return { week, value: withDemand[i] > 0 ? 100 : null };
		const total = ordered.reduce((t, c) => t + (byKey.get(key(c.id, week))?.demand ?? 0), 0);
		return { week, value: total };
	});
	const balance = weeks.map((week, i) => {
		let surplus = 0;
		let shortfall = 0;
		for (const c of ordered) {
			const r = byKey.get(key(c.id, week));
			if (!r) continue;
			if (mode === 'quantity') {
				surplus += r.surplus;
				shortfall += r.shortfall;
			} else if (r.demand > 0) {
				surplus += ((r.surplus / r.demand) * 100) / withDemand[i];
				shortfall += ((r.shortfall / r.demand) * 100) / withDemand[i];
			}
		}
		return { week, surplus, shortfall };
	});
	const tops = layers.length ? layers[layers.length - 1].points.map((p) => p.y1) : [];
	const max = Math.max(1, ...tops, ...demand.map((d) => d.value ?? 0));
	const units = [...new Set(ordered.map((c) => c.unit))].sort();
	const mixedUnits = mode === 'quantity' && units.length > 1;
	const unitLabel =
		mode === 'percent'
			? '% of demand'
			: units.length === 1
				? units[0]
				: units.length
					? `mixed units (${units.join(', ')})`
					: 'units';
	return { mode, weeks, layers, demand, balance, max, unitLabel, mixedUnits };
}

/** '2027-W24' → 'W24' for a narrow axis; the year shows in the axis title. */
export function shortWeek(week: string): string {
	return week.slice(5);
}

export function formatFigure(x: number, mode: ChartMode): string {
	if (mode === 'percent') return `${Math.round(x)} %`;
	return x >= 100 ? Math.round(x).toLocaleString('en-US') : (Math.round(x * 10) / 10).toLocaleString('en-US');
}
