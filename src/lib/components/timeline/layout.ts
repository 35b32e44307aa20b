// Geometry of the bed timeline, in plain TypeScript so the Svelte component only draws plain
// SVG elements: one pass over beds and plantings, no per-bar components, fine at 5,000 bars.
// x is time (a fixed number of px per day, ISO weeks on the axis); y within a lane is feet.
// Relative imports (not $lib) so scripts/bench-timeline.ts can run this module under tsx too.
import { daysBetween, formatWeekDate, weekStart, isoWeek, addDays, weeksBetween } from '../../planning/index';
import { familyStyle } from '../../families';
import type { Block } from '$lib/types';
import { formatNumber, lengthUnit, toDisplayFeet, type UnitSystem } from '$lib/format';
import type { TimelineBed, TimelineFlag, TimelinePlanting } from '$lib/timeline-types';

export const GEOMETRY = {
	labelW: 116,
	pxPerDay: 3,
	axisH: 40,
	blockH: 24,
	/** Lane height per bed-foot: a 100 ft bed is 44 px tall. */
	pxPerFt: 0.44,
	minLaneH: 24,
	laneGap: 4,
	rightPad: 12
} as const;

export interface AxisWeek {
	x: number;
	week: string;
	label: string;
}
export interface AxisMonth {
	x: number;
	label: string;
}
export interface Lane {
	bedId: number;
	name: string;
	lengthFt: number;
	y: number;
	h: number;
}
export interface BlockBand {
	blockId: number;
	name: string;
	y: number;
}
export interface Bar {
	id: number;
	x: number;
	w: number;
	y: number;
	h: number;
	/** Start of the tray lead-in (seedlings in the greenhouse), or null for direct sowing. */
	trayX: number | null;
	colour: string;
	ink: string;
	hatch: number | null;
	/** Text drawn on the bar, '' when it would not fit. */
	text: string;
	/** '' or a space-separated list: 'overlap', 'past-end'. */
	conflict: string;
	otherSeason: boolean;
	failed: boolean;
	ariaLabel: string;
	href: string;
}
export interface TimelineLayout {
	width: number;
	height: number;
	axisStart: string;
	axisEnd: string;
	weeks: AxisWeek[];
	months: AxisMonth[];
	blocks: BlockBand[];
	lanes: Lane[];
	bars: Bar[];
	/** Bars by planting id, for the hover card. */
	barById: Map<number, Bar>;
	/** The season's plantings that have no bed yet. */
	unplaced: TimelinePlanting[];
	/** Hatch angles in use, for the SVG pattern definitions. */
	hatches: number[];
}

