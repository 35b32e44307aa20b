// The engine explains its arithmetic in its own units (feet, inches, grams, the crop's unit); the
// grid's explain panel shows the same steps in the farm's units: metres, centimetres and kilograms
// on a metric farm, ounces of seed on an imperial one. Figures only are converted, never recomputed.
import type { ExplainStep } from '$lib/planning';
import type { VarietyView } from '$lib/types';
import {
	formatFeet,
	formatNumber,
	seedWeightDigits,
	seedWeightUnit,
	toDisplayFeet,
	toDisplayInches,
	toDisplayPerFoot,
	toDisplayPricePerSeedWeight,
	toDisplayQuantity,
	toDisplaySeedWeight,
	toDisplaySeedsPerWeight,
	unitLabel,
	type UnitSystem
} from '$lib/format';

export function explainInFarmUnits(
	steps: ExplainStep[],
	v: VarietyView,
	row: { lengthFt: number; inRowSpacingIn: number },
	units: UnitSystem
): ExplainStep[] {
	const n = (x: number, digits = 2): string => formatNumber(x, digits);
	const w = seedWeightUnit(units);
	const num = (label: string): number | undefined => {
		const s = steps.find((x) => x.label === label);
		return typeof s?.value === 'number' ? s.value : undefined;
	};
	const seeds = num('seeds') ?? 0;
	const weight = (g: number): number => {
		const x = toDisplaySeedWeight(g, units);
		return Number(x.toFixed(seedWeightDigits(x)));
	};
	const crop = (x: number): number => Number(toDisplayQuantity(x, v.harvestUnit, units).toFixed(2));
	const metric = units === 'metric';
	const yieldUnit = unitLabel(v.harvestUnit, units, 1);
	return steps.map((s): ExplainStep => {
		const value = typeof s.value === 'number' ? s.value : undefined;
		switch (s.label) {
			case 'spots per row': {
				if (!metric) return s;
				const ratio = Number(((row.lengthFt * 12) / row.inRowSpacingIn).toFixed(3));
				const m = toDisplayFeet(row.lengthFt, units);
				const cm = toDisplayInches(row.inRowSpacingIn, units);
				return { ...s, formula: `floor(${n(m)} m × 100 cm ÷ ${n(cm)} cm = ${ratio}) — whole spots only` };
			}
			case 'seed weight':
				return {
					...s,
					value: value === undefined ? s.value : weight(value),
					unit: w,
					formula: `${n(seeds, 0)} seeds ÷ ${n(toDisplaySeedsPerWeight(v.seedsPerGram, units))} per ${w}, rounded up`
				};
			case 'seed cost': {
				const g = num('seed weight') ?? 0;
				const price = toDisplayPricePerSeedWeight(v.seedPriceCentsPerGram, units);
				return { ...s, formula: `${weight(g)} ${w} × ${n(price)} ¢/${w}` };
			}
			// The yields carry the crop's harvest unit in either system (the engine's steps leave it out).
			case 'expected yield':
			case 'weekly yield':
				if (value === undefined) return s;
				if (!metric) return { ...s, unit: yieldUnit };
				return {
					...s,
					value: crop(value),
					unit: yieldUnit,
					formula:
						s.label === 'expected yield'
							? `${formatFeet(row.lengthFt, units)} × ${n(toDisplayPerFoot(v.yieldPerBedFoot, v.harvestUnit, units))} per bed-metre over the window`
							: `${crop(num('expected yield') ?? 0)} ÷ (${v.harvestWindowDays} days ÷ 7)`
				};
			default:
				return s;
		}
	});
}
