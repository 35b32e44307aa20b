// The crop library's forms: one field table per object (crop, variety) gives each figure its
// label, unit, one-line help and bounds; the zod schema the server checks with is built from the
// same table, so the form, its hints and the server's messages never disagree.
import { schemaOf, withSowRule, withTrayRule, type FieldSpec, type Parsed } from './field-spec';
import { harvestUnits } from './demand';
import { sowingMethods } from './planting';

export type { ChoiceSpec, FieldSpec, Measure, NumberSpec, TextSpec } from './field-spec';
export { schemaOf, withSowRule, withTrayRule } from './field-spec';

/** The harvest curves: what each does, and (on the crop's form) which crops it fits. */
const harvestCurves = [
	['flat', 'even over the window', ''],
	['ramp', 'rises, peaks, tails off', 'fruiting crops'],
	['single', 'one cut', 'heads'],
	['cuts', 'several cuts', 'cut-and-come-again']
] as const;

export const cropFields = {
	name: { kind: 'text', label: 'Crop name', help: 'As the crew says it, e.g. "Carrot".', max: 80 },
	family: {
		kind: 'text',
		label: 'Botanical family',
		help: 'For rotation and colour, e.g. Apiaceae, Brassicaceae.',
		max: 40
	},
	harvestUnit: {
		kind: 'choice',
		label: 'Harvest unit',
		help: 'How harvests, yields and demand for this crop are counted.',
		options: harvestUnits.map((u) => ({ value: u, label: u }))
	},
	frostTolerance: {
		kind: 'choice',
		label: 'Frost',
		help: 'Tender crops are kept out of the field between the fall and spring frost dates.',
		options: [
			{ value: 'hardy', label: 'hardy (takes a light frost)' },
			{ value: 'tender', label: 'tender (killed by frost)' }
		]
	},
	heatLimitF: {
		kind: 'number',
		label: 'Heat limit',
		unit: '°F',
		measure: 'temperature',
		help: 'Weekly mean above which the crop bolts or spoils; blank for none.',
		min: 40,
		max: 120,
		optional: true
	},
	baseTempF: {
		kind: 'number',
		label: 'Base temperature',
		unit: '°F',
		measure: 'temperature',
		help: 'Growing degree days count above this: about {temp:40} for cool-season, {temp:50} for warm-season crops.',
		min: 0,
		max: 80
	},
	harvestCurve: {
		kind: 'choice',
		label: 'Harvest curve',
		help: "How a planting's yield spreads over its harvest window; a variety may differ.",
		options: harvestCurves.map(([value, label, fits]) => ({ value, label: fits ? `${label} (${fits})` : label }))
	},
	cutIntervalDays: {
		kind: 'number',
		label: 'Days between cuts',
		unit: 'days',
		help: 'For several cuts; blank for the usual interval.',
		min: 1,
		max: 120,
		int: true,
		optional: true
	},
	storageWeeks: {
		kind: 'number',
		label: 'Keeps in store',
		unit: 'weeks',
		help: 'For a storage crop (garlic, onions, squash); blank if sold fresh.',
		min: 0,
		max: 52,
		int: true,
		optional: true
	},
	storageLossPct: {
		kind: 'number',
		label: 'Loss in store',
		unit: '% a week',
		help: 'Share of what is stored that is lost each week.',
		min: 0,
		max: 100,
		scale: 100,
		optional: true,
		step: 'any'
	},
	price: {
		kind: 'number',
		label: 'Price',
		unit: '$ per {unit}',
		measure: 'pricePerUnit',
		help: 'What one harvest unit sells for; sizes box swaps between crops of other units. Blank if unknown.',
		min: 0,
		max: 10_000,
		money: true,
		optional: true,
		step: '0.01'
	},
	sowFrom: {
		kind: 'text',
		label: 'Earliest field date',
		help: 'Month-day (MM-DD) it may first be sown or set out each year, e.g. 10-01 for garlic; blank: no limit.',
		max: 5,
		optional: true,
		monthDay: true
	},
	sowTo: {
		kind: 'text',
		label: 'Latest field date',
		help: 'Month-day (MM-DD) of the last sowing or setting out, e.g. 12-15; may be in the next year.',
		max: 5,
		optional: true,
		monthDay: true
	},
	source: {
		kind: 'text',
		label: 'Source',
		help: 'Where these figures come from (handbook, extension guide, own records).',
		max: 500,
		optional: true
	}
} as const satisfies Record<string, FieldSpec>;

