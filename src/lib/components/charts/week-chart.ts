// What every weekly chart's layers read from LayerCake: a band scale of ISO weeks across, a linear
// scale of quantities up, and the drawing's size.
import { getContext } from 'svelte';
import type { Readable } from 'svelte/store';
import type { ScaleBand, ScaleLinear } from 'd3-scale';

export interface WeekChart {
	xScale: Readable<ScaleBand<string>>;
	yScale: Readable<ScaleLinear<number, number>>;
	width: Readable<number>;
	height: Readable<number>;
}

/** The enclosing LayerCake's scales and size (call during a layer component's set-up). */
export function weekChart(): WeekChart {
	return getContext('LayerCake') as WeekChart;
}

/** Label every nth week so the axis never crowds: about one label per `px` pixels. */
export function labelEvery(weeks: number, width: number, px = 44): number {
	return Math.max(1, Math.ceil(weeks / Math.max(1, Math.floor(width / px))));
}

/** A week's bar between two values on the value axis, as a <rect>'s x, y, width and height. */
export function weekBar(
	x: ScaleBand<string>,
	y: ScaleLinear<number, number>,
	week: string,
	from: number,
	to: number
): { x: number; y: number; width: number; height: number } {
	const a = y(from);
	const b = y(to);
	return { x: x(week) ?? 0, width: x.bandwidth(), y: Math.min(a, b), height: Math.abs(a - b) };
}
