import { BedIndex } from './bed-index';
import { firstGap, gap, instant, instantGap } from './bed-gaps';
import { type Bed, type BedPlanting, DEFAULT_TURNAROUND_DAYS, FT_EPSILON, type Occupancy } from './bed-types';
import { PlanningInputError, itemField, requireNonNegativeInteger, requirePositive, requirePositiveItem } from './errors';
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

interface BedState {
	bed: Bed;
	occ: Occupancy[];
}

interface Job {
	req: PlacementRequest;
	s: number;
	e: number;
	order: number;
}

class Placer {
	readonly states: BedState[];
	readonly index: BedIndex;
	/** Families each bed held last season, by bed index. */
	readonly held: (string[] | undefined)[];

	constructor(beds: Bed[], prev: Record<string, string[]>) {
		this.states = beds.map((bed) => ({ bed, occ: [] }));
		this.index = new BedIndex(beds.length);
		this.held = beds.map((bed) => prev[bed.id]);
	}

	heldFamily(b: number, family: string | undefined): boolean {
		return family !== undefined && (this.held[b]?.includes(family) ?? false);
	}

	put(b: number, s: number, e: number, startFt: number, lengthFt: number, key: string): Occupancy {
		const o = { s, e, a: startFt, b: startFt + lengthFt, key };
		this.add(b, o, s);
		return o;
	}

	/** Drop occupancies that ended before s: jobs come in field-date order, so none can matter again. */
	private prune(st: BedState, s: number): void {
		let w = 0;
		for (const o of st.occ) if (o.e > s) st.occ[w++] = o;
		st.occ.length = w;
	}

	private refresh(b: number, s: number): void {
		const st = this.states[b];
		instantGap(st.occ, st.bed.lengthFt, s);
		this.index.set(b, instant.maxGap, instant.validUntil);
	}

	/** First bed (by order, optionally skipping some) with a gap of at least `need` ft over [s, e). */
	find(s: number, e: number, need: number, skipFamily?: string): { b: number; startFt: number; gapFt: number } | null {
		let from = 0;
		for (;;) {
			const b = this.index.findFrom(from, s, need - FT_EPSILON);
			if (b < 0) return null;
			from = b + 1;
			if (skipFamily !== undefined && this.held[b]?.includes(skipFamily)) continue;
			const st = this.states[b];
			if (st.bed.lengthFt < need - FT_EPSILON) {
				this.index.set(b, st.bed.lengthFt, Infinity);
				continue;
			}
			this.prune(st, s);
			if (firstGap(st.occ, st.bed.lengthFt, s, e, need)) return { b, startFt: gap.startFt, gapFt: gap.lengthFt };
			this.refresh(b, s);
		}
	}

	add(b: number, o: Occupancy, s: number): void {
		this.states[b].occ.push(o);
		this.refresh(b, s);
	}

