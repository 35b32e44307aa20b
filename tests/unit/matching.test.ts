// Box matching on small worked examples. Every expected number is computed by hand in the
// comments; none is taken from the code under test.
import { describe, expect, it } from 'vitest';
import {
	type TargetInput,
	applySwaps,
	checkBoxes,
	deriveTargets,
	forecast,
	forecastFromSupply,
	matchBoxes,
	suggestSubstitutes,
	summarizeMatching,
	supplyWithActuals,
	swapStep
} from '../../src/lib/planning/index';
import { forecastFromWeeklySupply } from '../../src/lib/planning/forecast';

// 2027-W24 is Mon 14 Jun – Sun 20 Jun 2027; W25 is 21–27 Jun (ISO 8601: W01 starts Mon 4 Jan 2027,
// 4 Jan + 23 × 7 days = 14 Jun).
const demand: TargetInput = {
	shareSizes: [
		{ id: 'full', members: 10, firstWeek: '2027-W24', lastWeek: '2027-W25' },
		{ id: 'half', members: 5, firstWeek: '2027-W24', lastWeek: '2027-W25' }
	],
	boxItems: [
		{ shareSizeId: 'full', week: '2027-W24', crop: 'carrot', quantity: 2 },
		{ shareSizeId: 'full', week: '2027-W24', crop: 'kale', quantity: 1 },
		{ shareSizeId: 'half', week: '2027-W24', crop: 'carrot', quantity: 1 },
		{ shareSizeId: 'full', week: '2027-W25', crop: 'kale', quantity: 1 }
	],
	channelDemand: []
};
const units: Record<string, string> = { carrot: 'lb', spinach: 'lb', kale: 'bunch', chard: 'bunch' };
const unitOf = (c: string): string | undefined => units[c];

// Supply, one figure per crop-week (a week-long planting yielding exactly that much).
const supply = [
	{ crop: 'carrot', week: '2027-W24', quantity: 20 },
	{ crop: 'kale', week: '2027-W24', quantity: 12 },
	{ crop: 'spinach', week: '2027-W24', quantity: 10 },
	{ crop: 'chard', week: '2027-W24', quantity: 8 },
	{ crop: 'kale', week: '2027-W25', quantity: 12 }
];

function rowsFor(input: TargetInput) {
	return forecastFromSupply(supply, deriveTargets(input));
}

describe('matchBoxes', () => {
	const rows = rowsFor(demand);
	const boxes = matchBoxes(rows, demand);

	it('gives each item its supply, need and fill', () => {
		// Carrot W24 demand = 10 × 2 + 5 × 1 = 25 lb; supply 20 lb → fill 20 / 25 = 0.8, short.
		// Kale W24 demand = 10 × 1 = 10 bunches; supply 12 → fill 1.
		expect(boxes.map((b) => `${b.week} ${b.shareSizeId}`)).toEqual(['2027-W24 full', '2027-W24 half', '2027-W25 full']);
		const [full24, half24, full25] = boxes;
		const carrot = full24.items.find((i) => i.crop === 'carrot')!;
		expect(carrot.need).toBe(20); // 10 members × 2 lb
		expect(carrot.demand).toBeCloseTo(25, 9);
		expect(carrot.supply).toBeCloseTo(20, 9);
		expect(carrot.fill).toBeCloseTo(0.8, 9);
		expect(carrot.short).toBe(true);
		expect(full24.items.find((i) => i.crop === 'kale')!.fill).toBe(1);
		// Full box W24 = mean(0.8, 1) = 0.9; half box W24 = carrot only = 0.8; full W25 = kale 12 ≥ 10 → 1.
		expect(full24.fill).toBeCloseTo(0.9, 9);
		expect(half24.fill).toBeCloseTo(0.8, 9);
		expect(half24.items[0].need).toBe(5); // 5 members × 1 lb
		expect(full25.fill).toBe(1);
		expect(boxes.map((b) => b.fillable)).toEqual([false, false, true]);
	});

	it('agrees with checkBoxes on which boxes fill', () => {
		const checks = checkBoxes(rows, demand);
		expect(checks.map((c) => [c.week, c.shareSizeId, c.fillable])).toEqual(
			boxes.map((b) => [b.week, b.shareSizeId, b.fillable])
		);
	});

	it('summarises the season', () => {
		const s = summarizeMatching(boxes, rows);
		// 3 boxes, 1 fills; weeks W24 (two short boxes) and W25 (fills) → 1 of 2.
		expect([s.boxes, s.boxesFilled, s.weeks, s.weeksFilled]).toEqual([3, 1, 2, 1]);
		// (0.9 + 0.8 + 1) / 3 = 0.9
		expect(s.averageFill).toBeCloseTo(0.9, 9);
		// Surplus: spinach 10 − 0 = 10 lb; chard 8 bunches; kale (12 − 10) + (12 − 10) = 4; carrot none.
		expect(s.surplusByCrop.map((x) => [x.crop, Math.round(x.surplus * 1e6) / 1e6])).toEqual([
			['spinach', 10],
			['chard', 8],
			['kale', 4]
		]);
	});
});

