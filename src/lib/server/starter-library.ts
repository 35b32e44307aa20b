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
const AGRILIFE = 'Texas A&M AgriLife, Cilantro in the Garden';
const LIMIT = 'limit: common practice, no published source';
const HEAT_LIMIT = `${GDD_BASE}; heat limit: common practice (no published source)`;
const FROM_MEMORY = `${GDD_BASE}; the rest ${MEMORY}`;

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

/** A variety's figures in one row, in this order (the varieties below are written as such rows). */
type Figures = [
	method: StarterVariety['method'],
	daysToMaturity: number,
	/** 0 for a direct-sown variety. */
	daysInTray: number,
	harvestWindowDays: number,
	/** Harvest units per bed-foot over the whole window. */
	yieldPerBedFoot: number,
	rows: number,
	inRowSpacingIn: number,
	/** A fraction. */
	germinationRate: number,
	seedsPerGram: number
];
type Extras = Partial<Pick<StarterVariety, 'seedsPerSpot' | 'cellsPerTray' | 'margin' | 'source'>>;

/**
 * A variety from its row of figures. Unless `extras` says otherwise: one seed per spot, trays of
 * 128 cells, a 10 % margin, and figures common practice from memory (MEMORY) for its source.
 */
const variety = (name: string, figures: Figures, { source = MEMORY, ...extras }: Extras = {}): StarterVariety => {
	const [method, daysToMaturity, daysInTray, harvestWindowDays, yieldPerBedFoot, rows, inRowSpacingIn, ...seed] =
		figures;
	const [germinationRate, seedsPerGram] = seed;
	return {
		name,
		method,
		daysToMaturity,
		daysInTray,
		harvestWindowDays,
		yieldPerBedFoot,
		rows,
		inRowSpacingIn,
		seedsPerSpot: 1,
		germinationRate,
		seedsPerGram,
		cellsPerTray: 128,
		margin: 0.1,
		...extras,
		source
	};
};

const cool = { frostTolerance: 'hardy', baseTempF: 40 } as const;
const warm = { frostTolerance: 'tender', baseTempF: 50 } as const;

/**
 * A crop: its key, name, botanical family and harvest unit; cool- or warm-season (frost tolerance and
 * base temperature); the mean weekly °F above which it bolts or spoils (null: none); where those
 * figures come from; and its varieties.
 */
const crop = (
	key: string,
	name: string,
	family: string,
	harvestUnit: CropInput['harvestUnit'],
	kind: typeof cool | typeof warm,
	heatLimitF: number | null,
	source: string,
	varieties: StarterVariety[]
): StarterCrop => ({ key, name, family, harvestUnit, ...kind, heatLimitF, source, varieties });

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

