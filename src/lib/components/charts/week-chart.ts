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
