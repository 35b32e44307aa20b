/**
 * Days from sowing to emergence by soil temperature, interpolated linearly between the points of a
 * crop's table (°F → days). Emergence tells the crew when to expect a row to show, and when a
 * row that has not come up should be resown. Outside the table's range no figure is given:
 * extrapolating germination into soil that is too cold or too hot would mislead.
 */
import { PlanningInputError } from './errors';

export type EmergenceTable = readonly (readonly [soilTempF: number, days: number])[];

export function emergenceDays(table: EmergenceTable, soilTempF: number): number | null {
	if (!Array.isArray(table) || table.length === 0)
		throw new PlanningInputError('table', 'needs at least one (soil °F, days) point');
	if (!Number.isFinite(soilTempF)) throw new PlanningInputError('soilTempF', 'must be a number');
	const points = [...table].sort((a, b) => a[0] - b[0]);
	for (const [i, [t, d]] of points.entries()) {
		if (!Number.isFinite(t) || !(d > 0))
			throw new PlanningInputError(`table[${i}]`, 'must be a soil °F and a positive number of days');
	}
	if (soilTempF < points[0][0] || soilTempF > points[points.length - 1][0]) return null;
	for (let i = 1; i < points.length; i++) {
		const [t0, d0] = points[i - 1];
		const [t1, d1] = points[i];
		if (soilTempF <= t1) return t1 === t0 ? d1 : d0 + ((soilTempF - t0) / (t1 - t0)) * (d1 - d0);
	}
	return points[points.length - 1][1];
}

/**
 * Days to emergence by soil temperature for the crops whose table is published — Source: Knott's
 * Handbook for Vegetable Growers, after Harrington & Minges (1954), also in Oregon State Extension.
 * Keyed by crop name (lower case, singular).
 */
export const EMERGENCE_TABLES: Readonly<Record<string, EmergenceTable>> = {
	carrot: [
		[41, 51],
		[50, 17],
		[59, 10],
		[68, 7],
		[77, 6],
		[86, 6]
	],
	beet: [
		[41, 42],
		[50, 17],
		[59, 10],
		[68, 6],
		[77, 5],
		[86, 4]
	],
	spinach: [
		[32, 63],
		[41, 23],
		[50, 12],
		[59, 7],
		[68, 6],
		[77, 5]
	],
	parsnip: [
		[32, 172],
		[41, 57],
		[50, 27],
		[59, 19],
		[68, 14],
		[77, 15]
	]
};

/**
 * The longest a direct-sown seed is left to come up: common practice (no published source), a row
 * not up within about four weeks is largely lost to rot, crusting and birds and is resown, so
 * sowing waits for soil that brings the seed up within four weeks.
 */
export const EMERGENCE_LIMIT_DAYS = 28;

/** A crop's emergence table by its name ("Carrot", "carrots", " beet " all match), or undefined. */
export function emergenceTableOf(cropName: string | undefined): EmergenceTable | undefined {
	if (typeof cropName !== 'string') return undefined;
	const key = cropName.trim().toLowerCase();
	return EMERGENCE_TABLES[key] ?? (key.endsWith('s') ? EMERGENCE_TABLES[key.slice(0, -1)] : undefined);
}

/**
 * The soil temperature (°F) from which the table brings a seed up within `limitDays`: below it the
 * seed comes up slower or not at all. Worked along the table's cold side (temperatures up to its
 * fastest point); null when even the fastest point is slower than the limit.
 */
export function soilForEmergence(table: EmergenceTable, limitDays = EMERGENCE_LIMIT_DAYS): number | null {
	const points = [...table].sort((a, b) => a[0] - b[0]);
	if (points[0][1] <= limitDays) return points[0][0];
	for (let i = 1; i < points.length; i++) {
		const [t0, d0] = points[i - 1];
		const [t1, d1] = points[i];
		if (d1 <= limitDays) return t0 + ((d0 - limitDays) / (d0 - d1)) * (t1 - t0);
	}
	return null;
}
