// The starter library a new farm picks crops from: common market-garden crops with one or two
// generic varieties each (our own names, no seed-company varieties). Picked crops are copied into
// the farm's own library, where the owner edits them; this list never changes a farm's figures.
//
// Where each figure comes from is written in the crop's and variety's `source` and travels with
// the copy. Rules used throughout:
// - Seeds per gram = seeds per ounce ÷ 28.349523125 (NIST Handbook 44, Appendix C).
// - Yield per bed-foot "per acre" = the handbook's lb per acre ÷ 10,890 bed-feet per acre
//   (43,560 ft² ÷ beds on 4 ft centres: a 30 in bed and an 18 in path; the bed width is ours).
// - Yield per bed-foot "per row" = the handbook's yield per 100 ft of row ÷ 100 × rows per bed.
//   The handbooks' rows are usually wider apart than a bed's, so check these against your own.
// - Rows per bed, in-row spacing, harvest window, days in tray, germination and margin are
//   common practice (no published source) unless a source is named for them.
// - Figures marked "from memory" were recalled, not read from a source: check them.
import type { CropInput, VarietyInput } from '$lib/schemas/crop';

const OZ_G = 28.349523125;
const BED_FEET_PER_ACRE = 43_560 / 4;
const perGram = (seedsPerOz: number): number => Math.round((seedsPerOz / OZ_G) * 100) / 100;
const perAcre = (lbPerAcre: number): number => Math.round((lbPerAcre / BED_FEET_PER_ACRE) * 100) / 100;
const perRow = (per100ft: number, rows: number): number => Math.round((per100ft / 100) * rows * 100) / 100;

const HANDBOOKS = 'Univ. of Illinois Extension vegetable guide; Kansas State MF-315; Oregon State Extension';
const NEVMG = "New England Vegetable Management Guide, Table 15 (after Knott's Handbook)";
const GDD_BASE = 'base temp: Oklahoma State Univ. GDD notes (40 °F cool-season, 50 °F warm-season)';
const PRACTICE = 'rows, spacing, window, germination: common practice (no published source)';
const MEMORY = 'figures common practice (no published source), from memory: check before relying on them';

export interface StarterVariety extends Omit<
	VarietyInput,
	'source' | 'seedPrice' | 'seedsPerPacket' | 'gddToMaturity' | 'harvestCurve'
> {
	source: string;
}
export interface StarterCrop extends Omit<
	CropInput,
	'source' | 'price' | 'harvestCurve' | 'cutIntervalDays' | 'storageWeeks' | 'storageLossPct' | 'sowFrom' | 'sowTo'
> {
	/** Common practice (no published source): beans and cucurbits ramp, heads are one cut; default flat. */
	harvestCurve?: CropInput['harvestCurve'];
	/** Field dates (MM-DD), only where frost dates and soil temperature do not already set them. */
	sowFrom?: string | null;
	sowTo?: string | null;
	key: string;
	source: string;
	varieties: StarterVariety[];
}

type V = Omit<StarterVariety, 'cellsPerTray' | 'margin' | 'seedsPerSpot' | 'daysInTray'> &
	Partial<Pick<StarterVariety, 'cellsPerTray' | 'margin' | 'seedsPerSpot' | 'daysInTray'>>;
const v = (x: V): StarterVariety => ({ daysInTray: 0, seedsPerSpot: 1, cellsPerTray: 128, margin: 0.1, ...x });

const cool = { frostTolerance: 'hardy', baseTempF: 40 } as const;
const warm = { frostTolerance: 'tender', baseTempF: 50 } as const;

// Harvest curves, common practice (no published source): bush beans pick over 2–3 weeks, peaking in
// the second; cucumbers and summer squash rise over their first weeks; head crops are one cut.
const CURVES: Record<string, CropInput['harvestCurve']> = {
	bean: 'ramp',
	cucumber: 'ramp',
	zucchini: 'ramp',
	tomato: 'ramp',
	lettuce: 'single',
	cabbage: 'single',
	broccoli: 'single',
	cauliflower: 'single',
	'bok-choy': 'single',
	kohlrabi: 'single'
};

