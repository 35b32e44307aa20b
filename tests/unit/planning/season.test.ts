// planSeason on small worked examples. Every expected figure below is worked out by hand in the
// comments, never by asking the engine; the varieties, targets and beds are INVENTED demo numbers,
// chosen so the arithmetic stays round, not figures to plant by.
import { describe, expect, it } from 'vitest';
import {
	type Bed,
	type KeptPlanting,
	type SeasonPlanInput,
	type SeasonVariety,
	planSeason,
	seedNeed
} from '../../../src/lib/planning/index';
import { farm42 } from './fixtures';

/**
 * Invented variety: direct-sown, 50 days to first harvest, a one-week (7-day) harvest window
 * yielding 1 unit per bed-foot over that window, one row at 6 in, 80 % germination, 100 seeds a
 * gram and a 25 % seed margin. A 7-day window means one succession per target week (interval 1).
 */
function v(over: Partial<SeasonVariety> = {}): SeasonVariety {
	return {
		id: 'v',
		cropId: 'crop',
		method: 'direct',
		daysToMaturity: 50,
		harvestWindowDays: 7,
		yieldPerBedFoot: 1,
		rows: 1,
		inRowSpacingIn: 6,
		seedsPerSpot: 1,
		germinationRate: 0.8,
		seedsPerGram: 100,
		frostTender: false,
		margin: 0.25,
		...over
	};
}

const twoBeds: Bed[] = [
	{ id: 'b1', lengthFt: 100 },
	{ id: 'b2', lengthFt: 100 }
];

const weekly = (crop: string, weeks: number[], quantity: number): SeasonPlanInput['targets'] =>
	weeks.map((w) => ({ crop, week: `2026-W${String(w).padStart(2, '0')}`, quantity }));

// Bed-feet margin 0 so each bed-foot figure is target ÷ yield per foot, nothing added;
// 5-ft increments as a farm would lay out beds (invented farm setting).
const options = { margin: 0, bedFootIncrement: 5 };

// Calendar, worked by hand. 1 Jan 2026 is a Thursday, so ISO week 1 starts Mon 29 Dec 2025
// (Source: ISO 8601 — week 1 holds the year's first Thursday). W24 starts 23 weeks later:
// 29 Dec + 161 days = Mon 8 Jun 2026; W25 15 Jun, W26 22 Jun, W27 29 Jun.
// Field date = first harvest − 50 days: 8 Jun − 50 = 19 Apr; 15 Jun → 26 Apr; 22 Jun → 3 May; 29 Jun → 10 May.
// Last harvest = first harvest + 7 − 1: 14 Jun, 21 Jun, 28 Jun, 5 Jul.
// At 42° N day length in June is well over 10 h, so no short-day allowance applies.