export interface LayoutInput {
	seasonId: number;
	from: string;
	to: string;
	blocks: Block[];
	beds: TimelineBed[];
	plantings: TimelinePlanting[];
	flags: Record<number, TimelineFlag[]>;
	/** The farm's units for the labels (feet when not given). */
	units?: UnitSystem;
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
// Rough width of a character at the bar font size (10 px), to decide whether a label fits.
const CHAR_PX = 6;

export function plantingHref(seasonId: number, plantingId: number): string {
	return `/seasons/${seasonId}/plantings?planting=${plantingId}`;
}

export function rangeText(p: Pick<TimelinePlanting, 'startFt' | 'lengthFt'>, units: UnitSystem = 'imperial'): string {
	const at = (ft: number): string => formatNumber(toDisplayFeet(ft, units), 2);
	return `${at(p.startFt)}–${at(p.startFt + p.lengthFt)} ${lengthUnit(units)}`;
}

function conflictText(flags: TimelineFlag[] | undefined): string {
	if (!flags?.length) return '';
	const codes = new Set(flags.map((f) => f.code));
	return [...codes].join(' ');
}

function ariaLabelOf(
	p: TimelinePlanting,
	bed: string,
	conflict: string,
	otherSeason: boolean,
	units: UnitSystem
): string {
	const parts = [
		`${p.crop} · ${p.variety} (${p.family})`,
		`bed ${bed}, ${rangeText(p, units)}`,
		`in the field ${formatWeekDate(p.fieldDate)}`,
		`harvest ${formatWeekDate(p.firstHarvest)} to ${formatWeekDate(p.lastHarvest)}`
	];
	if (conflict.includes('overlap')) parts.push('overlaps another planting');
	if (conflict.includes('past-end')) parts.push('runs past the bed end');
	if (p.status === 'failed') parts.push('failed');
	if (otherSeason) parts.push('from another season');
	return `${parts.join(', ')}. Open in the planting grid.`;
}

export function layoutTimeline(input: LayoutInput): TimelineLayout {
	const g = GEOMETRY;
	// Whole ISO weeks: the axis runs Monday of the first week to Sunday of the last.
	const axisStart = weekStart(isoWeek(input.from));
	const axisEnd = addDays(weekStart(isoWeek(input.to)), 6);
	const days = daysBetween(axisStart, axisEnd) + 1;
	const xOf = (date: string): number =>
		g.labelW + Math.min(days, Math.max(0, daysBetween(axisStart, date))) * g.pxPerDay;

	const weeks: AxisWeek[] = weeksBetween(axisStart, axisEnd).map((week, i) => ({
		x: g.labelW + i * 7 * g.pxPerDay,
		week,
		label: week.slice(6)
	}));
	const months: AxisMonth[] = [];
	for (let y = Number(axisStart.slice(0, 4)), m = Number(axisStart.slice(5, 7)); ; m++) {
		if (m > 12) {
			m = 1;
			y++;
		}
		const first = `${y}-${String(m).padStart(2, '0')}-01`;
		if (first > axisEnd) break;
		if (first >= axisStart) months.push({ x: xOf(first), label: m === 1 ? `${MONTHS[0]} ${y}` : MONTHS[m - 1] });
	}

	const blockName = new Map(input.blocks.map((b) => [b.id, b.name]));
	const lanes: Lane[] = [];
	const blocks: BlockBand[] = [];
	const laneByBed = new Map<number, Lane>();
	let y = g.axisH;
	let lastBlock: number | null = null;
	for (const bed of input.beds) {
		if (bed.blockId !== lastBlock) {
			blocks.push({ blockId: bed.blockId, name: blockName.get(bed.blockId) ?? 'Block', y });
			y += g.blockH;
			lastBlock = bed.blockId;
		}
		const lane: Lane = {
			bedId: bed.id,
			name: bed.name,
			lengthFt: bed.lengthFt,
			y,
			h: Math.max(g.minLaneH, Math.round(bed.lengthFt * g.pxPerFt))
		};
		lanes.push(lane);
		laneByBed.set(bed.id, lane);
		y += lane.h + g.laneGap;
	}

	const bars: Bar[] = [];
	const barById = new Map<number, Bar>();
	const unplaced: TimelinePlanting[] = [];
	const hatches = new Set<number>();
	for (const p of input.plantings) {
		const lane = p.bedId === null ? undefined : laneByBed.get(p.bedId);
		if (!lane) {
			if (p.bedId === null) unplaced.push(p);
			continue;
		}
		const style = familyStyle(p.family);
		if (style.hatch !== null) hatches.add(style.hatch);
		// Feet past the bed's end are drawn clipped to the lane and flagged instead.
		const ftScale = lane.h / lane.lengthFt;
		const top = Math.max(0, Math.min(lane.lengthFt, p.startFt));
		const bottom = Math.max(top, Math.min(lane.lengthFt, p.startFt + p.lengthFt));
		const x = xOf(p.fieldDate);
		const w = Math.max(2, xOf(addDays(p.lastHarvest, 1)) - x);
		const h = Math.max(3, (bottom - top) * ftScale);
		const conflict = conflictText(input.flags[p.id]);
		const otherSeason = p.seasonId !== input.seasonId;
		const text = h < 11 ? '' : w >= p.crop.length * CHAR_PX + 8 ? p.crop : w >= 4 * CHAR_PX ? style.short : '';
		const bar: Bar = {
			id: p.id,
			x,
			w,
			y: Math.min(lane.y + top * ftScale, lane.y + lane.h - h),
			h,
			trayX: p.traySowDate ? xOf(p.traySowDate) : null,
			colour: style.colour,
			ink: style.ink,
			hatch: style.hatch,
			text,
			conflict,
			otherSeason,
			failed: p.status === 'failed',
			ariaLabel: ariaLabelOf(p, lane.name, conflict, otherSeason, input.units ?? 'imperial'),
			href: plantingHref(p.seasonId, p.id)
		};
		bars.push(bar);
		barById.set(p.id, bar);
	}
	return {
		width: g.labelW + days * g.pxPerDay + g.rightPad,
		height: y + 4,
		axisStart,
		axisEnd,
		weeks,
		months,
		blocks,
		lanes,
		bars,
		barById,
		unplaced,
		hatches: [...hatches].sort((a, b) => a - b)
	};
}

/** Id of the SVG hatch pattern for an angle (ids may not hold a minus sign nicely in url()). */
export function hatchId(angle: number): string {
	return `fc-hatch-${angle < 0 ? `m${-angle}` : angle}`;
}