	remove(b: number, o: Occupancy): void {
		const occ = this.states[b].occ;
		const i = occ.indexOf(o);
		if (i >= 0) occ.splice(i, 1);
		this.index.invalidate(b);
	}
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
export function placePlantings(plantings: PlacementRequest[], beds: Bed[], options: PlacementOptions = {}): PlacementResult {
	return placeIndexed(plantings, beds, options).result;
}

/**
 * placePlantings, also giving for each placed range and each unplaced planting the
 * index of its request in `plantings`, so a caller can find its own record for
 * it without a lookup by key (planSeason does this for thousands of plantings).
 */
export function placeIndexed(
	plantings: PlacementRequest[],
	beds: Bed[],
	options: PlacementOptions = {}
): { result: PlacementResult; placedFrom: number[]; unplacedFrom: number[] } {
	const bedIndexById = validateBeds(beds);
	const turnaround =
		options.turnaroundDays === undefined ? DEFAULT_TURNAROUND_DAYS : requireNonNegativeInteger('options.turnaroundDays', options.turnaroundDays);
	const allowSplit = options.allowSplit ?? true;
	const minPiece = options.minPieceFt === undefined ? 10 : requirePositive('options.minPieceFt', options.minPieceFt);
	const prev = options.previousFamilyByBed ?? {};
	const placer = new Placer(beds, prev);
	const result: PlacementResult = { placed: [], unplaced: [], warnings: [] };

	for (const f of options.fixed ?? []) {
		const b = bedIndexById.get(f.bedId);
		if (b === undefined) {
			result.warnings.push({ plantingKey: f.key, code: 'unknown_bed', message: `Fixed planting ${f.key} names unknown bed ${f.bedId}; ignored as an obstacle.` });
			continue;
		}
		const s = toDayNumber(f.fieldDate, `fixed ${f.key}.fieldDate`);
		const o = { s, e: toDayNumber(f.lastHarvest, `fixed ${f.key}.lastHarvest`) + turnaround + 1, a: f.startFt, b: f.startFt + f.lengthFt, key: f.key };
		placer.states[b].occ.push(o);
	}

	const jobs: Job[] = plantings.map((req, order) => {
		requirePositiveItem('plantings', order, 'bedFeet', req.bedFeet);
		const s = toDayNumberItem(req.fieldDate, 'plantings', order, 'fieldDate');
		const last = toDayNumberItem(req.lastHarvest, 'plantings', order, 'lastHarvest');
		if (last < s) throw new PlanningInputError(itemField('plantings', order, 'lastHarvest'), 'is before the field date');
		return { req, s, e: last + turnaround + 1, order };
	});
	sortByFieldDay(jobs);

	const maxBedFt = beds.reduce((m, b) => Math.max(m, b.lengthFt), 0);
	const ctx: PlaceContext = { beds, placer, turnaround, allowSplit, minPiece, maxBedFt, result, placedFrom: [], unplacedFrom: [] };
	for (const job of jobs) placeOne(job, ctx);
	return { result, placedFrom: ctx.placedFrom, unplacedFrom: ctx.unplacedFrom };
}

/**
 * Sort jobs by field day, then input order. A plan's field days span a season, so a
 * stable bucket pass by day does it in linear time; jobs over a span much longer
 * than their number (e.g. years apart) use the ordinary sort.
 */
function sortByFieldDay(jobs: Job[]): void {
	if (jobs.length < 2) return;
	let lo = Infinity;
	let hi = -Infinity;
	for (const j of jobs) {
		if (j.s < lo) lo = j.s;
		if (j.s > hi) hi = j.s;
	}
	if (hi - lo > 4 * jobs.length + 1024) {
		jobs.sort((x, y) => x.s - y.s || x.order - y.order);
		return;
	}
	// Jobs arrive in input order, so placing each after those already in its day's bucket keeps that order.
	const starts = new Int32Array(hi - lo + 2);
	for (const j of jobs) starts[j.s - lo + 1]++;
	for (let d = 1; d < starts.length; d++) starts[d] += starts[d - 1];
	const sorted = new Array<Job>(jobs.length);
	for (const j of jobs) sorted[starts[j.s - lo]++] = j;
	for (let i = 0; i < jobs.length; i++) jobs[i] = sorted[i];
}

interface PlaceContext {
	beds: Bed[];
	placer: Placer;
	turnaround: number;
	allowSplit: boolean;
	minPiece: number;
	maxBedFt: number;
	result: PlacementResult;
	/** Request index of each entry of result.placed, and of result.unplaced. */
	placedFrom: number[];
	unplacedFrom: number[];
}

/** First fit for one planting: whole on a bed free of its family last season, whole anywhere, then in pieces. */
function placeOne(job: Job, ctx: PlaceContext): void {
	const { req, s, e } = job;
	const { beds, placer, result, turnaround, minPiece } = ctx;
	const family = req.family;
	if (req.bedFeet <= ctx.maxBedFt + FT_EPSILON) {
		let hit = placer.find(s, e, req.bedFeet, family);
		let rotationHit = false;
		if (!hit && family !== undefined) {
			hit = placer.find(s, e, req.bedFeet);
			rotationHit = hit !== null;
		}
		if (hit) {
			placer.put(hit.b, s, e, hit.startFt, req.bedFeet, req.key);
			result.placed.push({ plantingKey: req.key, bedId: beds[hit.b].id, startFt: hit.startFt, lengthFt: req.bedFeet });
			ctx.placedFrom.push(job.order);
			if (rotationHit) result.warnings.push(rotationNote(req, beds[hit.b].id));
			return;
		}
	}
	if (!ctx.allowSplit || req.bedFeet <= minPiece) {
		result.unplaced.push({ plantingKey: req.key, reason: `${noRoomWhole(req, turnaround)}.` });
		ctx.unplacedFrom.push(job.order);
		return;
	}
	const pieces: { b: number; o: Occupancy }[] = [];
	let left = req.bedFeet;
	while (left > FT_EPSILON) {
		const need = Math.min(minPiece, left);
		const p = placer.find(s, e, need, family) ?? (family !== undefined ? placer.find(s, e, need) : null);
		if (!p) break;
		const len = Math.min(left, p.gapFt);
		pieces.push({ b: p.b, o: placer.put(p.b, s, e, p.startFt, len, req.key) });
		left -= len;
	}
	if (left > FT_EPSILON) {
		for (const p of pieces) placer.remove(p.b, p.o);
		ctx.unplacedFrom.push(job.order);
		result.unplaced.push({
			plantingKey: req.key,
			reason: `${noRoomWhole(req, turnaround)}, and split across beds only ${req.bedFeet - left} ft is free in pieces of ${minPiece} ft or more.`
		});
		return;
	}
	for (const p of pieces) {
		const bedId = beds[p.b].id;
		result.placed.push({ plantingKey: req.key, bedId, startFt: p.o.a, lengthFt: p.o.b - p.o.a });
		ctx.placedFrom.push(job.order);
		if (placer.heldFamily(p.b, family)) result.warnings.push(rotationNote(req, bedId));
	}
	if (pieces.length > 1) {
		result.warnings.push({
			plantingKey: req.key,
			code: 'split_across_beds',
			message: `${req.bedFeet} ft split into ${pieces.length} pieces: ${pieces.map((p) => `${beds[p.b].id} ${p.o.b - p.o.a} ft`).join(', ')}.`
		});
	}
}

/** Why a planting found no bed whole (built only when it is reported: most split plantings fit). */
function noRoomWhole(req: PlacementRequest, turnaround: number): string {
	return `No bed has ${req.bedFeet} ft free from field date ${req.fieldDate} to ${turnaround} days after last harvest ${req.lastHarvest}`;
}

function rotationNote(req: PlacementRequest, bedId: string): PlacementNote {
	return {
		plantingKey: req.key,
		code: 'rotation_conflict',
		message: `Bed ${bedId} held ${req.family} last season; no other bed had room.`
	};
}
