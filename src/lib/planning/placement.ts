import { Placer } from './bed-placer';
import { type Bed, type BedPlanting, DEFAULT_TURNAROUND_DAYS, FT_EPSILON } from './bed-types';
import {
	PlanningInputError,
	itemField,
	requireNonNegativeInteger,
	requirePositive,
	requirePositiveItem
} from './errors';
import { toDayNumber, toDayNumberItem } from './day-number';
import type { WarningCode } from './types';

export interface PlacementRequest {
	key: string;
	bedFeet: number;
	fieldDate: string;
	lastHarvest: string;
	family?: string;
}

export interface PlacementOptions {
	/** Days after last harvest before the bed-feet can take the next planting. Default 7. */
	turnaroundDays?: number;
	/** Families each bed held last season: kept off those beds when another bed has room. */
	previousFamilyByBed?: Record<string, string[]>;
	/** Plantings already in beds; placement works around them. */
	fixed?: BedPlanting[];
	/** Split a planting across beds when no single bed has room. Default true. */
	allowSplit?: boolean;
	/** Smallest piece when splitting, ft. Default 10 ft. */
	minPieceFt?: number;
}

export interface PlacedRange {
	plantingKey: string;
	bedId: string;
	startFt: number;
	lengthFt: number;
}

export interface PlacementNote {
	plantingKey: string;
	code: WarningCode;
	message: string;
}

export interface PlacementResult {
	/** In the order placed; the pieces of a split planting come one after another. */
	placed: PlacedRange[];
	unplaced: { plantingKey: string; reason: string }[];
	warnings: PlacementNote[];
}

function validateBeds(beds: Bed[]): Map<string, number> {
	if (!Array.isArray(beds)) throw new PlanningInputError('beds', 'must be a list of beds');
	const byId = new Map<string, number>();
	beds.forEach((bed, i) => {
		if (typeof bed.id !== 'string' || bed.id === '') throw new PlanningInputError(`beds[${i}].id`, 'is required');
		if (byId.has(bed.id)) throw new PlanningInputError(`beds[${i}].id`, `duplicates bed ${bed.id}`);
		requirePositiveItem('beds', i, 'lengthFt', bed.lengthFt);
		byId.set(bed.id, i);
	});
	return byId;
}

/**
 * Lay plantings into beds (DESIGN step 6): in field-date order, each goes into
 * the first bed (in the order given) with a free foot range for its whole
 * occupancy, preferring beds that did not hold its family last season. When no
 * single bed has room it may be split into pieces across beds; what still does
 * not fit is listed in `unplaced` with the reason. Fixed plantings are obstacles.
 */
export function placePlantings(
	plantings: PlacementRequest[],
	beds: Bed[],
	options: PlacementOptions = {}
): PlacementResult {
	const p = placeIndexed(plantings, beds, options);
	const placed: PlacedRange[] = p.placedFrom.map((from, i) => ({
		plantingKey: plantings[from].key,
		bedId: beds[p.placedBed[i]].id,
		startFt: p.placedStart[i],
		lengthFt: p.placedLength[i]
	}));
	return { placed, unplaced: p.unplaced, warnings: p.warnings };
}

/**
 * What placeIndexed finds: the placed ranges as parallel arrays (request index, bed
 * index, start and length in feet; the pieces of a split planting one after
 * another), which at thousands of plantings keeps a plan's live size down, and for
 * each unplaced planting and each note the index of its request (-1: a note about
 * a fixed planting).
 */
export interface IndexedPlacement {
	placedFrom: number[];
	placedBed: number[];
	placedStart: number[];
	placedLength: number[];
	unplaced: PlacementResult['unplaced'];
	unplacedFrom: number[];
	warnings: PlacementNote[];
	noteFrom: number[];
}

/**
 * Plantings to place in placement's own form: parallel lists, one entry per
 * planting, with dates as day numbers; keys and the dates as given are asked for
 * only when a note or a reason names them. planSeason fills these as it plans, so
 * thousands of plantings need no request object each.
 */
export interface PlacementJobs {
	count: number;
	keyOf: (i: number) => string;
	bedFeet: number[];
	fieldDays: number[];
	lastDays: number[];
	/** The dates as the caller gave them. */
	datesOf: (i: number) => { fieldDate: string; lastHarvest: string };
	families: (string | undefined)[];
}

/** Beds and options checked, and fixed plantings laid as obstacles: what placing needs before the plantings. */
export interface PlacementSetup {
	beds: Bed[];
	placer: Placer;
	turnaround: number;
	allowSplit: boolean;
	minPiece: number;
	maxBedFt: number;
	result: IndexedPlacement;
}