describe('suggestSubstitutes', () => {
	const rows = rowsFor(demand);
	const [full24, half24] = matchBoxes(rows, demand);

	it('offers surplus crops of the same unit, sized to close the shortfall', () => {
		// Carrot short 25 − 20 = 5 lb. Through the full share: 5 lb ÷ 10 members = 0.5 lb per box
		// (a multiple of the 0.25 lb step, under the 2 lb in the box). Spinach surplus 10 lb ÷ 10 = 1 lb
		// a box at most → 0.5 lb, and 10 × 0.5 = 5 lb covers the shortfall. Chard and kale are bunches: left out.
		const carrot = full24.items.find((i) => i.crop === 'carrot')!;
		expect(suggestSubstitutes(rows, full24, carrot, unitOf)).toEqual([
			{ crop: 'spinach', quantity: 0.5, fromQuantity: 0.5, byValue: false, surplus: 10, covers: true }
		]);
		// Through the half share: 5 lb ÷ 5 members = 1 lb, the whole item; spinach 10 ÷ 5 = 2 lb at most → 1 lb.
		expect(suggestSubstitutes(rows, half24, half24.items[0], unitOf)).toEqual([
			{ crop: 'spinach', quantity: 1, fromQuantity: 1, byValue: false, surplus: 10, covers: true }
		]);
	});

	it('cuts the quantity to what the surplus gives every member, and says when it does not cover', () => {
		// Spinach only 3 lb in surplus: 3 ÷ 10 = 0.3 → 0.25 lb per box (step 0.25, rounded down);
		// 10 × 0.25 = 2.5 lb < 5 lb short → does not cover.
		const lean = forecastFromSupply(
			supply.map((s) => (s.crop === 'spinach' ? { ...s, quantity: 3 } : s)),
			deriveTargets(demand)
		);
		const box = matchBoxes(lean, demand)[0];
		const carrot = box.items.find((i) => i.crop === 'carrot')!;
		expect(suggestSubstitutes(lean, box, carrot, unitOf)).toEqual([
			{ crop: 'spinach', quantity: 0.25, fromQuantity: 0.25, byValue: false, surplus: 3, covers: false }
		]);
		expect(swapStep('bunch')).toBe(1);
	});

	it('suggests nothing for an item that fills', () => {
		const kale = full24.items.find((i) => i.crop === 'kale')!;
		expect(suggestSubstitutes(rows, full24, kale, unitOf)).toEqual([]);
	});

	it('offers crops of another unit sized by value when both have a price per harvest unit', () => {
		// Prices (invented): carrot $2.00/lb, spinach $6.00/lb, chard $3.00/bunch, kale none.
		const prices: Record<string, number> = { carrot: 2, spinach: 6, chard: 3 };
		const priceOf = (c: string): number | undefined => prices[c];
		const carrot = full24.items.find((i) => i.crop === 'carrot')!;
		const out = suggestSubstitutes(rows, full24, carrot, unitOf, 3, priceOf);
		// Spinach (same unit) comes first, as before. Chard: the 0.5 lb carrot wanted per box is worth
		// 0.5 × $2 = $1.00 → $1.00 ÷ $3 = 0.33 bunch → rounded to the bunch step, at least 1 bunch.
		// Chard surplus 8 bunches ÷ 10 members = 0.8 → 0 whole bunches a box: left out.
		expect(out.map((s) => s.crop)).toEqual(['spinach']);
		// Half share, 5 members: carrot wanted 1 lb a box = $2.00 → 0.67 bunch → 1 bunch; chard 8 ÷ 5 = 1.6 → 1 a box.
		// One bunch ($3.00) replaces $3.00 of carrot = 1.5 lb, capped at the 1 lb in the box; 5 × 1 = 5 lb covers the 5 lb short.
		const half = suggestSubstitutes(rows, half24, half24.items[0], unitOf, 3, priceOf);
		expect(half.find((s) => s.crop === 'chard')).toEqual({
			crop: 'chard',
			quantity: 1,
			fromQuantity: 1,
			byValue: true,
			surplus: 8,
			covers: true
		});
		// Without a price on either crop, no crop of another unit is offered.
		expect(
			suggestSubstitutes(rows, half24, half24.items[0], unitOf, 3, (c) => (c === 'chard' ? undefined : prices[c])).map(
				(s) => s.crop
			)
		).toEqual(['spinach']);
	});
});

