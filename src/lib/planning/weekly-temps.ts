import { type DayNumber, weekdayOf } from './day-number';
import { isoWeekPartsOfDay } from './iso-week';

/**
 * Weekly normal mean temperatures, °F, keyed by ISO week. Keys may carry the
 * year ("2026-W19") or not ("W19", a normal that holds every year); the dated
 * key wins when both are present.
 */
export type WeeklyMeanTempF = Record<string, number>;

export type TempLookup = (day: DayNumber) => number | undefined;

/** A per-Monday memoised lookup from a day to its week's mean temperature. */
export function makeTempLookup(temps: WeeklyMeanTempF): TempLookup {
	const cache = new Map<number, number | undefined>();
	return (day: DayNumber): number | undefined => {
		const monday = day - weekdayOf(day) + 1;
		if (cache.has(monday)) return cache.get(monday);
		const { year, week } = isoWeekPartsOfDay(monday);
		const ww = week < 10 ? `W0${week}` : `W${week}`;
		const dated = temps[`${String(year).padStart(4, '0')}-${ww}`];
		const value = typeof dated === 'number' ? dated : typeof temps[ww] === 'number' ? temps[ww] : undefined;
		cache.set(monday, value);
		return value;
	};
}
