// Shapes of the bed timeline's data, shared by the server module and the browser.
import type { FreeRange } from '$lib/planning';
import type { Block } from '$lib/types';

export interface TimelineBed {
	id: number;
	blockId: number;
	name: string;
	lengthFt: number;
}

export interface TimelinePlanting {
	id: number;
	seasonId: number;
	crop: string;
	variety: string;
	family: string;
	bedId: number | null;
	startFt: number;
	lengthFt: number;
	method: 'direct' | 'transplant';
	traySowDate: string | null;
	fieldDate: string;
	firstHarvest: string;
	lastHarvest: string;
	status: string;
}

export type TimelineFlagCode = 'overlap' | 'past-end';
export interface TimelineFlag {
	code: TimelineFlagCode;
	message: string;
}

export interface TimelineData {
	/** First and last day the timeline shows: the season, widened to hold its own plantings. */
	from: string;
	to: string;
	turnaroundDays: number;
	blocks: Block[];
	beds: TimelineBed[];
	plantings: TimelinePlanting[];
	/** Conflicts by planting id (engine checkBedConflicts, with the farm's turnaround). */
	flags: Record<number, TimelineFlag[]>;
}

export interface FreeBed {
	bedId: number;
	bed: string;
	block: string;
	lengthFt: number;
	ranges: FreeRange[];
	freeFt: number;
	longestFt: number;
}

export interface FreeSpaceAnswer {
	from: string;
	to: string;
	/** Monday of the from week and Sunday of the to week. */
	fromDate: string;
	toDate: string;
	minFt: number;
	turnaroundDays: number;
	bedsChecked: number;
	/** Beds with at least one free range of minFt feet or more, in walking order. */
	beds: FreeBed[];
}