/** Check the beds and options and lay the fixed plantings; the setup serves one placeJobs call. */
export function preparePlacement(beds: Bed[], options: PlacementOptions = {}): PlacementSetup {
	const bedIndexById = validateBeds(beds);
	const turnaround =
		options.turnaroundDays === undefined
			? DEFAULT_TURNAROUND_DAYS
			: requireNonNegativeInteger('options.turnaroundDays', options.turnaroundDays);
	const allowSplit = options.allowSplit ?? true;
	const minPiece = options.minPieceFt === undefined ? 10 : requirePositive('options.minPieceFt', options.minPieceFt);
	const prev = options.previousFamilyByBed ?? {};
	const placer = new Placer(beds, prev);
	const result: IndexedPlacement = {
		placedFrom: [],
		placedBed: [],
		placedStart: [],
		placedLength: [],
		unplaced: [],
		unplacedFrom: [],
		warnings: [],
		noteFrom: []
	};

	for (const f of options.fixed ?? []) {
		const b = bedIndexById.get(f.bedId);
		if (b === undefined) {
			result.warnings.push({
				plantingKey: f.key,
				code: 'unknown_bed',
				message: `Fixed planting ${f.key} names unknown bed ${f.bedId}; ignored as an obstacle.`
			});
			result.noteFrom.push(-1);
			continue;
		}
		const s = toDayNumber(f.fieldDate, `fixed ${f.key}.fieldDate`);
		placer.states[b].occ.push(
			s,
			toDayNumber(f.lastHarvest, `fixed ${f.key}.lastHarvest`) + turnaround + 1,
			f.startFt,
			f.startFt + f.lengthFt
		);
	}
	const maxBedFt = beds.reduce((m, b) => Math.max(m, b.lengthFt), 0);
	return { beds, placer, turnaround, allowSplit, minPiece, maxBedFt, result };
}

/**
 * placePlantings with request indices instead of keys (see IndexedPlacement), so a
 * caller finds its own record for each range without a lookup by key.
 */
export function placeIndexed(
	plantings: PlacementRequest[],
	beds: Bed[],
	options: PlacementOptions = {}
): IndexedPlacement {
	const setup = preparePlacement(beds, options);
	const jobs: PlacementJobs = {
		count: plantings.length,
		keyOf: (i) => plantings[i].key,
		bedFeet: [],
		fieldDays: [],
		lastDays: [],
		datesOf: (i) => plantings[i],
		families: []
	};
	for (let i = 0; i < plantings.length; i++) {
		const req = plantings[i];
		// Checked here, item by item, so the first bad item is the one named (placeJobs checks its own jobs too).
		requirePositiveItem('plantings', i, 'bedFeet', req.bedFeet);
		const s = toDayNumberItem(req.fieldDate, 'plantings', i, 'fieldDate');
		const last = toDayNumberItem(req.lastHarvest, 'plantings', i, 'lastHarvest');
		if (last < s) throw new PlanningInputError(itemField('plantings', i, 'lastHarvest'), 'is before the field date');
		jobs.bedFeet.push(req.bedFeet);
		jobs.fieldDays.push(s);
		jobs.lastDays.push(last);
		jobs.families.push(req.family);
	}
	return placeJobs(setup, jobs);
}

/** Place `jobs` (in field-date order, first fit) with a prepared setup; see placePlantings. */
export function placeJobs(setup: PlacementSetup, jobs: PlacementJobs): IndexedPlacement {
	const n = jobs.count;
	// Each planting's occupancy ends (exclusive) turnaround days after its last harvest.
	const ends: number[] = new Array<number>(n).fill(0);
	for (let i = 0; i < n; i++) {
		requirePositiveItem('plantings', i, 'bedFeet', jobs.bedFeet[i]);
		if (jobs.lastDays[i] < jobs.fieldDays[i])
			throw new PlanningInputError(itemField('plantings', i, 'lastHarvest'), 'is before the field date');
		ends[i] = jobs.lastDays[i] + setup.turnaround + 1;
	}
	const order = byFieldDay(jobs.fieldDays);
	for (let k = 0; k < n; k++) {
		const i = order[k];
		placeOne(jobs, i, jobs.fieldDays[i], ends[i], setup);
	}
	return setup.result;
}

/**
 * Request indices sorted by field day, then input order. A plan's field days span a
 * season, so a stable counting pass by day does it in linear time; days over a span
 * much longer than their number (e.g. years apart) use the ordinary sort.
 */
function byFieldDay(starts: number[]): number[] {
	const n = starts.length;
	const order: number[] = new Array<number>(n).fill(0);
	if (n === 0) return order;
	let lo = starts[0];
	let hi = starts[0];
	for (let i = 1; i < n; i++) {
		if (starts[i] < lo) lo = starts[i];
		if (starts[i] > hi) hi = starts[i];
	}
	if (hi - lo > 4 * n + 1024) {
		for (let i = 0; i < n; i++) order[i] = i;
		return order.sort((x, y) => starts[x] - starts[y] || x - y);
	}
	// Requests are visited in input order, so placing each after those already counted for its day keeps that order.
	const firstOfDay: number[] = new Array<number>(hi - lo + 2).fill(0);
	for (let i = 0; i < n; i++) firstOfDay[starts[i] - lo + 1]++;
	for (let d = 1; d < firstOfDay.length; d++) firstOfDay[d] += firstOfDay[d - 1];
	for (let i = 0; i < n; i++) order[firstOfDay[starts[i] - lo]++] = i;
	return order;
}

