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