const listed: StarterCrop[] = [
	{
		key: 'carrot',
		name: 'Carrot',
		family: 'Apiaceae',
		harvestUnit: 'lb',
		...cool,
		heatLimitF: null,
		source: GDD_BASE,
		varieties: [
			v({
				name: 'Carrot, standard',
				method: 'direct',
				daysToMaturity: 70,
				harvestWindowDays: 14,
				yieldPerBedFoot: perAcre(26_000),
				rows: 4,
				inRowSpacingIn: 1,
				germinationRate: 0.65,
				seedsPerGram: perGram(22_000),
				source: `22,000 seeds/oz (18,000–25,000), 65–75 days: ${HANDBOOKS}; yield 26,000 lb/acre (good): ${NEVMG}; ${PRACTICE}`
			}),
			v({
				name: 'Carrot, storage',
				method: 'direct',
				daysToMaturity: 75,
				harvestWindowDays: 28,
				yieldPerBedFoot: perAcre(26_000),
				rows: 4,
				inRowSpacingIn: 1,
				germinationRate: 0.65,
				seedsPerGram: perGram(22_000),
				source: `22,000 seeds/oz, 75 days (top of 65–75): ${HANDBOOKS}; yield 26,000 lb/acre: ${NEVMG}; ${PRACTICE}`
			})
		]
	},
	{
		key: 'beet',
		name: 'Beet',
		family: 'Amaranthaceae',
		harvestUnit: 'lb',
		...cool,
		heatLimitF: null,
		source: GDD_BASE,
		varieties: [
			v({
				name: 'Beet, direct-sown',
				method: 'direct',
				daysToMaturity: 60,
				harvestWindowDays: 21,
				yieldPerBedFoot: perAcre(24_000),
				rows: 4,
				inRowSpacingIn: 3,
				germinationRate: 0.8,
				seedsPerGram: perGram(1_800),
				source: `1,800 seeds/oz (1,500–2,200), 52–70 days: ${HANDBOOKS}; yield 24,000 lb/acre (good): ${NEVMG}; ${PRACTICE}`
			}),
			v({
				name: 'Beet, multi-sown transplant',
				method: 'transplant',
				daysToMaturity: 50,
				daysInTray: 28,
				harvestWindowDays: 21,
				yieldPerBedFoot: perAcre(24_000),
				rows: 4,
				inRowSpacingIn: 6,
				seedsPerSpot: 3,
				germinationRate: 0.8,
				seedsPerGram: perGram(1_800),
				cellsPerTray: 128,
				source: `1,800 seeds/oz: ${HANDBOOKS}; yield 24,000 lb/acre: ${NEVMG}; 3 seeds per cell, 50 days from transplant: common practice (no published source)`
			})
		]
	},
	{
		key: 'radish',
		name: 'Radish',
		family: 'Brassicaceae',
		harvestUnit: 'bunch',
		...cool,
		heatLimitF: 75,
		source: `${GDD_BASE}; heat limit: common practice (no published source)`,
		varieties: [
			v({
				name: 'Radish, round red',
				method: 'direct',
				daysToMaturity: 25,
				harvestWindowDays: 7,
				yieldPerBedFoot: perRow(100, 4),
				rows: 4,
				inRowSpacingIn: 1,
				germinationRate: 0.85,
				seedsPerGram: perGram(2_500),
				source: `2,500 seeds/oz, 22–28 days, 100 bunches per 100 ft of row: ${HANDBOOKS}; ${PRACTICE}`
			})
		]
	},
	{
		key: 'lettuce',
		name: 'Lettuce, head',
		family: 'Asteraceae',
		harvestUnit: 'head',
		...cool,
		heatLimitF: 80,
		source: `${GDD_BASE}; heat limit: common practice (no published source)`,
		varieties: [
			v({
				name: 'Lettuce, head, standard',
				method: 'transplant',
				daysToMaturity: 45,
				daysInTray: 28,
				harvestWindowDays: 7,
				yieldPerBedFoot: 2.7,
				rows: 3,
				inRowSpacingIn: 12,
				germinationRate: 0.85,
				seedsPerGram: perGram(25_000),
				cellsPerTray: 128,
				source: `25,000 seeds/oz, 45–70 days from seeding: ${HANDBOOKS}; 45 days from transplant and 2.7 heads per bed-ft (3 rows at 12 in, 9 in 10 cut): common practice (no published source)`
			})
		]
	},
	{
		key: 'spinach',
		name: 'Spinach',
		family: 'Amaranthaceae',
		harvestUnit: 'lb',
		...cool,
		heatLimitF: 75,
		source: `${GDD_BASE}; bolts in hot weeks (limit: common practice, no published source)`,
		varieties: [
			v({
				name: 'Spinach, standard',
				method: 'direct',
				daysToMaturity: 45,
				harvestWindowDays: 14,
				yieldPerBedFoot: perRow(45, 4),
				rows: 4,
				inRowSpacingIn: 2,
				germinationRate: 0.8,
				seedsPerGram: perGram(2_800),
				source: `2,800 seeds/oz, 45 days, 40–50 lb per 100 ft of row: ${HANDBOOKS}; ${PRACTICE}`
			})
		]
	},
	{
		key: 'arugula',
		name: 'Arugula',
		family: 'Brassicaceae',
		harvestUnit: 'lb',
		...cool,
		heatLimitF: 80,
		source: `${GDD_BASE}; heat limit: common practice (no published source)`,
		varieties: [
			v({
				name: 'Arugula, standard',
				method: 'direct',
				daysToMaturity: 30,
				harvestWindowDays: 14,
				yieldPerBedFoot: perRow(30, 4),
				rows: 4,
				inRowSpacingIn: 1,
				germinationRate: 0.85,
				seedsPerGram: perGram(14_000),
				source: `14,000 seeds/oz (13,000–15,400), 24–35 days, 25–35 lb per 100 ft: seed-supplier growing tables; ${PRACTICE}`
			})
		]
	},
	{
		key: 'cilantro',
		name: 'Cilantro',
		family: 'Apiaceae',
		harvestUnit: 'bunch',
		...cool,
		heatLimitF: 85,
		source: `bolts above 85 °F: Texas A&M AgriLife, Cilantro in the Garden; ${GDD_BASE}`,
		varieties: [
			v({
				name: 'Cilantro, standard',
				method: 'direct',
				daysToMaturity: 50,
				harvestWindowDays: 14,
				yieldPerBedFoot: 2,
				rows: 4,
				inRowSpacingIn: 2,
				germinationRate: 0.75,
				seedsPerGram: perGram(2_000),
				source: `about 2,000 seeds/oz: Texas A&M AgriLife, Cilantro in the Garden; days, yield and spacing: ${MEMORY}`
			})
		]
	},
	{
		key: 'parsnip',
		name: 'Parsnip',
		family: 'Apiaceae',
		harvestUnit: 'lb',
		...cool,
		heatLimitF: null,
		source: GDD_BASE,
		varieties: [
			v({
				name: 'Parsnip, standard',
				method: 'direct',
				daysToMaturity: 110,
				harvestWindowDays: 42,
				yieldPerBedFoot: perRow(100, 3),
				rows: 3,
				inRowSpacingIn: 3,
				germinationRate: 0.6,
				seedsPerGram: perGram(9_600),
				source: `9,600 seeds/oz (sources give 7,200–12,000), 100+ days, 100 lb per 100 ft of row: ${HANDBOOKS}; seed-supplier tables; ${PRACTICE}`
			})
		]
	},
	{
		key: 'onion',
		name: 'Onion',
		family: 'Amaryllidaceae',
		harvestUnit: 'lb',
		...cool,
		heatLimitF: null,
		source: GDD_BASE,
		varieties: [
			v({
				name: 'Onion, storage, multi-sown',
				method: 'transplant',
				daysToMaturity: 100,
				daysInTray: 56,
				harvestWindowDays: 14,
				yieldPerBedFoot: perRow(100, 4),
				rows: 4,
				inRowSpacingIn: 12,
				seedsPerSpot: 4,
				germinationRate: 0.75,
				seedsPerGram: perGram(8_000),
				cellsPerTray: 128,
				source: `8,000 seeds/oz, 90–110 days, 100 lb per 100 ft of row: ${HANDBOOKS}; 4 seeds per cell at 12 in, 56 days in tray: common practice (no published source)`
			})
		]
	},
	{
		key: 'kale',
		name: 'Kale',
		family: 'Brassicaceae',
		harvestUnit: 'lb',
		...cool,
		heatLimitF: null,
		source: GDD_BASE,
		varieties: [
			v({
				name: 'Kale, curly',
				method: 'transplant',
				daysToMaturity: 55,
				daysInTray: 28,
				harvestWindowDays: 56,
				yieldPerBedFoot: perAcre(12_000),
				rows: 2,
				inRowSpacingIn: 12,
				germinationRate: 0.85,
				seedsPerGram: perGram(8_000),
				cellsPerTray: 72,
				source: `8,000 seeds/oz (7,500–8,700), 50–60 days: Univ. of Illinois Extension; Kansas State MF-315; yield 12,000 lb/acre (good): ${NEVMG}; ${PRACTICE}`
			})
		]
	},
	{
		key: 'tomato',
		name: 'Tomato',
		family: 'Solanaceae',
		harvestUnit: 'lb',
		...warm,
		heatLimitF: null,
		source: GDD_BASE,
		varieties: [
			v({
				name: 'Tomato, slicer',
				method: 'transplant',
				daysToMaturity: 75,
				daysInTray: 49,
				harvestWindowDays: 56,
				yieldPerBedFoot: perRow(100, 1),
				rows: 1,
				inRowSpacingIn: 24,
				germinationRate: 0.85,
				seedsPerGram: perGram(11_000),
				cellsPerTray: 50,
				source: `11,000 seeds/oz, 50 plants and 100 lb per 100 ft of row: ${HANDBOOKS}; 75 days from transplant, 49 days in tray: ${MEMORY}`
			}),
			v({
				name: 'Tomato, cherry',
				method: 'transplant',
				daysToMaturity: 65,
				daysInTray: 49,
				harvestWindowDays: 70,
				yieldPerBedFoot: perRow(100, 1),
				rows: 1,
				inRowSpacingIn: 24,
				germinationRate: 0.85,
				seedsPerGram: perGram(11_000),
				cellsPerTray: 50,
				source: `11,000 seeds/oz, 100 lb per 100 ft of row: ${HANDBOOKS}; 65 days, 70-day window: ${MEMORY}`
			})
		]
	},
	{
		key: 'bean',
		name: 'Bean, bush snap',
		family: 'Fabaceae',
		harvestUnit: 'lb',
		...warm,
		heatLimitF: null,
		source: GDD_BASE,
		varieties: [
			v({
				name: 'Bean, bush, standard',
				method: 'direct',
				daysToMaturity: 55,
				harvestWindowDays: 21,
				yieldPerBedFoot: perAcre(8_000),
				rows: 2,
				inRowSpacingIn: 3,
				germinationRate: 0.85,
				seedsPerGram: perGram(100),
				source: `100 seeds/oz, 51–58 days: ${HANDBOOKS}; yield 8,000 lb/acre (good): ${NEVMG}; picks over about 3 weeks: common practice (no published source)`
			})
		]
	},
	...memoryCrops()
];

