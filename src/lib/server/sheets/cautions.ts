// Short safety notes on the sheets, by task kind. They defer to local rules and the seed
// supplier's label rather than replace them.
import type { SectionKind } from './week';
import { formatTemp, type UnitSystem } from '$lib/format';

const treatedSeed =
	'Treated seed (coloured coating): wear gloves, keep it away from food and feed, and follow the seed label and local rules.';
const foodSafety =
	'Food safety: wash hands before harvest, use clean bins and potable water for washing, keep produce off the ground and cool it quickly, as your local food-safety rules require.';

/**
 * Weekly normal means (°F) from which the heat note changes: below COOL_WEEK_F a week is too cool
 * for one; from HOT_WEEK_F the afternoons are hot enough (highs around the upper 80s) to warn in
 * earnest. Common practice (no published source); the farm's own heat-safety rules come first.
 */
export const COOL_WEEK_F = 60;
export const HOT_WEEK_F = 75;

function heatNote(kind: SectionKind, meanF: number | null, system: UnitSystem): string[] {
	if (kind === 'tray_sow') return [];
	if (meanF !== null && meanF < COOL_WEEK_F) return [];
	const extra = kind === 'transplant' ? ' Water transplants in well.' : '';
	if (meanF !== null && meanF >= HOT_WEEK_F) {
		return [
			`Heat: this week's normal mean is ${formatTemp(meanF, system)}, so expect hot afternoons. Start early and ${kind === 'harvest' ? 'harvest' : 'work'} in the cool hours, drink water often, rest in the shade, and watch each other for signs of heat illness; follow your local heat-safety rules.${extra}`
		];
	}
	if (kind === 'harvest') return ['Heat: harvest in the cool hours where you can, with water and shade at hand.'];
	return [`Heat: in hot weather work the cool hours, keep water and shade at hand, and rest often.${extra}`];
}

/**
 * The cautions of each section for a week whose normal mean is `meanF` (°F; null: the farm has
 * none), the temperature written in the farm's units.
 */
export function cautionsFor(meanF: number | null, system: UnitSystem = 'imperial'): Record<SectionKind, string[]> {
	return {
		tray_sow: [treatedSeed],
		direct_sow: [treatedSeed, ...heatNote('direct_sow', meanF, system)],
		transplant: heatNote('transplant', meanF, system),
		harvest: [foodSafety, ...heatNote('harvest', meanF, system)]
	};
}