describe('planSeason', () => {
	it('plans one direct-sown crop with a flat target over 4 weeks and lays it into 2 beds', () => {
		const plan = planSeason({
			farm: farm42,
			varieties: [v()],
			beds: twoBeds,
			targets: weekly('crop', [24, 25, 26, 27], 50),
			options
		});
		// 50 units a week ÷ (1 unit per bed-foot per 7-day week) = 50 ft per succession.
		// Each holds its feet from field date to last harvest + 7 turnaround days (the engine default;
		// common practice (no published source)): the first holds 19 Apr–21 Jun, the fourth starts
		// 10 May, so all four overlap and 4 × 50 ft fill b1 and b2 in field-date order, first fit.
		expect(plan.plantings.map((p) => [p.key, p.bedId, p.startFt, p.lengthFt])).toEqual([
			['v@w1#1', 'b1', 0, 50],
			['v@w1#2', 'b1', 50, 50],
			['v@w1#3', 'b2', 0, 50],
			['v@w1#4', 'b2', 50, 50]
		]);
		expect(plan.plantings.map((p) => [p.fieldDate, p.firstHarvest, p.lastHarvest])).toEqual([
			['2026-04-19', '2026-06-08', '2026-06-14'],
			['2026-04-26', '2026-06-15', '2026-06-21'],
			['2026-05-03', '2026-06-22', '2026-06-28'],
			['2026-05-10', '2026-06-29', '2026-07-05']
		]);
		// Yield over the window: 50 ft × 1 = 50 per planting.
		expect(
			plan.plantings.every(
				(p) => p.expectedYield === 50 && p.cropId === 'crop' && p.varietyId === 'v' && p.bedId !== null
			)
		).toBe(true);
		// Seed for 50 ft: 50 × 12 in ÷ 6 in = 100 spots × 1 row × 1 seed ÷ 0.8 germination × 1.25 margin = 156.25 → 157 seeds,
		// 157 ÷ 100 seeds a gram = 1.57 g (invented seed figures).
		expect(plan.plantings[0].seed).toMatchObject({
			spotsPerRow: 100,
			spots: 100,
			seeds: 157,
			grams: 1.57,
			cells: 0,
			trays: 0
		});
		expect(plan.plantings[0].traySowDate).toBeNull();
		expect(plan.shortfall).toEqual([]);
		expect(plan.warnings).toEqual([]);
	});

	it('plans only what a kept planting of the same crop does not already supply', () => {
		// Kept: 30 ft of the crop harvesting 8–21 Jun (14 days, W24 and W25) at 2 units per foot
		// (invented): 30 × 2 = 60 units spread flat over 14 days = 30 a week in W24 and in W25.
		const kept: KeptPlanting[] = [
			{
				key: 'kept',
				cropId: 'crop',
				bedId: 'b1',
				startFt: 0,
				lengthFt: 30,
				fieldDate: '2026-04-10',
				firstHarvest: '2026-06-08',
				lastHarvest: '2026-06-21',
				yieldPerBedFoot: 2
			}
		];
		const plan = planSeason({
			farm: farm42,
			varieties: [v()],
			beds: twoBeds,
			targets: weekly('crop', [24, 25, 26, 27], 50),
			kept,
			options
		});
		// Left to plan: W24 50 − 30 = 20, W25 20, W26 50, W27 50 → 20, 20, 50, 50 ft = 140 ft, not 4 × 50 = 200 ft.
		expect(plan.plantings.map((p) => p.lengthFt)).toEqual([20, 20, 50, 50]);
		expect(plan.plantings.reduce((sum, p) => sum + p.lengthFt, 0)).toBe(140);
		// The kept 30 ft hold b1 0–30 until 21 Jun + 7 = 28 Jun, so the 20-ft plantings take b1 30–50 and
		// 50–70; b1 then has only 30 ft (70–100) free, so the 50-ft plantings go to b2.
		expect(plan.plantings.map((p) => [p.bedId, p.startFt])).toEqual([
			['b1', 30],
			['b1', 50],
			['b2', 0],
			['b2', 50]
		]);
		expect(plan.shortfall).toEqual([]);
		// The kept planting is not proposed again: the plan holds only new plantings.
		expect(plan.plantings.some((p) => p.key === 'kept')).toBe(false);
	});

	it('places around a kept planting that occupies a bed, and uses the bed once it is cleared', () => {
		// Garlic (another crop, so it supplies none of these targets) holds all of b1 from
		// 20 Oct 2025 to 15 Jul 2026, plus 7 turnaround days: b1 is busy through 22 Jul.
		const kept: KeptPlanting[] = [
			{
				key: 'garlic',
				cropId: 'garlic',
				family: 'Amaryllidaceae',
				bedId: 'b1',
				startFt: 0,
				lengthFt: 100,
				fieldDate: '2025-10-20',
				firstHarvest: '2026-07-01',
				lastHarvest: '2026-07-15',
				yieldPerBedFoot: 7
			}
		];
		// W24 (first harvest 8 Jun, field 19 Apr) and W38: Mon 14 Sep = 8 Jun + 14 weeks; field date
		// 14 Sep − 50 days = 26 Jul, after b1 is free; last harvest 14 Sep + 6 = 20 Sep.
		const plan = planSeason({
			farm: farm42,
			varieties: [v()],
			beds: twoBeds,
			targets: [...weekly('crop', [24], 50), ...weekly('crop', [38], 50)],
			kept,
			options
		});
		expect(plan.plantings.map((p) => [p.fieldDate, p.bedId, p.startFt, p.lengthFt])).toEqual([
			['2026-04-19', 'b2', 0, 50],
			// First fit goes by bed order: b1 is free again by 26 Jul, so it comes before b2.
			['2026-07-26', 'b1', 0, 50]
		]);
		expect(plan.shortfall).toEqual([]);
	});

	it("places around another season's planting (an obstacle) without counting its harvest", () => {
		// The same crop, but of another season: it holds b1 0–100 from 1 Apr to 14 Jun 2026
		// (+ 7 turnaround days: busy through 21 Jun), and supplies nothing to this plan.
		const obstacles = [
			{
				key: 'planting#7',
				bedId: 'b1',
				startFt: 0,
				lengthFt: 100,
				fieldDate: '2026-04-01',
				lastHarvest: '2026-06-14',
				family: 'Apiaceae'
			}
		];
		const plan = planSeason({
			farm: farm42,
			varieties: [v()],
			beds: twoBeds,
			targets: weekly('crop', [24], 50),
			obstacles,
			options
		});
		// W24 is still planned in full: 50 ÷ 1 per foot = 50 ft, field date 19 Apr, in b2 since b1 is held.
		expect(plan.plantings.map((p) => [p.key, p.fieldDate, p.bedId, p.startFt, p.lengthFt])).toEqual([
			['v@w1#1', '2026-04-19', 'b2', 0, 50]
		]);
		expect(plan.shortfall).toEqual([]);
		// Without the obstacle the same planting takes b1, the first bed.
		const free = planSeason({
			farm: farm42,
			varieties: [v()],
			beds: twoBeds,
			targets: weekly('crop', [24], 50),
			options
		});
		expect(free.plantings.map((p) => p.bedId)).toEqual(['b1']);
	});

	it('splits a crop between two varieties by week (varietyPlan)', () => {
		// Invented: "early" yields 1 per foot, "late" 2 per foot; early takes weeks up to W25, late from W26.
		const varieties = [v({ id: 'early', cropId: 'lettuce' }), v({ id: 'late', cropId: 'lettuce', yieldPerBedFoot: 2 })];
		const plan = planSeason({
			farm: farm42,
			varieties,
			beds: twoBeds,
			targets: weekly('lettuce', [24, 25, 26, 27], 50),
			varietyPlan: {
				lettuce: [
					{ varietyId: 'early', toWeek: 25 },
					{ varietyId: 'late', fromWeek: 26 }
				]
			},
			options
		});
		// early: W24, W25 at 50 ÷ 1 = 50 ft each; late: W26, W27 at 50 ÷ 2 = 25 ft each.
		// Keys name the variety and the share's first week. early fills b1 (both held into late June);
		// late goes to b2 0–25 and 25–50.
		expect(plan.plantings.map((p) => [p.key, p.varietyId, p.firstHarvest, p.lengthFt, p.bedId, p.startFt])).toEqual([
			['early@w1#1', 'early', '2026-06-08', 50, 'b1', 0],
			['early@w1#2', 'early', '2026-06-15', 50, 'b1', 50],
			['late@w26#1', 'late', '2026-06-22', 25, 'b2', 0],
			['late@w26#2', 'late', '2026-06-29', 25, 'b2', 25]
		]);
		// Each variety's yield on its own feet: 50 × 1 = 50 and 25 × 2 = 50, the weekly target.
		expect(plan.plantings.map((p) => p.expectedYield)).toEqual([50, 50, 50, 50]);
		expect(plan.shortfall).toEqual([]);
	});

	it('splits one week between two varieties by fraction', () => {
		const varieties = [v({ id: 'red', cropId: 'tomato' }), v({ id: 'gold', cropId: 'tomato' })];
		const plan = planSeason({
			farm: farm42,
			varieties,
			beds: twoBeds,
			targets: weekly('tomato', [24], 50),
			varietyPlan: {
				tomato: [
					{ varietyId: 'red', fraction: 0.6 },
					{ varietyId: 'gold', fraction: 0.4 }
				]
			},
			options
		});
		// 50 × 0.6 = 30 ft of red, 50 × 0.4 = 20 ft of gold, same dates. Red is laid first (plan
		// order) at b1 0–30, gold after it at 30–50; the list comes back by field date, then key.
		expect(plan.plantings.map((p) => [p.varietyId, p.lengthFt, p.bedId, p.startFt])).toEqual([
			['gold', 20, 'b1', 30],
			['red', 30, 'b1', 0]
		]);
	});

	it('warns no_variety and leaves the targets in shortfall when a crop has no variety', () => {
		const targets = weekly('okra', [24, 25], 10);
		const plan = planSeason({ farm: farm42, varieties: [v()], beds: twoBeds, targets, options });
		expect(plan.plantings).toEqual([]);
		expect(plan.warnings).toEqual([
			expect.objectContaining({ code: 'no_variety', cropId: 'okra', weeks: ['2026-W24', '2026-W25'] })
		]);
		expect(plan.shortfall).toEqual([
			{ crop: 'okra', week: '2026-W24', quantity: 10 },
			{ crop: 'okra', week: '2026-W25', quantity: 10 }
		]);
	});

	it('keeps an oversize planting with no bed, the reason, and a not_placed warning', () => {
		// 250 a week ÷ 1 per foot = 250 ft against a single 100-ft bed: not whole, and split into
		// pieces of at least 10 ft only 100 ft is free, so it stays unplaced (the 100 ft is given back).
		const plan = planSeason({
			farm: farm42,
			varieties: [v()],
			beds: [{ id: 'b1', lengthFt: 100 }],
			targets: weekly('crop', [24], 250),
			options
		});
		const reason =
			'No bed has 250 ft free from field date 2026-04-19 to 7 days after last harvest 2026-06-14, and split across beds only 100 ft is free in pieces of 10 ft or more.';
		expect(plan.plantings).toHaveLength(1);
		expect(plan.plantings[0]).toMatchObject({
			key: 'v@w1#1',
			bedId: null,
			startFt: 0,
			lengthFt: 250,
			unplacedReason: reason
		});
		// Seed is still sized for the whole 250 ft: 500 spots ÷ 0.8 × 1.25 = 781.25 → 782 seeds.
		expect(plan.plantings[0].seed.seeds).toBe(782);
		expect(plan.warnings).toContainEqual({ code: 'not_placed', key: 'v@w1#1', message: `Not placed: ${reason}` });
	});

	it('gives each piece of a planting split across beds the seed for that piece', () => {
		// 100 ft into two 60-ft beds: no bed holds it whole, so b1 takes 60 ft and b2 the other 40.
		const beds: Bed[] = [
			{ id: 'b1', lengthFt: 60 },
			{ id: 'b2', lengthFt: 60 }
		];
		const plan = planSeason({ farm: farm42, varieties: [v()], beds, targets: weekly('crop', [24], 100), options });
		expect(plan.plantings.map((p) => [p.key, p.bedId, p.startFt, p.lengthFt, p.expectedYield])).toEqual([
			['v@w1#1', 'b1', 0, 60, 60],
			['v@w1#1/2', 'b2', 0, 40, 40]
		]);
		// By hand: 60 ft → 120 spots ÷ 0.8 × 1.25 = 187.5 → 188 seeds; 40 ft → 80 spots ÷ 0.8 × 1.25 = 125 seeds.
		expect(plan.plantings.map((p) => p.seed.seeds)).toEqual([188, 125]);
		// And the same as seedNeed asked for each piece's own length.
		for (const p of plan.plantings) {
			expect(p.seed).toEqual(
				seedNeed({
					method: 'direct',
					bedFeet: p.lengthFt,
					rows: 1,
					inRowSpacingIn: 6,
					seedsPerSpot: 1,
					germinationRate: 0.8,
					seedsPerGram: 100,
					margin: 0.25
				})
			);
			expect(p.warnings).toContainEqual({
				code: 'split_across_beds',
				message: '100 ft split into 2 pieces: b1 60 ft, b2 40 ft.'
			});
		}
	});
});

