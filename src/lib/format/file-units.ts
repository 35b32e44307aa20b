// Quantities in files (the season workbook, crew sheets, the seed order and demand files): what a
// column measures, its unit in the farm's system, and its value converted both ways. Files carry
// numbers, not text: the value is converted at full precision (a cell shows it rounded), and a
// value read back is rounded to the database column's precision, so a file exported from a metric
// farm imports back to the same stored figures. Conversions are the display ones of ./index.ts.
import {
	fromDisplayFeet,
	fromDisplayInches,
	fromDisplayQuantity,
	fromDisplaySeedWeight,
	fromDisplaySeedsPerWeight,
	fromDisplayTemp,
	toDisplayFeet,
	toDisplayInches,
	toDisplayQuantity,
	toDisplaySeedWeight,
	toDisplaySeedsPerWeight,
	toDisplayTemp,
	unitLabel,
	type UnitSystem
} from './index';

export type Measure =
	/** Bed lengths and positions: ft or m. */
	| 'length'
	/** In-row spacing, bed widths: in or cm. */
	| 'spacing'
	/** A temperature: °F or °C. */
	| 'temp'
	/** Growing degree days: a temperature difference times days, °F·d or °C·d. */
	| 'degreeDays'
	/** Seed weight: oz (imperial) or g (metric); stored in grams. */
	| 'seedWeight'
	/** Seeds per seed-weight unit; stored per gram. */
	| 'seedsPerWeight'
	/** Money per seed-weight unit, in whole currency units; stored in cents per gram. */
	| 'pricePerSeedWeight'
	/** A harvest quantity in the row's harvest unit (lb converts, counts do not). */
	| 'harvest'
	/** A harvest quantity per bed length, in the row's harvest unit. */
	| 'harvestPerLength'
	/** The name of a harvest unit itself: lb is written kg on a metric farm. */
	| 'harvestUnit';

/** Canonical units per harvest-unit cell: a file may write "kg" where the database keeps "lb". */
export function canonicalHarvestUnit(unit: string): string {
	const u = unit.trim().toLowerCase();
	return u === 'kg' ? 'lb' : u;
}

/** Which system a harvest-unit cell speaks: "kg" is metric, "lb" imperial, counts neither (null). */
export function harvestUnitSystem(unit: unknown): UnitSystem | null {
	const u = typeof unit === 'string' ? unit.trim().toLowerCase() : '';
	return u === 'kg' ? 'metric' : u === 'lb' ? 'imperial' : null;
}

/** A harvest weight read from a file, in the stored unit: the row's unit cell says the weight ("kg" is kilograms). */
const storedWeight = (value: number, unit?: string | null): number => {
	const system = unit ? harvestUnitSystem(unit) : null;
	return system ? fromDisplayQuantity(value, 'lb', system) : value;
};

type Convert = (value: number, system: UnitSystem, unit?: string | null) => number;

/**
 * Each measure's conversion from the stored unit to a `system` farm's file (`to`) and back (`from`).
 * `unit` is the row's harvest unit for harvest measures: canonical going out, as the file writes it coming back.
 */
const conversions: Record<Exclude<Measure, 'harvestUnit'>, { to: Convert; from: Convert }> = {
	length: { to: toDisplayFeet, from: fromDisplayFeet },
	spacing: { to: toDisplayInches, from: fromDisplayInches },
	temp: { to: toDisplayTemp, from: fromDisplayTemp },
	degreeDays: {
		to: (v, system) => toDisplayTemp(v, system) - toDisplayTemp(0, system),
		from: (v, system) => fromDisplayTemp(v + toDisplayTemp(0, system), system)
	},
	seedWeight: { to: toDisplaySeedWeight, from: fromDisplaySeedWeight },
	seedsPerWeight: { to: toDisplaySeedsPerWeight, from: fromDisplaySeedsPerWeight },
	// Seeds per weight and price per weight scale alike (both are "per gram" stored).
	pricePerSeedWeight: { to: toDisplaySeedsPerWeight, from: fromDisplaySeedsPerWeight },
	harvest: {
		to: (v, system, unit) => (unit ? toDisplayQuantity(v, unit, system) : v),
		from: (v, _system, unit) => storedWeight(v, unit)
	},
	harvestPerLength: {
		to: (v, system, unit) => (unit ? toDisplayQuantity(v, unit, system) / toDisplayFeet(1, system) : v),
		from: (v, system, unit) => storedWeight(v, unit) / fromDisplayFeet(1, system)
	}
};

/**
 * A stored value as a file of a `system` farm writes it. `unit` is the row's harvest unit
 * (canonical) for harvest measures. Null and non-numbers pass through.
 */
export function toFileValue<T>(
	measure: Measure,
	value: T,
	system: UnitSystem,
	unit?: string | null
): T | number | string {
	// Only a weight has another name; counts keep the database's word ("bunch"), which the import reads.
	if (measure === 'harvestUnit') return value === 'lb' ? unitLabel('lb', system) : value;
	if (typeof value !== 'number' || !Number.isFinite(value)) return value;
	return conversions[measure].to(value, system, unit);
}

/**
 * A value read from a file back to the stored unit: `system` is the one the column's header (or
 * the row's unit cell) names. `unit` is the row's harvest unit as the file writes it ("kg", "lb",
 * "bunch"). A converted result is rounded to `digits` decimals, the database column's precision.
 */
export function fromFileValue(
	measure: Exclude<Measure, 'harvestUnit'>,
	value: number,
	system: UnitSystem,
	digits: number,
	unit?: string | null
): number {
	const v = conversions[measure].from(value, system, unit);
	// In the stored unit already: left exactly as written, for the row's own checks (whole cents...).
	if (v === value) return value;
	const f = 10 ** digits;
	return Math.round(v * f) / f;
}
