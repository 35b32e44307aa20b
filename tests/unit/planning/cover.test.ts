// Who covers each week's need: a succession's share of its weeks beside the other plantings'
// shares, adding up to the engine's forecast. The crops, yields and targets are invented for the
// checks; the arithmetic is done by hand in the comments.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { cropCover, successionCover, type CoverPlanting } from '$lib/planning/cover';
import { forecast } from '$lib/planning';
import { throughStores } from '$lib/planning/storage';

// 2027-06-07 is the Monday of 2027-W23 (2027-01-04 is the Monday of W01; + 22 weeks = 154 days).
const carrots: CoverPlanting[] = [
	// 20 ft × 1 lb/ft over 14 days = 10 lb a week in W23 and W24.
	{ key: 'A', crop: 'carrot', firstHarvest: '2027-06-07', harvestWindowDays: 14, bedFeet: 20, yieldPerBedFoot: 1 },
	// 30 ft × 1 lb/ft over 14 days = 15 lb a week in W24 and W25.
	{ key: 'B', crop: 'carrot', firstHarvest: '2027-06-14', harvestWindowDays: 14, bedFeet: 30, yieldPerBedFoot: 1 },
	// From Thursday 2027-06-10 for 7 days, 7 ft × 1 lb/ft = 1 lb a day: 4 days (4 lb) in W23, 3 days (3 lb) in W24.
	{ key: 'C', crop: 'carrot', firstHarvest: '2027-06-10', harvestWindowDays: 7, bedFeet: 7, yieldPerBedFoot: 1 }
];
const targets = [
	{ crop: 'carrot', week: '2027-W23', quantity: 12 },
	{ crop: 'carrot', week: '2027-W24', quantity: 30 },
	{ crop: 'carrot', week: '2027-W25', quantity: 15 }
];

describe('a succession and the plantings that cover the rest of its weeks', () => {
	const [cover] = cropCover(carrots, targets);

	it('lists the weekly need, its own share and the others', () => {
		// Source: arithmetic by hand (above). W24: target 30; B gives 15, A 10, C 3 → 28, 2 lb short.
		// W25: target 15; B alone gives 15 → met exactly.
		const b = successionCover(cover, 'B');
		expect(b.map((w) => w.week)).toEqual(['2027-W24', '2027-W25']);
		expect(b[0]).toMatchObject({ target: 30, supply: 28, gap: 2, surplus: 0 });
		expect(b[0].own).toBeCloseTo(15, 9);
		expect(b[0].others.map((o) => o.key)).toEqual(['A', 'C']);
		expect(b[0].others[0].quantity).toBeCloseTo(10, 9);
		expect(b[0].others[1].quantity).toBeCloseTo(3, 9);
		expect(b[1].own).toBeCloseTo(15, 9);
		expect(b[1].others).toEqual([]);
		expect(b[1].gap + b[1].surplus).toBeCloseTo(0, 9);
	});

	it('counts a part week pro rata, and an earlier week with more than its need as surplus', () => {
		// W23: target 12; A gives 10, C 4 (Thursday to Sunday) → 14, 2 lb over.
		const c = successionCover(cover, 'C');
		expect(c.map((w) => w.week)).toEqual(['2027-W23', '2027-W24']);
		expect(c[0].own).toBeCloseTo(4, 9);
		expect(c[0].others).toHaveLength(1);
		expect(c[0].others[0].quantity).toBeCloseTo(10, 9);
		expect(c[0].surplus).toBeCloseTo(2, 9);
		expect(c[1].own).toBeCloseTo(3, 9);
	});

	it('gives nothing for a planting it does not know', () => {
		expect(successionCover(cover, 'nope')).toEqual([]);
	});
});