describe('planSeason never drops a target silently', () => {
	it("puts the weeks of a share naming another crop's variety into shortfall", () => {
		const other = v({ id: 'beet-a', cropId: 'beet' });
		const plan = planSeason({
			farm: farm42,
			varieties: [v(), other],
			beds: twoBeds,
			targets: weekly('crop', [24], 20),
			varietyPlan: { crop: [{ varietyId: 'beet-a' }] },
			options
		});
		// The only share is invalid, so all 20 units of W24 are carried by no variety.
		expect(plan.plantings).toEqual([]);
		expect(plan.shortfall).toEqual([{ crop: 'crop', week: '2026-W24', quantity: 20 }]);
		expect(plan.warnings.map((w) => w.code)).toContain('no_variety');
	});

	it('reports weeks outside every share, and the part left over when fractions add to less than one', () => {
		const a = v({ id: 'a' });
		const b = v({ id: 'b' });
		const plan = planSeason({
			farm: farm42,
			varieties: [a, b],
			beds: twoBeds,
			targets: weekly('crop', [24, 25, 26], 20),
			// a carries W24 whole; b carries 60 % of W26; nobody carries W25.
			varietyPlan: {
				crop: [
					{ varietyId: 'a', toWeek: 24 },
					{ varietyId: 'b', fromWeek: 26, fraction: 0.6 }
				]
			},
			options
		});
		// Left unplanned: W25 all 20 units; W26 20 × (1 − 0.6) = 8 units.
		expect(plan.shortfall).toEqual(
			expect.arrayContaining([
				{ crop: 'crop', week: '2026-W25', quantity: 20 },
				{ crop: 'crop', week: '2026-W26', quantity: expect.closeTo(8, 9) }
			])
		);
		// Planted: W24 20 ft (a) and W26 20 × 0.6 = 12 ft, rounded up to the 5-ft increment = 15 ft (b).
		expect(plan.plantings.map((p) => [p.varietyId, p.lengthFt])).toEqual([
			['a', 20],
			['b', 15]
		]);
	});

	it('plans both halves when two shares of one variety start the same week', () => {
		const plan = planSeason({
			farm: farm42,
			varieties: [v({ id: 'a' })],
			beds: twoBeds,
			targets: weekly('crop', [24], 40),
			varietyPlan: {
				crop: [
					{ varietyId: 'a', fraction: 0.5 },
					{ varietyId: 'a', fraction: 0.5 }
				]
			},
			options
		});
		// 40 × 0.5 = 20 units each: two plantings of 20 ft, 40 ft in all, nothing short.
		expect(plan.plantings.map((p) => p.lengthFt)).toEqual([20, 20]);
		expect(new Set(plan.plantings.map((p) => p.key)).size).toBe(2);
		expect(plan.shortfall).toEqual([]);
	});

	it("keeps placement's notes about kept plantings", () => {
		const kept: KeptPlanting = {
			key: 'old',
			cropId: 'other',
			bedId: 'nope',
			startFt: 0,
			lengthFt: 10,
			fieldDate: '2026-04-01',
			firstHarvest: '2026-05-01',
			lastHarvest: '2026-05-10',
			yieldPerBedFoot: 1
		};
		const plan = planSeason({
			farm: farm42,
			varieties: [v()],
			beds: twoBeds,
			targets: weekly('crop', [24], 10),
			kept: [kept],
			options
		});
		expect(plan.warnings).toEqual(
			expect.arrayContaining([expect.objectContaining({ code: 'unknown_bed', key: 'old' })])
		);
	});
});
