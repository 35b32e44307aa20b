// A plan's options checked and filled with their defaults, as planRuns works with them.
import { PlanningInputError, requireLatitude, requireNonNegative, requirePositive } from './errors';
import { type DayNumber, toDayNumber } from './day-number';
import type { DtmContext } from './effective-dtm';
import type { Farm, PlanOptions } from './succession-types';
import type { PlanningWarning, Variety } from './types';
import { type TempLookup, makeTempLookup } from './weekly-temps';

export interface ResolvedOptions {
	interval: number;
	/** Weeks between candidate starts: the asked-for interval, else 1. */
	stepWeeks: number;
	margin: number;
	increment: number;
	seedMargin: number;
	today?: DayNumber;
	earliestField?: DayNumber;
	dtm: DtmContext;
}

export function resolveOptions(
	v: Variety,
	farm: Farm,
	o: PlanOptions,
	warnings: PlanningWarning[],
	temps?: TempLookup
): ResolvedOptions {
	const fullWeeks = Math.floor(v.harvestWindowDays / 7);
	const maxInterval = Math.max(1, fullWeeks);
	let interval = 1;
	if (o.intervalWeeks !== undefined) {
		if (!Number.isInteger(o.intervalWeeks) || o.intervalWeeks < 1 || o.intervalWeeks > 4) {
			throw new PlanningInputError(
				'options.intervalWeeks',
				`must be a whole number of weeks from 1 to 4 (got ${o.intervalWeeks})`
			);
		}
		interval = o.intervalWeeks;
		if (interval > maxInterval) {
			// A window of fewer whole weeks than the interval cannot supply every week it is meant to:
			// split into more successions rather than leave weeks bare.
			warnings.push({
				code: 'interval_shortened',
				message: `Asked for successions every ${interval} weeks, but each harvest window (${v.harvestWindowDays} days) covers only ${maxInterval} whole week${maxInterval > 1 ? 's' : ''}; planned every ${maxInterval} week${maxInterval > 1 ? 's' : ''} so no target week goes bare.`
			});
			interval = maxInterval;
		}
	}
	const margin = o.margin === undefined ? 0.1 : requireNonNegative('options.margin', o.margin);
	const increment =
		o.bedFootIncrement === undefined ? 1 : requirePositive('options.bedFootIncrement', o.bedFootIncrement);
	const seedMargin =
		v.margin ?? (o.seedMargin === undefined ? 0.1 : requireNonNegative('options.seedMargin', o.seedMargin));
	return {
		interval,
		stepWeeks: interval,
		margin,
		increment,
		seedMargin,
		today: o.today === undefined ? undefined : toDayNumber(o.today, 'options.today'),
		earliestField:
			o.earliestFieldDate === undefined ? undefined : toDayNumber(o.earliestFieldDate, 'options.earliestFieldDate'),
		dtm: {
			latitude: requireLatitude('farm.latitude', farm.latitude),
			shortDayThresholdHours:
				o.shortDayThresholdHours === undefined
					? 10
					: requireNonNegative('options.shortDayThresholdHours', o.shortDayThresholdHours),
			gddWalkLimitDays:
				o.gddWalkLimitDays === undefined ? 365 : requirePositive('options.gddWalkLimitDays', o.gddWalkLimitDays),
			temps: farm.weeklyMeanTempF ? (temps ?? makeTempLookup(farm.weeklyMeanTempF)) : undefined
		}
	};
}
