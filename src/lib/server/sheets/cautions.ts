// Short safety notes on the sheets, by task kind. They defer to local rules and the seed
// supplier's label rather than replace them.
import type { SectionKind } from './week';

export const cautions: Record<SectionKind, string[]> = {
	tray_sow: ['Treated seed (coloured coating): wear gloves, keep it away from food and feed, and follow the seed label and local rules.'],
	direct_sow: [
		'Treated seed (coloured coating): wear gloves, keep it away from food and feed, and follow the seed label and local rules.',
		'Heat: in hot weather work the cool hours, keep water and shade at hand, and rest often.'
	],
	transplant: ['Heat: in hot weather work the cool hours, keep water and shade at hand, and rest often. Water transplants in well.'],
	harvest: [
		'Food safety: wash hands before harvest, use clean bins and potable water for washing, keep produce off the ground and cool it quickly, as your local food-safety rules require.',
		'Heat: harvest in the cool hours where you can, with water and shade at hand.'
	]
};