// Field dates (month-day, the earliest and latest day to sow or set out), only where the frost dates
// and soil temperatures the planner already follows do not set the season: garlic goes in in
// autumn for a harvest the next summer, a few weeks before the ground freezes (northern temperate
// farms; common practice, no published source). Every other crop is left without them: fixed
// calendar days would be wrong for another climate, while frost and soil temperature move with it.
const FIELD_DATES: Record<string, { sowFrom: string; sowTo: string; source: string }> = {
	garlic: {
		sowFrom: '10-01',
		sowTo: '11-30',
		source: 'field dates 10-01 to 11-30 (autumn, before the ground freezes): common practice (no published source)'
	}
};

export const starterCrops: readonly StarterCrop[] = listed.map((c) => {
	const dates = FIELD_DATES[c.key];
	return {
		...c,
		...(CURVES[c.key] ? { harvestCurve: CURVES[c.key] } : {}),
		...(dates ? { sowFrom: dates.sowFrom, sowTo: dates.sowTo, source: `${c.source}; ${dates.source}` } : {})
	};
});

/** Crops not in the reference tables we hold: every figure common practice, from memory. */
function memoryCrops(): StarterCrop[] {
	const m = (
		key: string,
		name: string,
		family: string,
		harvestUnit: CropInput['harvestUnit'],
		kind: typeof cool | typeof warm,
		heatLimitF: number | null,
		varieties: Omit<V, 'source'>[]
	): StarterCrop => ({
		key,
		name,
		family,
		harvestUnit,
		...kind,
		heatLimitF,
		source: `${GDD_BASE}; the rest ${MEMORY}`,
		varieties: varieties.map((x) => v({ ...x, source: MEMORY }))
	});
	return [
		m('pepper', 'Pepper, sweet', 'Solanaceae', 'lb', warm, null, [
			{
				name: 'Pepper, bell',
				method: 'transplant',
				daysToMaturity: 70,
				daysInTray: 56,
				harvestWindowDays: 56,
				yieldPerBedFoot: 1.5,
				rows: 2,
				inRowSpacingIn: 18,
				germinationRate: 0.8,
				seedsPerGram: perGram(4_500),
				cellsPerTray: 72
			}
		]),
		m('eggplant', 'Eggplant', 'Solanaceae', 'lb', warm, null, [
			{
				name: 'Eggplant, standard',
				method: 'transplant',
				daysToMaturity: 70,
				daysInTray: 56,
				harvestWindowDays: 56,
				yieldPerBedFoot: 2,
				rows: 2,
				inRowSpacingIn: 18,
				germinationRate: 0.8,
				seedsPerGram: perGram(6_500),
				cellsPerTray: 72
			}
		]),
		m('cucumber', 'Cucumber', 'Cucurbitaceae', 'lb', warm, null, [
			{
				name: 'Cucumber, slicing',
				method: 'transplant',
				daysToMaturity: 50,
				daysInTray: 21,
				harvestWindowDays: 42,
				yieldPerBedFoot: 3,
				rows: 1,
				inRowSpacingIn: 12,
				germinationRate: 0.85,
				seedsPerGram: perGram(1_000),
				cellsPerTray: 50
			},
			{
				name: 'Cucumber, direct-sown',
				method: 'direct',
				daysToMaturity: 58,
				harvestWindowDays: 42,
				yieldPerBedFoot: 3,
				rows: 1,
				inRowSpacingIn: 12,
				seedsPerSpot: 2,
				germinationRate: 0.85,
				seedsPerGram: perGram(1_000)
			}
		]),
		m('zucchini', 'Summer squash', 'Cucurbitaceae', 'lb', warm, null, [
			{
				name: 'Summer squash, zucchini',
				method: 'direct',
				daysToMaturity: 50,
				harvestWindowDays: 42,
				yieldPerBedFoot: 3,
				rows: 1,
				inRowSpacingIn: 24,
				seedsPerSpot: 2,
				germinationRate: 0.85,
				seedsPerGram: perGram(200)
			},
			{
				name: 'Summer squash, transplant',
				method: 'transplant',
				daysToMaturity: 42,
				daysInTray: 21,
				harvestWindowDays: 42,
				yieldPerBedFoot: 3,
				rows: 1,
				inRowSpacingIn: 24,
				germinationRate: 0.85,
				seedsPerGram: perGram(200),
				cellsPerTray: 50
			}
		]),
		m('winter-squash', 'Winter squash', 'Cucurbitaceae', 'lb', warm, null, [
			{
				name: 'Winter squash, butternut type',
				method: 'direct',
				daysToMaturity: 100,
				harvestWindowDays: 14,
				yieldPerBedFoot: 2,
				rows: 1,
				inRowSpacingIn: 24,
				seedsPerSpot: 2,
				germinationRate: 0.85,
				seedsPerGram: perGram(180)
			}
		]),
		m('melon', 'Melon', 'Cucurbitaceae', 'each', warm, null, [
			{
				name: 'Melon, cantaloupe type',
				method: 'transplant',
				daysToMaturity: 80,
				daysInTray: 21,
				harvestWindowDays: 21,
				yieldPerBedFoot: 1,
				rows: 1,
				inRowSpacingIn: 24,
				germinationRate: 0.85,
				seedsPerGram: perGram(1_000),
				cellsPerTray: 50
			}
		]),
		m('cabbage', 'Cabbage', 'Brassicaceae', 'head', cool, null, [
			{
				name: 'Cabbage, early',
				method: 'transplant',
				daysToMaturity: 60,
				daysInTray: 35,
				harvestWindowDays: 14,
				yieldPerBedFoot: 1.2,
				rows: 2,
				inRowSpacingIn: 18,
				germinationRate: 0.85,
				seedsPerGram: perGram(7_500),
				cellsPerTray: 72
			},
			{
				name: 'Cabbage, storage',
				method: 'transplant',
				daysToMaturity: 95,
				daysInTray: 35,
				harvestWindowDays: 21,
				yieldPerBedFoot: 1.2,
				rows: 2,
				inRowSpacingIn: 18,
				germinationRate: 0.85,
				seedsPerGram: perGram(7_500),
				cellsPerTray: 72
			}
		]),
		m('broccoli', 'Broccoli', 'Brassicaceae', 'head', cool, 80, [
			{
				name: 'Broccoli, standard',
				method: 'transplant',
				daysToMaturity: 60,
				daysInTray: 35,
				harvestWindowDays: 14,
				yieldPerBedFoot: 1.2,
				rows: 2,
				inRowSpacingIn: 18,
				germinationRate: 0.85,
				seedsPerGram: perGram(8_000),
				cellsPerTray: 72
			}
		]),
		m('cauliflower', 'Cauliflower', 'Brassicaceae', 'head', cool, 80, [
			{
				name: 'Cauliflower, white',
				method: 'transplant',
				daysToMaturity: 65,
				daysInTray: 35,
				harvestWindowDays: 10,
				yieldPerBedFoot: 1.1,
				rows: 2,
				inRowSpacingIn: 18,
				germinationRate: 0.8,
				seedsPerGram: perGram(8_000),
				cellsPerTray: 72
			}
		]),
		m('bok-choy', 'Bok choy', 'Brassicaceae', 'head', cool, 80, [
			{
				name: 'Bok choy, standard',
				method: 'transplant',
				daysToMaturity: 35,
				daysInTray: 21,
				harvestWindowDays: 10,
				yieldPerBedFoot: 4,
				rows: 3,
				inRowSpacingIn: 8,
				germinationRate: 0.85,
				seedsPerGram: perGram(7_000),
				cellsPerTray: 128
			}
		]),
		m('turnip', 'Turnip, salad', 'Brassicaceae', 'bunch', cool, 80, [
			{
				name: 'Turnip, salad, white',
				method: 'direct',
				daysToMaturity: 40,
				harvestWindowDays: 14,
				yieldPerBedFoot: 1.5,
				rows: 4,
				inRowSpacingIn: 2,
				germinationRate: 0.85,
				seedsPerGram: perGram(12_000)
			}
		]),
		m('kohlrabi', 'Kohlrabi', 'Brassicaceae', 'each', cool, null, [
			{
				name: 'Kohlrabi, standard',
				method: 'transplant',
				daysToMaturity: 45,
				daysInTray: 28,
				harvestWindowDays: 14,
				yieldPerBedFoot: 3,
				rows: 3,
				inRowSpacingIn: 8,
				germinationRate: 0.85,
				seedsPerGram: perGram(8_000),
				cellsPerTray: 128
			}
		]),
		m('chard', 'Swiss chard', 'Amaranthaceae', 'bunch', cool, null, [
			{
				name: 'Chard, mixed colours',
				method: 'transplant',
				daysToMaturity: 50,
				daysInTray: 28,
				harvestWindowDays: 70,
				yieldPerBedFoot: 3,
				rows: 3,
				inRowSpacingIn: 10,
				germinationRate: 0.8,
				seedsPerGram: perGram(1_500),
				cellsPerTray: 128
			}
		]),
		m('scallion', 'Scallion', 'Amaryllidaceae', 'bunch', cool, null, [
			{
				name: 'Scallion, standard',
				method: 'direct',
				daysToMaturity: 60,
				harvestWindowDays: 21,
				yieldPerBedFoot: 2,
				rows: 5,
				inRowSpacingIn: 1,
				germinationRate: 0.75,
				seedsPerGram: perGram(8_000)
			}
		]),
		m('leek', 'Leek', 'Amaryllidaceae', 'each', cool, null, [
			{
				name: 'Leek, fall',
				method: 'transplant',
				daysToMaturity: 100,
				daysInTray: 70,
				harvestWindowDays: 42,
				yieldPerBedFoot: 5,
				rows: 3,
				inRowSpacingIn: 6,
				germinationRate: 0.8,
				seedsPerGram: perGram(10_000),
				cellsPerTray: 128
			}
		]),
		m('garlic', 'Garlic', 'Amaryllidaceae', 'head', cool, null, [
			// Cloves are the "seeds": about 5 g a clove, so 0.2 per gram (from memory).
			{
				name: 'Garlic, hardneck',
				method: 'direct',
				daysToMaturity: 240,
				harvestWindowDays: 7,
				yieldPerBedFoot: 7,
				rows: 4,
				inRowSpacingIn: 6,
				germinationRate: 0.9,
				seedsPerGram: 0.2,
				margin: 0.05
			}
		]),
		m('potato', 'Potato', 'Solanaceae', 'lb', cool, null, [
			// Seed pieces of about 2 oz (57 g): 0.02 per gram (from memory).
			{
				name: 'Potato, all-purpose',
				method: 'direct',
				daysToMaturity: 90,
				harvestWindowDays: 21,
				yieldPerBedFoot: 2,
				rows: 2,
				inRowSpacingIn: 12,
				germinationRate: 0.9,
				seedsPerGram: 0.02,
				margin: 0.05
			}
		]),
		m('pea', 'Pea, snap', 'Fabaceae', 'lb', cool, 80, [
			{
				name: 'Pea, sugar snap',
				method: 'direct',
				daysToMaturity: 62,
				harvestWindowDays: 21,
				yieldPerBedFoot: 0.6,
				rows: 2,
				inRowSpacingIn: 2,
				germinationRate: 0.85,
				seedsPerGram: perGram(125)
			}
		]),
		m('corn', 'Sweet corn', 'Poaceae', 'each', warm, null, [
			{
				name: 'Sweet corn, bicolour',
				method: 'direct',
				daysToMaturity: 80,
				harvestWindowDays: 10,
				yieldPerBedFoot: 2.5,
				rows: 2,
				inRowSpacingIn: 9,
				germinationRate: 0.85,
				seedsPerGram: perGram(150)
			}
		]),
		m('basil', 'Basil', 'Lamiaceae', 'bunch', warm, null, [
			{
				name: 'Basil, sweet',
				method: 'transplant',
				daysToMaturity: 30,
				daysInTray: 35,
				harvestWindowDays: 56,
				yieldPerBedFoot: 3,
				rows: 3,
				inRowSpacingIn: 10,
				germinationRate: 0.85,
				seedsPerGram: perGram(17_000),
				cellsPerTray: 128
			}
		]),
		m('dill', 'Dill', 'Apiaceae', 'bunch', cool, 85, [
			{
				name: 'Dill, standard',
				method: 'direct',
				daysToMaturity: 50,
				harvestWindowDays: 21,
				yieldPerBedFoot: 2,
				rows: 3,
				inRowSpacingIn: 3,
				germinationRate: 0.7,
				seedsPerGram: perGram(6_000)
			}
		])
	];
}

export function starterCrop(key: string): StarterCrop | undefined {
	return starterCrops.find((c) => c.key === key);
}
