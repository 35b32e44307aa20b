import { requireLatitude } from './errors';
import { type DayNumber, daysFromCivil, toDayNumber, yearOfDay } from './day-number';

/**
 * Day length by the CBM model of Forsythe, Rykiel, Stahl, Wu & Schoolfield
 * (Ecological Modelling 80:87–95, 1995), with p = 0.8333° so that day starts
 * and ends when the top of the sun touches the horizon (refraction included),
 * as almanac sunrise and sunset do.
 */
const SUNRISE_P_DEG = 0.8333;

/** Day of the year of a day number, 1 = 1 January. */
export function dayOfYearOfDay(n: DayNumber): number {
	return n - daysFromCivil(yearOfDay(n), 1, 1) + 1;
}

/** Day of the year, 1 = 1 January. */
export function dayOfYear(date: string | Date): number {
	return dayOfYearOfDay(toDayNumber(date));
}

/** Day length in hours at a latitude (° N positive) on a date or day of year (1–366). */
export function dayLengthHours(latitude: number, date: string | Date | number): number {
	const lat = requireLatitude('latitude', latitude);
	const doy = typeof date === 'number' ? date : dayOfYear(date);
	const revolution = 0.2163108 + 2 * Math.atan(0.9671396 * Math.tan(0.0086 * (doy - 186)));
	const declination = Math.asin(0.39795 * Math.cos(revolution));
	const phi = (lat * Math.PI) / 180;
	const p = (SUNRISE_P_DEG * Math.PI) / 180;
	const x = (Math.sin(p) + Math.sin(phi) * Math.sin(declination)) / (Math.cos(phi) * Math.cos(declination));
	// Beyond ±1 the sun never rises (x > 1) or never sets (x < −1): polar night or day.
	const clamped = Math.min(1, Math.max(-1, x));
	return 24 - (24 / Math.PI) * Math.acos(clamped);
}