describe('short threshold', () => {
	it('flags an item short only under the fill the share manager sets', () => {
		// Carrot W24 fill = 20 ÷ 25 = 0.8 (see above). Under a 95 % threshold: short. Under 80 %: not short
		// (0.8 is not below 0.8). Kale fills completely either way.
		const rows = rowsFor(demand);
		const at95 = matchBoxes(rows, demand, { shortBelow: 0.95 })[0].items.find((i) => i.crop === 'carrot')!;
		const at80 = matchBoxes(rows, demand, { shortBelow: 0.8 })[0].items.find((i) => i.crop === 'carrot')!;
		expect(at95.short).toBe(true);
		expect(at80.short).toBe(false);
		expect(matchBoxes(rows, demand, { shortBelow: 0.8 })[0].fillable).toBe(true);
		// A 99 % fill is not flagged under 95 %: 24.75 lb of 25.
		const nearly = forecastFromSupply(
			supply.map((s) => (s.crop === 'carrot' ? { ...s, quantity: 24.75 } : s)),
			deriveTargets(demand)
		);
		expect(matchBoxes(nearly, demand, { shortBelow: 0.95 })[0].items.find((i) => i.crop === 'carrot')!.short).toBe(
			false
		);
		expect(matchBoxes(nearly, demand)[0].items.find((i) => i.crop === 'carrot')!.short).toBe(true);
	});
});

describe('applySwaps', () => {
	it('moves the swapped quantity, and the fill follows', () => {
		const swapped = applySwaps(demand, [
			{ shareSizeId: 'full', week: '2027-W24', fromCrop: 'carrot', toCrop: 'spinach', quantity: 0.5 }
		]);
		const full24 = swapped.boxItems.filter((b) => b.shareSizeId === 'full' && b.week === '2027-W24');
		// 2 − 0.5 = 1.5 lb carrot; 0.5 lb spinach added; kale unchanged.
		expect(full24.map((b) => [b.crop, b.quantity]).sort()).toEqual([
			['carrot', 1.5],
			['kale', 1],
			['spinach', 0.5]
		]);
		const boxes = matchBoxes(rowsFor(swapped), swapped);
		// Carrot demand = 10 × 1.5 + 5 × 1 = 20 lb = supply → fill 1; spinach 10 × 0.5 = 5 lb ≤ 10 → 1.
		// Full box W24 = mean(1, 1, 1) = 1, half box W24 = 1 (carrot now fully supplied).
		expect(boxes.map((b) => b.fill)).toEqual([1, 1, 1]);
		expect(summarizeMatching(boxes, rowsFor(swapped)).weeksFilled).toBe(2);
		// The original input is untouched.
		expect(demand.boxItems[0].quantity).toBe(2);
	});

	it('swaps into a crop of another unit by the confirmed quantity, in proportion to what moved', () => {
		// 1 lb carrot out of the half box, 1 bunch chard in (the quantity the share manager confirmed).
		const swapped = applySwaps(demand, [
			{ shareSizeId: 'half', week: '2027-W24', fromCrop: 'carrot', toCrop: 'chard', quantity: 1, toQuantity: 1 }
		]);
		expect(swapped.boxItems.filter((b) => b.shareSizeId === 'half').map((b) => [b.crop, b.quantity])).toEqual([
			['chard', 1]
		]);
		// Asking 2 lb → 2 bunches from a box holding 1 lb moves 1 lb, so 1 bunch (2 × 1 ÷ 2) arrives.
		const capped = applySwaps(demand, [
			{ shareSizeId: 'half', week: '2027-W24', fromCrop: 'carrot', toCrop: 'chard', quantity: 2, toQuantity: 2 }
		]);
		expect(capped.boxItems.filter((b) => b.shareSizeId === 'half').map((b) => [b.crop, b.quantity])).toEqual([
			['chard', 1]
		]);
	});

	it('never moves more than the box holds', () => {
		// Asking for 5 lb of a 2 lb item moves 2 lb: carrot leaves the box, spinach 2 lb arrives.
		const swapped = applySwaps(demand, [
			{ shareSizeId: 'full', week: '2027-W24', fromCrop: 'carrot', toCrop: 'spinach', quantity: 5 }
		]);
		const full24 = swapped.boxItems.filter((b) => b.shareSizeId === 'full' && b.week === '2027-W24');
		expect(full24.map((b) => [b.crop, b.quantity]).sort()).toEqual([
			['kale', 1],
			['spinach', 2]
		]);
	});
});