/** First fit for planting `order`, over days [s, e): whole on a bed free of its family last season, whole anywhere, then in pieces. */
function placeOne(jobs: PlacementJobs, order: number, s: number, e: number, ctx: PlacementSetup): void {
	const { beds, placer, result, turnaround, minPiece } = ctx;
	const family = jobs.families[order];
	const bedFeet = jobs.bedFeet[order];
	const hit = placer.hit;
	if (bedFeet <= ctx.maxBedFt + FT_EPSILON) {
		let found = placer.find(s, e, bedFeet, family);
		let rotationHit = false;
		if (!found && family !== undefined) {
			found = placer.find(s, e, bedFeet);
			rotationHit = found;
		}
		if (found) {
			placer.put(hit.b, s, e, hit.startFt, bedFeet);
			placed(result, order, hit.b, hit.startFt, bedFeet);
			if (rotationHit) note(ctx, order, rotationNote(jobs.keyOf(order), family, beds[hit.b].id));
			return;
		}
	}
	if (!ctx.allowSplit || bedFeet <= minPiece) {
		result.unplaced.push({ plantingKey: jobs.keyOf(order), reason: `${noRoomWhole(jobs, order, turnaround)}.` });
		result.unplacedFrom.push(order);
		return;
	}
	// The pieces so far, as bed index and feet [a, b) (scratch lists: placeOne does not nest).
	let count = 0;
	let left = bedFeet;
	while (left > FT_EPSILON) {
		// Every piece is at least minPiece: under twice that, the rest goes in one piece; and a piece
		// never leaves a rest shorter than minPiece.
		const need = left < 2 * minPiece ? left : minPiece;
		if (!placer.find(s, e, need, family) && !(family !== undefined && placer.find(s, e, need))) break;
		let len = Math.min(left, hit.gapFt);
		if (left - len > FT_EPSILON && left - len < minPiece) len = left - minPiece;
		placer.put(hit.b, s, e, hit.startFt, len);
		pieceBed[count] = hit.b;
		pieceFrom[count] = hit.startFt;
		pieceTo[count++] = hit.startFt + len;
		left -= len;
	}
	if (left > FT_EPSILON) {
		for (let k = 0; k < count; k++) placer.remove(pieceBed[k], s, e, pieceFrom[k], pieceTo[k]);
		result.unplacedFrom.push(order);
		result.unplaced.push({
			plantingKey: jobs.keyOf(order),
			reason: `${noRoomWhole(jobs, order, turnaround)}, and split across beds only ${bedFeet - left} ft is free in pieces of ${minPiece} ft or more.`
		});
		return;
	}
	for (let k = 0; k < count; k++) {
		placed(result, order, pieceBed[k], pieceFrom[k], pieceTo[k] - pieceFrom[k]);
		if (placer.heldFamily(pieceBed[k], family))
			note(ctx, order, rotationNote(jobs.keyOf(order), family, beds[pieceBed[k]].id));
	}
	if (count > 1) {
		let list = '';
		for (let k = 0; k < count; k++)
			list += `${k > 0 ? ', ' : ''}${beds[pieceBed[k]].id} ${pieceTo[k] - pieceFrom[k]} ft`;
		note(ctx, order, {
			plantingKey: jobs.keyOf(order),
			code: 'split_across_beds',
			message: `${bedFeet} ft split into ${count} pieces: ${list}.`
		});
	}
}

const pieceBed: number[] = [];
const pieceFrom: number[] = [];
const pieceTo: number[] = [];

function note(ctx: PlacementSetup, order: number, n: PlacementNote): void {
	ctx.result.warnings.push(n);
	ctx.result.noteFrom.push(order);
}

function placed(result: IndexedPlacement, order: number, bed: number, startFt: number, lengthFt: number): void {
	result.placedFrom.push(order);
	result.placedBed.push(bed);
	result.placedStart.push(startFt);
	result.placedLength.push(lengthFt);
}

/** Why a planting found no bed whole (built only when it is reported: most split plantings fit). */
function noRoomWhole(jobs: PlacementJobs, i: number, turnaround: number): string {
	const { fieldDate, lastHarvest } = jobs.datesOf(i);
	return `No bed has ${jobs.bedFeet[i]} ft free from field date ${fieldDate} to ${turnaround} days after last harvest ${lastHarvest}`;
}

function rotationNote(key: string, family: string | undefined, bedId: string): PlacementNote {
	return {
		plantingKey: key,
		code: 'rotation_conflict',
		message: `Bed ${bedId} held ${family} within the rotation look-back; no other bed had room.`
	};
}
