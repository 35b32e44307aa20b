import { PlanningInputError, requireNonNegative, requirePositive, requirePositiveInteger, requireRate } from './errors';
import { ceilSafe, ceilToPlaces, floorSafe } from './numbers';
import type { SowingMethod } from './types';

export interface SeedNeedInput {
	method: SowingMethod;
	bedFeet: number;
	rows: number;
	inRowSpacingIn: number;
	/** Seeds sown per spot (multi-sowing: e.g. 3 beet seeds per spot). */
	seedsPerSpot: number;
	germinationRate: number;
	seedsPerGram: number;
	/** Overage as a fraction, e.g. 0.1 for 10 %. */
	margin: number;
	/** Required for transplants; ignored for direct sowing. */
	cellsPerTray?: number;
	seedPriceCentsPerGram?: number;
	seedsPerPacket?: number;
}

export interface SeedNeed {
	/** Whole spots per row (floored: a part-spot at the bed end is not sown). */
	spotsPerRow: number;
	spots: number;
	seeds: number;
	/** Rounded up to 0.01 g. */
	grams: number;
	cells: number;
	trays: number;
	plants?: number;
	packets?: number;
	costCents?: number;
}

/** Check seed input; returns the cells per tray to use (1 when direct-sown and not given). */
export function validateSeedInput(input: SeedNeedInput): number {
	if (input.method !== 'direct' && input.method !== 'transplant') {
		throw new PlanningInputError('method', `must be "direct" or "transplant" (got ${String(input.method)})`);
	}
	requireNonNegative('bedFeet', input.bedFeet);
	requirePositiveInteger('rows', input.rows);
	requirePositive('inRowSpacingIn', input.inRowSpacingIn);
	requirePositiveInteger('seedsPerSpot', input.seedsPerSpot);
	requireRate('germinationRate', input.germinationRate);
	requirePositive('seedsPerGram', input.seedsPerGram);
	requireNonNegative('margin', input.margin);
	if (input.seedPriceCentsPerGram !== undefined)
		requireNonNegative('seedPriceCentsPerGram', input.seedPriceCentsPerGram);
	if (input.seedsPerPacket !== undefined) requirePositive('seedsPerPacket', input.seedsPerPacket);
	let cellsPerTray = input.cellsPerTray ?? 1;
	if (input.method === 'transplant') {
		if (input.cellsPerTray === undefined) throw new PlanningInputError('cellsPerTray', 'is required for transplants');
		cellsPerTray = requirePositiveInteger('cellsPerTray', input.cellsPerTray);
	}
	return cellsPerTray;
}

/** Whole spots in one row of a bed: bedFeet × 12 in ÷ spacing, floored. */
export function spotsPerRow(bedFeet: number, inRowSpacingIn: number): number {
	return floorSafe((bedFeet * 12) / inRowSpacingIn);
}

/**
 * Seed, cells and trays for one planting (DESIGN step 5).
 * Direct: seeds = ceil(spots × seedsPerSpot ÷ germination × (1 + margin)).
 * Transplant: cells = ceil(spots ÷ germination × (1 + margin)); seeds = cells × seedsPerSpot;
 * trays = ceil(cells ÷ cellsPerTray). The germination divisor applies to the cell,
 * as the trade sizes trays, even when a cell is multi-sown.
 */
export function seedNeed(input: SeedNeedInput): SeedNeed {
	const cellsPerTray = validateSeedInput(input);
	const v = input;
	const perRow = spotsPerRow(v.bedFeet, v.inRowSpacingIn);
	const spots = perRow * v.rows;
	let seeds: number;
	let cells = 0;
	let trays = 0;
	let plants: number | undefined;
	if (v.method === 'direct') {
		seeds = ceilSafe(((spots * v.seedsPerSpot) / v.germinationRate) * (1 + v.margin));
	} else {
		plants = spots;
		cells = ceilSafe((spots / v.germinationRate) * (1 + v.margin));
		trays = ceilSafe(cells / cellsPerTray);
		seeds = cells * v.seedsPerSpot;
	}
	const grams = ceilToPlaces(seeds / v.seedsPerGram, 2);
	// One literal with every figure (undefined where it does not apply), so the object is made
	// whole rather than grown field by field: a season plan makes one per planting.
	const out: SeedNeed = {
		spotsPerRow: perRow,
		spots,
		seeds,
		grams,
		cells,
		trays,
		plants,
		packets: v.seedsPerPacket === undefined ? undefined : ceilSafe(seeds / v.seedsPerPacket),
		costCents: v.seedPriceCentsPerGram === undefined ? undefined : Math.round(grams * v.seedPriceCentsPerGram)
	};
	return out;
}
