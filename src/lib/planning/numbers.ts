/**
 * Rounding that tolerates binary floating-point dust: 100 × 12 ÷ 0.5 × 1.1 is
 * 2640.0000000000005 in IEEE 754, and a plain Math.ceil would ask for one seed
 * (or one bed-foot increment) too many.
 */
const RELATIVE_EPSILON = 1e-9;

function slack(x: number): number {
	return RELATIVE_EPSILON * Math.max(1, Math.abs(x));
}

export function ceilSafe(x: number): number {
	return Math.ceil(x - slack(x));
}

export function floorSafe(x: number): number {
	return Math.floor(x + slack(x));
}

/** Round x up to a whole multiple of step (step > 0). */
export function roundUpTo(x: number, step: number): number {
	return ceilSafe(x / step) * step;
}

/** Round x up to `places` decimal places (grams to 0.01 g). */
export function ceilToPlaces(x: number, places: number): number {
	const f = 10 ** places;
	return ceilSafe(x * f) / f;
}
