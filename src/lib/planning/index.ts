/**
 * Furrowcast planning engine: pure TypeScript, plain data in and out, no I/O.
 * Runs on the server (authoritative) and in the browser (instant recalculation).
 */
export { PlanningInputError } from './errors';
export type {
	CropWeekQuantity,
	ExplainStep,
	GrowingFigures,
	PlanningWarning,
	SowingMethod,
	Variety,
	WarningCode,
	WeeklyTarget
} from './types';

export {
	addDays,
	addWeeks,
	daysBetween,
	formatWeekDate,
	isoWeek,
	isoWeekday,
	parseIsoWeek,
	weekStart,
	weeksBetween,
	weeksInIsoYear,
	type IsoWeek
} from './iso-week';
export { growingDegreeDays, meanDegreeDays } from './degree-days';
export { dayLengthHours, dayOfYear } from './day-length';
export { seedNeed, spotsPerRow, type SeedNeed, type SeedNeedInput } from './seed';
export { validateVariety } from './variety';
export type { WeeklyMeanTempF } from './weekly-temps';
export { type DtmSource, type EffectiveDtm, maturityFrom, shortDayRate } from './effective-dtm';
export {
	derivePlanting,
	seedInputOf,
	type DeriveFarm,
	type DeriveInput,
	type DerivedPlanting,
	type SeededPlanting
} from './planting-derive';
export {
	planSuccessions,
	type Farm,
	type PlanInput,
	type PlanOptions,
	type PlanResult,
	type Succession,
	type SuccessionBasis,
	sizingLp
} from './successions';
export {
	type HarvestCurve,
	type HarvestCurveShape,
	cumulativeWeights,
	dailyWeights,
	validateCurve
} from './harvest-curve';
export type { Bed, BedPlanting } from './bed-types';
export {
	placePlantings,
	type PlacedRange,
	type PlacementNote,
	type PlacementOptions,
	type PlacementRequest,
	type PlacementResult
} from './placement';
export { checkBedConflicts, type BedConflict } from './bed-conflicts';
export { freeSpace, type BedFreeSpace, type FreeRange } from './free-space';
export { explainSupply, forecast, type ForecastPlanting, type ForecastRow } from './forecast';
export { checkBoxes, type BoxCheck } from './box-check';
export * from './matching';
export {
	deriveTargets,
	deriveTargetsWithNotes,
	explainTargets,
	type BoxItem,
	type ShareSize,
	type TargetInput,
	type TargetNote
} from './targets';
export { explainBedFeet, explainDates, explainPlanting, explainSeed } from './explain';
export * from './units';
export { planSeason } from './season';
export type * from './season-types';
export {
	emergenceDays,
	emergenceTableOf,
	soilForEmergence,
	EMERGENCE_LIMIT_DAYS,
	EMERGENCE_TABLES,
	type EmergenceTable
} from './emergence';
export { defaultEarliestFieldDate, soilMinimumOf } from './sowing-window';
export * from './actuals';
export * from './season-shift';