// Each crop: crop(key, name, family, harvest unit, cool or warm, heat limit °F, source, varieties); each
// variety: variety(name, [method, days to maturity, days in tray, harvest window days, yield per bed-foot,
// rows, in-row spacing in, germination, seeds per gram], what differs from the defaults and its source).
const listed: StarterCrop[] = [
	crop('carrot', 'Carrot', 'Apiaceae', 'lb', cool, null, GDD_BASE, [
		variety('Carrot, standard', ['direct', 70, 0, 14, perAcre(26_000), 4, 1, 0.65, perGram(22_000)], {
			source: `22,000 seeds/oz (18,000–25,000), 65–75 days: ${HANDBOOKS}; yield 26,000 lb/acre (good): ${NEVMG}; ${PRACTICE}`
		}),
		variety('Carrot, storage', ['direct', 75, 0, 28, perAcre(26_000), 4, 1, 0.65, perGram(22_000)], {
			source: `22,000 seeds/oz, 75 days (top of 65–75): ${HANDBOOKS}; yield 26,000 lb/acre: ${NEVMG}; ${PRACTICE}`
		})
	]),
	crop('beet', 'Beet', 'Amaranthaceae', 'lb', cool, null, GDD_BASE, [
		variety('Beet, direct-sown', ['direct', 60, 0, 21, perAcre(24_000), 4, 3, 0.8, perGram(1_800)], {
			source: `1,800 seeds/oz (1,500–2,200), 52–70 days: ${HANDBOOKS}; yield 24,000 lb/acre (good): ${NEVMG}; ${PRACTICE}`
		}),
		variety('Beet, multi-sown transplant', ['transplant', 50, 28, 21, perAcre(24_000), 4, 6, 0.8, perGram(1_800)], {
			seedsPerSpot: 3,
			cellsPerTray: 128,
			source: `1,800 seeds/oz: ${HANDBOOKS}; yield 24,000 lb/acre: ${NEVMG}; 3 seeds per cell, 50 days from transplant: common practice (no published source)`
		})
	]),
	crop('radish', 'Radish', 'Brassicaceae', 'bunch', cool, 75, HEAT_LIMIT, [
		variety('Radish, round red', ['direct', 25, 0, 7, perRow(100, 4), 4, 1, 0.85, perGram(2_500)], {
			source: `2,500 seeds/oz, 22–28 days, 100 bunches per 100 ft of row: ${HANDBOOKS}; ${PRACTICE}`
		})
	]),
	crop('lettuce', 'Lettuce, head', 'Asteraceae', 'head', cool, 80, HEAT_LIMIT, [
		variety('Lettuce, head, standard', ['transplant', 45, 28, 7, 2.7, 3, 12, 0.85, perGram(25_000)], {
			cellsPerTray: 128,
			source: `25,000 seeds/oz, 45–70 days from seeding: ${HANDBOOKS}; 45 days from transplant and 2.7 heads per bed-ft (3 rows at 12 in, 9 in 10 cut): common practice (no published source)`
		})
	]),
	crop('spinach', 'Spinach', 'Amaranthaceae', 'lb', cool, 75, `${GDD_BASE}; bolts in hot weeks (${LIMIT})`, [
		variety('Spinach, standard', ['direct', 45, 0, 14, perRow(45, 4), 4, 2, 0.8, perGram(2_800)], {
			source: `2,800 seeds/oz, 45 days, 40–50 lb per 100 ft of row: ${HANDBOOKS}; ${PRACTICE}`
		})
	]),
	crop('arugula', 'Arugula', 'Brassicaceae', 'lb', cool, 80, HEAT_LIMIT, [
		variety('Arugula, standard', ['direct', 30, 0, 14, perRow(30, 4), 4, 1, 0.85, perGram(14_000)], {
			source: `14,000 seeds/oz (13,000–15,400), 24–35 days, 25–35 lb per 100 ft: seed-supplier growing tables; ${PRACTICE}`
		})
	]),
	crop('cilantro', 'Cilantro', 'Apiaceae', 'bunch', cool, 85, `bolts above 85 °F: ${AGRILIFE}; ${GDD_BASE}`, [
		variety('Cilantro, standard', ['direct', 50, 0, 14, 2, 4, 2, 0.75, perGram(2_000)], {
			source: `about 2,000 seeds/oz: ${AGRILIFE}; days, yield and spacing: ${MEMORY}`
		})
	]),
	crop('parsnip', 'Parsnip', 'Apiaceae', 'lb', cool, null, GDD_BASE, [
		variety('Parsnip, standard', ['direct', 110, 0, 42, perRow(100, 3), 3, 3, 0.6, perGram(9_600)], {
			source: `9,600 seeds/oz (sources give 7,200–12,000), 100+ days, 100 lb per 100 ft of row: ${HANDBOOKS}; seed-supplier tables; ${PRACTICE}`
		})
	]),
	crop('onion', 'Onion', 'Amaryllidaceae', 'lb', cool, null, GDD_BASE, [
		variety('Onion, storage, multi-sown', ['transplant', 100, 56, 14, perRow(100, 4), 4, 12, 0.75, perGram(8_000)], {
			seedsPerSpot: 4,
			cellsPerTray: 128,
			source: `8,000 seeds/oz, 90–110 days, 100 lb per 100 ft of row: ${HANDBOOKS}; 4 seeds per cell at 12 in, 56 days in tray: common practice (no published source)`
		})
	]),
	crop('kale', 'Kale', 'Brassicaceae', 'lb', cool, null, GDD_BASE, [
		variety('Kale, curly', ['transplant', 55, 28, 56, perAcre(12_000), 2, 12, 0.85, perGram(8_000)], {
			cellsPerTray: 72,
			source: `8,000 seeds/oz (7,500–8,700), 50–60 days: Univ. of Illinois Extension; Kansas State MF-315; yield 12,000 lb/acre (good): ${NEVMG}; ${PRACTICE}`
		})
	]),
	crop('tomato', 'Tomato', 'Solanaceae', 'lb', warm, null, GDD_BASE, [
		variety('Tomato, slicer', ['transplant', 75, 49, 56, perRow(100, 1), 1, 24, 0.85, perGram(11_000)], {
			cellsPerTray: 50,
			source: `11,000 seeds/oz, 50 plants and 100 lb per 100 ft of row: ${HANDBOOKS}; 75 days from transplant, 49 days in tray: ${MEMORY}`
		}),
		variety('Tomato, cherry', ['transplant', 65, 49, 70, perRow(100, 1), 1, 24, 0.85, perGram(11_000)], {
			cellsPerTray: 50,
			source: `11,000 seeds/oz, 100 lb per 100 ft of row: ${HANDBOOKS}; 65 days, 70-day window: ${MEMORY}`
		})
	]),
	crop('bean', 'Bean, bush snap', 'Fabaceae', 'lb', warm, null, GDD_BASE, [
		variety('Bean, bush, standard', ['direct', 55, 0, 21, perAcre(8_000), 2, 3, 0.85, perGram(100)], {
			source: `100 seeds/oz, 51–58 days: ${HANDBOOKS}; yield 8,000 lb/acre (good): ${NEVMG}; picks over about 3 weeks: common practice (no published source)`
		})
	]),
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
	return [
		crop('pepper', 'Pepper, sweet', 'Solanaceae', 'lb', warm, null, FROM_MEMORY, [
			variety('Pepper, bell', ['transplant', 70, 56, 56, 1.5, 2, 18, 0.8, perGram(4_500)], { cellsPerTray: 72 })
		]),
		crop('eggplant', 'Eggplant', 'Solanaceae', 'lb', warm, null, FROM_MEMORY, [
			variety('Eggplant, standard', ['transplant', 70, 56, 56, 2, 2, 18, 0.8, perGram(6_500)], { cellsPerTray: 72 })
		]),
		crop('cucumber', 'Cucumber', 'Cucurbitaceae', 'lb', warm, null, FROM_MEMORY, [
			variety('Cucumber, slicing', ['transplant', 50, 21, 42, 3, 1, 12, 0.85, perGram(1_000)], { cellsPerTray: 50 }),
			variety('Cucumber, direct-sown', ['direct', 58, 0, 42, 3, 1, 12, 0.85, perGram(1_000)], { seedsPerSpot: 2 })
		]),
		crop('zucchini', 'Summer squash', 'Cucurbitaceae', 'lb', warm, null, FROM_MEMORY, [
			variety('Summer squash, zucchini', ['direct', 50, 0, 42, 3, 1, 24, 0.85, perGram(200)], { seedsPerSpot: 2 }),
			variety('Summer squash, transplant', ['transplant', 42, 21, 42, 3, 1, 24, 0.85, perGram(200)], {
				cellsPerTray: 50
			})
		]),
		crop('winter-squash', 'Winter squash', 'Cucurbitaceae', 'lb', warm, null, FROM_MEMORY, [
			variety('Winter squash, butternut type', ['direct', 100, 0, 14, 2, 1, 24, 0.85, perGram(180)], {
				seedsPerSpot: 2
			})
		]),
		crop('melon', 'Melon', 'Cucurbitaceae', 'each', warm, null, FROM_MEMORY, [
			variety('Melon, cantaloupe type', ['transplant', 80, 21, 21, 1, 1, 24, 0.85, perGram(1_000)], {
				cellsPerTray: 50
			})
		]),
		crop('cabbage', 'Cabbage', 'Brassicaceae', 'head', cool, null, FROM_MEMORY, [
			variety('Cabbage, early', ['transplant', 60, 35, 14, 1.2, 2, 18, 0.85, perGram(7_500)], { cellsPerTray: 72 }),
			variety('Cabbage, storage', ['transplant', 95, 35, 21, 1.2, 2, 18, 0.85, perGram(7_500)], { cellsPerTray: 72 })
		]),
		crop('broccoli', 'Broccoli', 'Brassicaceae', 'head', cool, 80, FROM_MEMORY, [
			variety('Broccoli, standard', ['transplant', 60, 35, 14, 1.2, 2, 18, 0.85, perGram(8_000)], { cellsPerTray: 72 })
		]),
		crop('cauliflower', 'Cauliflower', 'Brassicaceae', 'head', cool, 80, FROM_MEMORY, [
			variety('Cauliflower, white', ['transplant', 65, 35, 10, 1.1, 2, 18, 0.8, perGram(8_000)], { cellsPerTray: 72 })
		]),
		crop('bok-choy', 'Bok choy', 'Brassicaceae', 'head', cool, 80, FROM_MEMORY, [
			variety('Bok choy, standard', ['transplant', 35, 21, 10, 4, 3, 8, 0.85, perGram(7_000)], { cellsPerTray: 128 })
		]),
		crop('turnip', 'Turnip, salad', 'Brassicaceae', 'bunch', cool, 80, FROM_MEMORY, [
			variety('Turnip, salad, white', ['direct', 40, 0, 14, 1.5, 4, 2, 0.85, perGram(12_000)])
		]),
		crop('kohlrabi', 'Kohlrabi', 'Brassicaceae', 'each', cool, null, FROM_MEMORY, [
			variety('Kohlrabi, standard', ['transplant', 45, 28, 14, 3, 3, 8, 0.85, perGram(8_000)], { cellsPerTray: 128 })
		]),
		crop('chard', 'Swiss chard', 'Amaranthaceae', 'bunch', cool, null, FROM_MEMORY, [
			variety('Chard, mixed colours', ['transplant', 50, 28, 70, 3, 3, 10, 0.8, perGram(1_500)], { cellsPerTray: 128 })
		]),
		crop('scallion', 'Scallion', 'Amaryllidaceae', 'bunch', cool, null, FROM_MEMORY, [
			variety('Scallion, standard', ['direct', 60, 0, 21, 2, 5, 1, 0.75, perGram(8_000)])
		]),
		crop('leek', 'Leek', 'Amaryllidaceae', 'each', cool, null, FROM_MEMORY, [
			variety('Leek, fall', ['transplant', 100, 70, 42, 5, 3, 6, 0.8, perGram(10_000)], { cellsPerTray: 128 })
		]),
		crop('garlic', 'Garlic', 'Amaryllidaceae', 'head', cool, null, FROM_MEMORY, [
			// Cloves are the "seeds": about 5 g a clove, so 0.2 per gram (from memory).
			variety('Garlic, hardneck', ['direct', 240, 0, 7, 7, 4, 6, 0.9, 0.2], { margin: 0.05 })
		]),
		crop('potato', 'Potato', 'Solanaceae', 'lb', cool, null, FROM_MEMORY, [
			// Seed pieces of about 2 oz (57 g): 0.02 per gram (from memory).
			variety('Potato, all-purpose', ['direct', 90, 0, 21, 2, 2, 12, 0.9, 0.02], { margin: 0.05 })
		]),
		crop('pea', 'Pea, snap', 'Fabaceae', 'lb', cool, 80, FROM_MEMORY, [
			variety('Pea, sugar snap', ['direct', 62, 0, 21, 0.6, 2, 2, 0.85, perGram(125)])
		]),
		crop('corn', 'Sweet corn', 'Poaceae', 'each', warm, null, FROM_MEMORY, [
			variety('Sweet corn, bicolour', ['direct', 80, 0, 10, 2.5, 2, 9, 0.85, perGram(150)])
		]),
		crop('basil', 'Basil', 'Lamiaceae', 'bunch', warm, null, FROM_MEMORY, [
			variety('Basil, sweet', ['transplant', 30, 35, 56, 3, 3, 10, 0.85, perGram(17_000)], { cellsPerTray: 128 })
		]),
		crop('dill', 'Dill', 'Apiaceae', 'bunch', cool, 85, FROM_MEMORY, [
			variety('Dill, standard', ['direct', 50, 0, 21, 2, 3, 3, 0.7, perGram(6_000)])
		])
	];
}

export function starterCrop(key: string): StarterCrop | undefined {
	return starterCrops.find((c) => c.key === key);
}
