import {
	PlanningInputError,
	requireFinite,
	requireNonNegative,
	requireNonNegativeInteger,
	requirePositive,
	requirePositiveInteger,
	requireRate
} from './errors';
import type { Variety } from './types';
import { validateCurve } from './harvest-curve';
import { sowingWindowOf } from './sowing-window';

/** Check a variety's plain data; throws PlanningInputError naming `variety.<field>`. */
export function validateVariety(v: Variety): Variety {
	if (v === null || typeof v !== 'object') throw new PlanningInputError('variety', 'is required');
	const f = (name: string): string => `variety.${name}`;
	if (v.method !== 'direct' && v.method !== 'transplant') {
		throw new PlanningInputError(f('method'), `must be "direct" or "transplant" (got ${String(v.method)})`);
	}
	requireNonNegativeInteger(f('daysToMaturity'), v.daysToMaturity);
	requirePositiveInteger(f('harvestWindowDays'), v.harvestWindowDays);
	requirePositive(f('yieldPerBedFoot'), v.yieldPerBedFoot);
	requirePositiveInteger(f('rows'), v.rows);
	requirePositive(f('inRowSpacingIn'), v.inRowSpacingIn);
	requirePositiveInteger(f('seedsPerSpot'), v.seedsPerSpot);
	requireRate(f('germinationRate'), v.germinationRate);
	requirePositive(f('seedsPerGram'), v.seedsPerGram);
	if (typeof v.frostTender !== 'boolean') throw new PlanningInputError(f('frostTender'), 'must be true or false');
	if (v.method === 'transplant') {
		if (v.daysInTray === undefined) throw new PlanningInputError(f('daysInTray'), 'is required for transplants');
		requireNonNegativeInteger(f('daysInTray'), v.daysInTray);
		if (v.cellsPerTray === undefined) throw new PlanningInputError(f('cellsPerTray'), 'is required for transplants');
		requirePositiveInteger(f('cellsPerTray'), v.cellsPerTray);
	}
	if (v.heatLimitF !== undefined) requireFinite(f('heatLimitF'), v.heatLimitF);
	if (v.baseTempF !== undefined) requireFinite(f('baseTempF'), v.baseTempF);
	if (v.gddToMaturity !== undefined) requirePositive(f('gddToMaturity'), v.gddToMaturity);
	if (v.margin !== undefined) requireNonNegative(f('margin'), v.margin);
	if (v.harvestCurve !== undefined) validateCurve(v.harvestCurve, f('harvestCurve'));
	if ((v.sowFrom === undefined) !== (v.sowTo === undefined))
		throw new PlanningInputError(
			f(v.sowFrom === undefined ? 'sowFrom' : 'sowTo'),
			'is needed with the other end of the window'
		);
	sowingWindowOf(v);
	if (v.storage !== undefined) {
		if (v.storage === null || typeof v.storage !== 'object')
			throw new PlanningInputError(f('storage'), 'must be an object');
		requireNonNegativeInteger(f('storage.keepWeeks'), v.storage.keepWeeks);
		if (requireNonNegative(f('storage.lossPerWeek'), v.storage.lossPerWeek) >= 1)
			throw new PlanningInputError(f('storage.lossPerWeek'), 'must be a fraction under 1, e.g. 0.01 for 1 % a week');
	}
	return v;
}

/** A short display name: "Carrot 'Napoli'" or the id. */
export function varietyLabel(v: Variety): string {
	return v.name ?? v.crop ?? v.cropId ?? v.id ?? 'variety';
}