describe('supplyWithActuals', () => {
	// p1: carrot 14 lb a week over W24–W25 (Mon 14 Jun – Sun 27 Jun, 2 lb a day);
	// p2: carrot 7 lb a week in W24 only.
	const plantings = [
		{ key: 'p1', crop: 'carrot', firstHarvest: '2027-06-14', lastHarvest: '2027-06-27', weeklyYield: 14 },
		{ key: 'p2', crop: 'carrot', firstHarvest: '2027-06-14', lastHarvest: '2027-06-20', weeklyYield: 7 }
	];
	it('replaces a logged planting-week before the current week, and keeps the rest forecast', () => {
		const actuals = [
			{ key: 'p1', crop: 'carrot', date: '2027-06-16', quantity: 9 },
			{ key: 'p1', crop: 'carrot', date: '2027-06-18', quantity: 3 },
			// W25 is the current week: not yet replaced.
			{ key: 'p1', crop: 'carrot', date: '2027-06-22', quantity: 30 }
		];
		const { supply: s, actual } = supplyWithActuals(plantings, actuals, '2027-W25');
		const w = Object.fromEntries(s.map((x) => [x.week, x.quantity]));
		// W24: p1 logged 9 + 3 = 12 instead of its 14, p2 still forecast 7 → 19. W25: p1 forecast 14.
		expect(w['2027-W24']).toBeCloseTo(19, 9);
		expect(w['2027-W25']).toBeCloseTo(14, 9);
		expect([...actual].map((k) => k.split('\u0000').join(' '))).toEqual(['carrot 2027-W24']);
	});
	it('counts harvests of a planting that is no longer forecast', () => {
		const { supply: s } = supplyWithActuals(
			[],
			[{ key: 'p9', crop: 'beet', date: '2027-06-15', quantity: 4 }],
			'2027-W30'
		);
		expect(s).toEqual([{ crop: 'beet', week: '2027-W24', quantity: 4 }]);
	});
	it('feeds forecast(): the same totals as forecasting the plantings directly', () => {
		// No actuals: W24 = 14 + 7 = 21, W25 = 14, as forecast() gives.
		const direct = forecast(plantings, []);
		const via = forecastFromSupply(supplyWithActuals(plantings, [], '2027-W01').supply, []);
		expect(via.map((r) => [r.week, Math.round(r.supply * 1e9) / 1e9])).toEqual([
			['2027-W24', 21],
			['2027-W25', 14]
		]);
		expect(direct.map((r) => r.week)).toEqual(via.map((r) => r.week));
	});
});

describe('forecastFromWeeklySupply (the forecast route joins supply with targets in one pass)', () => {
	it('joins weekly supply with targets, by hand', () => {
		// Targets: carrot W24 = 10 × 2 + 5 × 1 = 25, kale W24 = 10 × 1 = 10, kale W25 = 10 × 1 = 10.
		// Carrot 20 − 25 → 5 short; kale W24 12 − 10 → 2 over; kale W25 has no supply → 10 short;
		// spinach 10 with no demand → 10 over; chard 0 is no supply and no demand → no row.
		const weekly = [
			{ crop: 'spinach', week: '2027-W24', quantity: 10 },
			{ crop: 'carrot', week: '2027-W24', quantity: 20 },
			{ crop: 'chard', week: '2027-W24', quantity: 0 },
			{ crop: 'kale', week: '2027-W24', quantity: 12 }
		];
		const rows = forecastFromWeeklySupply(weekly, deriveTargets(demand));
		expect(
			rows.map((r) => [
				r.crop,
				r.week,
				Math.round(r.supply * 1e9) / 1e9,
				r.demand,
				Math.round(r.shortfall * 1e9) / 1e9,
				Math.round(r.surplus * 1e9) / 1e9
			])
		).toEqual([
			['carrot', '2027-W24', 20, 25, 5, 0],
			['kale', '2027-W24', 12, 10, 0, 2],
			['kale', '2027-W25', 0, 10, 10, 0],
			['spinach', '2027-W24', 10, 0, 0, 10]
		]);
	});
	it('gives forecastFromSupply’s rows to the last bit, awkward fractions included', () => {
		// Quantities that are not multiples of 7 (q ÷ 7 × 7 need not be q in floating point).
		const odd = [0.1, 0.3, 1 / 3, 2.675, 19.999999, 1e-7, 123456.789].flatMap((q, i) => [
			{ crop: `c${i % 3}`, week: `2027-W${String(20 + i).padStart(2, '0')}`, quantity: q },
			{ crop: `c${(i + 1) % 3}`, week: '2027-W30', quantity: q * 3 }
		]);
		const targets = [
			{ crop: 'c1', week: '2027-W30', quantity: 0.7 },
			{ crop: 'c9', week: '2027-W01', quantity: 0 }
		];
		expect(forecastFromWeeklySupply(odd, targets)).toEqual(forecastFromSupply(odd, targets));
	});
	it('refuses a negative target naming it, as forecast() does', () => {
		expect(() => forecastFromWeeklySupply([], [{ crop: 'kale', week: '2027-W24', quantity: -1 }])).toThrow(
			/targets\[0\]\.quantity/
		);
	});
});