export const varietyFields = {
	name: { kind: 'text', label: 'Variety name', help: 'Your name for it, e.g. "Nantes type" or "standard".', max: 80 },
	method: {
		kind: 'choice',
		label: 'Method',
		help: 'Direct-sown in the bed, or raised in trays and transplanted.',
		options: sowingMethods.map((m) => ({ value: m, label: m === 'direct' ? 'direct sow' : 'transplant' }))
	},
	daysToMaturity: {
		kind: 'number',
		label: 'Days to maturity',
		unit: 'days',
		help: 'From sowing for direct-sown crops, from transplanting for transplants.',
		min: 1,
		max: 400,
		int: true
	},
	daysInTray: {
		kind: 'number',
		label: 'Days in tray',
		unit: 'days',
		help: 'From tray sowing to transplanting; 0 for direct-sown.',
		min: 0,
		max: 200,
		int: true
	},
	harvestWindowDays: {
		kind: 'number',
		label: 'Harvest window',
		unit: 'days',
		help: 'How long one planting keeps giving harvests.',
		min: 1,
		max: 365,
		int: true
	},
	yieldPerBedFoot: {
		kind: 'number',
		label: 'Yield',
		unit: '{unit} per bed-ft',
		measure: 'yieldPerLength',
		help: 'Over the whole harvest window, per {length} of bed (all rows).',
		min: 0.001,
		max: 100_000,
		step: 'any'
	},
	rows: {
		kind: 'number',
		label: 'Rows per bed',
		unit: 'rows',
		help: 'Rows across one bed.',
		min: 1,
		max: 50,
		int: true
	},
	inRowSpacingIn: {
		kind: 'number',
		label: 'In-row spacing',
		unit: 'in',
		measure: 'spacing',
		help: 'Between spots along a row.',
		min: 0.1,
		max: 240,
		step: 'any'
	},
	seedsPerSpot: {
		kind: 'number',
		label: 'Seeds per spot',
		unit: 'seeds',
		help: 'More than 1 for multi-sowing (onions, beets).',
		min: 1,
		max: 50,
		int: true
	},
	germinationRate: {
		kind: 'number',
		label: 'Germination',
		unit: '%',
		help: 'Share of seeds that come up, from the seed packet or your own test.',
		min: 1,
		max: 100,
		scale: 100,
		step: 'any'
	},
	seedsPerGram: {
		kind: 'number',
		label: 'Seeds per gram',
		unit: 'seeds/g',
		measure: 'seedsPerWeight',
		help: 'Seed count in one {weight}, from the packet or a weighed count.',
		min: 0.01,
		max: 10_000_000,
		step: 'any'
	},
	seedPrice: {
		kind: 'number',
		label: 'Seed price',
		unit: '$ per g',
		measure: 'pricePerSeedWeight',
		help: 'For the seed order; 0 if unknown.',
		min: 0,
		max: 10_000,
		step: '0.01',
		money: true
	},
	seedsPerPacket: {
		kind: 'number',
		label: 'Seeds per packet',
		unit: 'seeds',
		help: 'To count packets; blank to order by weight.',
		min: 1,
		max: 10_000_000,
		int: true,
		optional: true
	},
	cellsPerTray: {
		kind: 'number',
		label: 'Cells per tray',
		unit: 'cells',
		help: 'Tray size for transplants, e.g. 72 or 128.',
		min: 1,
		max: 2000,
		int: true
	},
	margin: {
		kind: 'number',
		label: 'Extra margin',
		unit: '%',
		help: 'Extra seed and bed space on top of the target, for losses.',
		min: 0,
		max: 100,
		scale: 100,
		step: 'any'
	},
	harvestCurve: {
		kind: 'choice',
		label: 'Harvest curve',
		help: "Leave as the crop's, or give this variety its own.",
		options: [{ value: '', label: 'as the crop' }, ...harvestCurves.map(([value, label]) => ({ value, label }))]
	},
	gddToMaturity: {
		kind: 'number',
		label: 'Degree days to maturity',
		unit: 'GDD',
		help: 'Optional: with weekly temperatures set, maturity follows degree days above the base.',
		min: 1,
		max: 20_000,
		int: true,
		optional: true
	},
	source: { kind: 'text', label: 'Source', help: 'Where these figures come from.', max: 500, optional: true }
} as const satisfies Record<string, FieldSpec>;

/** The forms in canonical units (°F, inches, lb per foot, seeds and dollars per gram). */
export const cropSchema = withSowRule(schemaOf(cropFields));
export const varietySchema = withTrayRule(schemaOf(varietyFields));

export type HarvestCurveName = 'flat' | 'ramp' | 'single' | 'cuts';
export type CropInput = Omit<Parsed<typeof cropFields>, 'harvestUnit' | 'frostTolerance' | 'harvestCurve'> & {
	harvestUnit: (typeof harvestUnits)[number];
	frostTolerance: 'tender' | 'hardy';
	harvestCurve: HarvestCurveName;
};
/** A variety's harvest curve: '' keeps the crop's. */
export type VarietyInput = Omit<Parsed<typeof varietyFields>, 'method' | 'harvestCurve'> & {
	method: (typeof sowingMethods)[number];
	harvestCurve: HarvestCurveName | '';
};

/** A field's unit with the crop's harvest unit filled in. */
export function unitLabel(spec: FieldSpec, harvestUnit: string): string {
	return spec.kind === 'number' ? spec.unit.replace('{unit}', harvestUnit) : '';
}

/** How a stored value shows in its form field (fractions as percents, cents as money, farm units). */
export function formValue(spec: FieldSpec, value: unknown): string {
	if (value === null || value === undefined) return '';
	if (spec.kind === 'number' && spec.scale && typeof value === 'number')
		return String(Math.round(value * spec.scale * 1000) / 1000);
	if (spec.kind === 'number' && spec.fromStored && typeof value === 'number') {
		const shown = spec.fromStored(value);
		return String(Number(shown.toFixed(spec.money ? 2 : Math.abs(shown) >= 100 ? 1 : 3)));
	}
	return String(value);
}
