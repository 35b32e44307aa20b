import { describe, expect, it } from 'vitest';
import {
	type TargetInput,
	checkBoxes,
	deriveTargets,
	deriveTargetsWithNotes,
	explainSupply,
	explainTargets,
	forecast
} from '../../../src/lib/planning/index';

const demand: TargetInput = {
	shareSizes: [
		{ id: 'full', members: 40, firstWeek: '2026-W23', lastWeek: '2026-W40' },
		{ id: 'half', members: 25, firstWeek: '2026-W23', lastWeek: '2026-W40' }
	],
	boxItems: [
		{ shareSizeId: 'full', week: '2026-W25', crop: 'carrot', quantity: 2 },
		{ shareSizeId: 'half', week: '2026-W25', crop: 'carrot', quantity: 1 },
		{ shareSizeId: 'full', week: '2026-W25', crop: 'beet', quantity: 1.5 },
		// outside the distribution weeks: not counted, and reported
		{ shareSizeId: 'full', week: '2026-W41', crop: 'carrot', quantity: 2 }
	],
	channelDemand: [
		{ crop: 'carrot', week: '2026-W25', quantity: 30 },
		{ crop: 'carrot', week: '2026-W26', quantity: 12 }
	]
};

describe('deriveTargets', () => {
	it('sums members × box quantity within distribution weeks, plus channels', () => {
		expect(deriveTargets(demand)).toEqual([
			// beet W25: 40 × 1.5 = 60
			{ crop: 'beet', week: '2026-W25', quantity: 60 },
			// carrot W25: 40 × 2 + 25 × 1 + 30 = 135
			{ crop: 'carrot', week: '2026-W25', quantity: 135 },
			// carrot W26: market only
			{ crop: 'carrot', week: '2026-W26', quantity: 12 }
		]);
		const { notes } = deriveTargetsWithNotes(demand);
		expect(notes.map((n) => [n.code, n.item.week])).toEqual([['box_outside_distribution', '2026-W41']]);
	});

	it('explains a target line by line', () => {
		const steps = explainTargets(demand, 'carrot', '2026-W25');
		expect(steps.map((s) => s.value)).toEqual([80, 25, 30, 135]);
		expect(steps[0].formula).toBe('40 members × 2 per box');
	});
});

describe('forecast', () => {
	// 60 ft × 1.5 lb = 90 lb over 14 days (Wed 1 Jul – Tue 14 Jul 2026) = 6.428… lb a day
	const carrots = {
		key: 'carrot#1',
		crop: 'carrot',
		firstHarvest: '2026-07-01',
		harvestWindowDays: 14,
		bedFeet: 60,
		yieldPerBedFoot: 1.5
	};
	const targets = [
		{ crop: 'carrot', week: '2026-W27', quantity: 40 },
		{ crop: 'carrot', week: '2026-W28', quantity: 40 },
		{ crop: 'carrot', week: '2026-W30', quantity: 10 }
	];

	it('spreads a flat harvest pro rata over the days in each week', () => {
		const rows = forecast([carrots], targets);
		const perDay = 90 / 14;
		// W27 (29 Jun – 5 Jul): 1–5 Jul = 5 days → 32.14 lb against 40 → short 7.86
		// W28: 7 days → 45 lb against 40 → 5 over; W29 (13–19 Jul): 13–14 Jul = 2 days → 12.86, no demand
		// W30: nothing harvesting against 10 → short 10
		expect(rows.map((r) => r.week)).toEqual(['2026-W27', '2026-W28', '2026-W29', '2026-W30']);
		expect(rows[0].supply).toBeCloseTo(5 * perDay, 10);
		expect(rows[0].shortfall).toBeCloseTo(40 - 5 * perDay, 10);
		expect(rows[1]).toMatchObject({ demand: 40, surplus: 5, shortfall: 0 });
		expect(rows[1].supply).toBeCloseTo(45, 10);
		expect(rows[2].surplus).toBeCloseTo(2 * perDay, 10);
		expect(rows[3]).toEqual({ crop: 'carrot', week: '2026-W30', supply: 0, demand: 10, shortfall: 10, surplus: 0 });
		// nothing lost: the weeks add back to the 90 lb total
		expect(rows.reduce((t, r) => t + r.supply, 0)).toBeCloseTo(90, 10);
	});

	it('takes a weekly yield instead, and keeps crops apart, sorted', () => {
		const beets = { crop: 'beet', firstHarvest: '2026-07-06', lastHarvest: '2026-07-19', weeklyYield: 21 };
		const rows = forecast([carrots, beets], []);
		expect(rows.filter((r) => r.crop === 'beet').map((r) => [r.week, r.supply])).toEqual([
			['2026-W28', 21],
			['2026-W29', 21]
		]);
		expect(rows[0].crop).toBe('beet');
		expect(explainSupply([carrots, beets], 'carrot', '2026-W29').map((s) => s.label)).toEqual([
			'carrot#1: 2 of 7 days in 2026-W29',
			'carrot supply in 2026-W29'
		]);
	});

	it('checks whether each share box can be filled', () => {
		const rows = forecast(
			[{ crop: 'carrot', firstHarvest: '2026-06-15', lastHarvest: '2026-06-21', weeklyYield: 100 }],
			deriveTargets(demand)
		);
		// W25: carrot 100 of 135 (74 %), beet 0 of 60 → neither box fills
		const boxes = checkBoxes(rows, demand);
		expect(boxes.map((b) => [b.shareSizeId, b.fillable])).toEqual([
			['full', false],
			['half', false]
		]);
		expect(boxes[1].short).toEqual([{ crop: 'carrot', fillRatio: 100 / 135 }]);
	});
});