describe('a storage crop: shares of what the store gives', () => {
	// Two garlic plantings dug in W28 (2027-07-12 is its Monday): G1 100 ft × 1 head = 100 heads, G2 50.
	// Kept 10 weeks, losing 10 % a week (invented figures); demand 30 heads in each of W28–W30.
	const garlic: CoverPlanting[] = [
		{ key: 'G1', crop: 'garlic', firstHarvest: '2027-07-12', harvestWindowDays: 7, bedFeet: 100, yieldPerBedFoot: 1 },
		{ key: 'G2', crop: 'garlic', firstHarvest: '2027-07-12', harvestWindowDays: 7, bedFeet: 50, yieldPerBedFoot: 1 }
	];
	const demand = ['2027-W28', '2027-W29', '2027-W30'].map((week) => ({ crop: 'garlic', week, quantity: 30 }));
	const store = { crop: 'garlic', keepWeeks: 10, lossPerWeek: 0.1 };

	it('takes from one lot in proportion to what each planting put in', () => {
		// Source: arithmetic by hand. W28: lot G1 100 + G2 50; 30 taken as 20 + 10 → 80, 40 left.
		// W29: × 0.9 → 72, 36; 30 taken as 20 + 10 → 52, 26. W30: × 0.9 → 46.8, 23.4; 20 + 10 → 26.8, 13.4.
		// What no week takes is the surplus of the harvest week: G1 20 + 26.8 = 46.8 in W28, G2 10 + 13.4 = 23.4.
		const [cover] = cropCover(garlic, demand, [store]);
		const g1 = successionCover(cover, 'G1');
		expect(g1.map((w) => w.week)).toEqual(['2027-W28', '2027-W29', '2027-W30']);
		expect(g1[0].own).toBeCloseTo(46.8, 9);
		expect(g1[0].others[0].quantity).toBeCloseTo(23.4, 9);
		expect(g1[0].surplus).toBeCloseTo(40.2, 9);
		expect(g1[1].own).toBeCloseTo(20, 9);
		expect(g1[1].others[0].quantity).toBeCloseTo(10, 9);
		expect(g1[2].supply).toBeCloseTo(30, 9);
		expect(g1[2].gap).toBeCloseTo(0, 9);
	});

	it('adds up to the store as the forecast runs it (throughStores)', () => {
		const [cover] = cropCover(garlic, demand, [store]);
		const field = forecast(garlic, []).map((r) => ({ crop: r.crop, week: r.week, quantity: r.supply }));
		const stored = throughStores(field, demand, [store]);
		for (const s of stored) {
			const i = cover.weeks.indexOf(s.week);
			expect(cover.plantings.reduce((sum, p) => sum + p.share[i], 0)).toBeCloseTo(s.quantity, 9);
		}
	});
});

describe('property: the shares of every week add up to the forecast supply', () => {
	it('for generated plantings with every harvest curve', () => {
		const planting = fc.record({
			start: fc.integer({ min: 0, max: 120 }),
			window: fc.integer({ min: 1, max: 60 }),
			feet: fc.integer({ min: 1, max: 200 }),
			perFoot: fc.double({ min: 0.1, max: 5, noNaN: true }),
			shape: fc.constantFrom('flat', 'ramp', 'single', 'cuts')
		});
		fc.assert(
			fc.property(fc.array(planting, { minLength: 1, maxLength: 8 }), (ps) => {
				const list: CoverPlanting[] = ps.map((p, i) => ({
					key: `p${i}`,
					crop: 'greens',
					firstHarvest: new Date(Date.UTC(2027, 3, 1 + p.start)).toISOString().slice(0, 10),
					harvestWindowDays: p.window,
					bedFeet: p.feet,
					yieldPerBedFoot: p.perFoot,
					curve: p.shape === 'cuts' ? { shape: 'cuts', intervalDays: 14 } : { shape: p.shape }
				}));
				const [cover] = cropCover(list, []);
				for (const r of forecast(list, [])) {
					const i = cover.weeks.indexOf(r.week);
					const sum = i < 0 ? 0 : cover.plantings.reduce((s, p) => s + p.share[i], 0);
					expect(sum).toBeCloseTo(r.supply, 6);
				}
			}),
			{ numRuns: 200 }
		);
	});
});
