// Target derivation on small worked examples, computed by hand in the comments; the demand
// page's live overlay of unsaved edits; and the demand schemas' money and week rules.
import { describe, expect, it } from 'vitest';
import { deriveTargets, deriveTargetsWithNotes, explainTargets, type TargetInput } from '../../src/lib/planning';
import { cellsSchema, shareSizeSchema, isoWeekField, uploadRowSchema } from '../../src/lib/schemas/demand';
import {
	engineInput,
	explainCell,
	gridWeeks,
	withEdits,
	type PageDemand
} from '../../src/routes/(app)/seasons/[id]/demand/demand-page';

const input: TargetInput = {
	shareSizes: [
		{ id: 'full', members: 60, firstWeek: '2027-W24', lastWeek: '2027-W30' },
		{ id: 'half', members: 40, firstWeek: '2027-W26', lastWeek: '2027-W30' }
	],
	boxItems: [
		{ shareSizeId: 'full', week: '2027-W26', crop: 'carrot', quantity: 1.5 },
		{ shareSizeId: 'half', week: '2027-W26', crop: 'carrot', quantity: 0.75 },
		{ shareSizeId: 'full', week: '2027-W24', crop: 'kale', quantity: 1 },
		// The half share starts in W26: this W25 item is not counted.
		{ shareSizeId: 'half', week: '2027-W25', crop: 'kale', quantity: 1 },
		{ shareSizeId: 'full', week: '2027-W31', crop: 'carrot', quantity: 1.5 }
	],
	channelDemand: [
		{ crop: 'carrot', week: '2027-W26', quantity: 20 },
		{ crop: 'carrot', week: '2027-W31', quantity: 8 },
		{ crop: 'carrot', week: '2027-W31', quantity: 12 }
	]
};

describe('deriveTargets, worked by hand', () => {
	it('members × box quantity per share size, plus channels', () => {
		const t = deriveTargets(input);
		// carrot W26: 60 full × 1.5 lb + 40 half × 0.75 lb + 20 lb market = 90 + 30 + 20 = 140 lb
		expect(t).toContainEqual({ crop: 'carrot', week: '2027-W26', quantity: 140 });
		// carrot W31: the full share has ended (last week W30), so its 1.5 lb box is not counted;
		// market 8 lb + restaurant 12 lb = 20 lb
		expect(t).toContainEqual({ crop: 'carrot', week: '2027-W31', quantity: 20 });
		// kale W24: 60 full × 1 bunch = 60 bunches
		expect(t).toContainEqual({ crop: 'kale', week: '2027-W24', quantity: 60 });
		// kale W25: the half share's box falls before its first week (W26): no target at all
		expect(t.find((r) => r.crop === 'kale' && r.week === '2027-W25')).toBeUndefined();
		expect(t).toHaveLength(3);
	});
	it('reports the box items it left out', () => {
		const { notes } = deriveTargetsWithNotes(input);
		expect(notes.map((n) => [n.code, n.item.shareSizeId, n.item.week])).toEqual([
			['box_outside_distribution', 'half', '2027-W25'],
			['box_outside_distribution', 'full', '2027-W31']
		]);
	});
	it('explains the 140 lb line by line', () => {
		const steps = explainTargets(input, 'carrot', '2027-W26');
		// 60 × 1.5 = 90; 40 × 0.75 = 30; market 20; total 140
		expect(steps.map((s) => s.value)).toEqual([90, 30, 20, 140]);
		expect(steps[0].formula).toBe('60 members × 1.5 per box');
		expect(steps[1].formula).toBe('40 members × 0.75 per box');
	});
});

// The page's own shape: ids are numbers, channels are named.
const page: PageDemand = {
	shareSizes: [
		{ id: 1, name: 'Full share', members: 60, firstWeek: '2027-W24', lastWeek: '2027-W26' },
		{ id: 2, name: 'Half share', members: 40, firstWeek: '2027-W24', lastWeek: '2027-W26' }
	],
	boxItems: [
		{ shareSizeId: 1, week: '2027-W24', cropId: 7, quantity: 1.5 },
		{ shareSizeId: 2, week: '2027-W24', cropId: 7, quantity: 0.75 }
	],
	channelDemand: [
		{ channel: 'market', cropId: 7, week: '2027-W24', quantity: 20 },
		{ channel: 'restaurant', cropId: 7, week: '2027-W24', quantity: 5 }
	],
	crops: [{ id: 7, name: 'Carrot', family: 'Apiaceae', unit: 'lb' }]
};

describe('the demand page', () => {
	it('lays unsaved edits over the saved demand before deriving', () => {
		// saved: 60 × 1.5 + 40 × 0.75 + 20 + 5 = 90 + 30 + 25 = 145 lb
		expect(deriveTargets(engineInput(page))).toEqual([{ crop: '7', week: '2027-W24', quantity: 145 }]);
		// full box edited to 2 lb: 60 × 2 + 30 + 25 = 175 lb
		const edited = withEdits(page, 'share:1', { '7|2027-W24': '2' });
		expect(deriveTargets(engineInput(edited))).toEqual([{ crop: '7', week: '2027-W24', quantity: 175 }]);
		// a new W25 cell of 1 lb in the full box: 60 × 1 = 60 lb; junk text is ignored
		const more = withEdits(page, 'share:1', { '7|2027-W25': '1', '7|2027-W26': 'lots' });
		expect(deriveTargets(engineInput(more))).toContainEqual({ crop: '7', week: '2027-W25', quantity: 60 });
		expect(deriveTargets(engineInput(more)).find((t) => t.week === '2027-W26')).toBeUndefined();
		// clearing the market cell: 90 + 30 + 5 = 125 lb
		const cleared = withEdits(page, 'market', { '7|2027-W24': '' });
		expect(deriveTargets(engineInput(cleared))).toEqual([{ crop: '7', week: '2027-W24', quantity: 125 }]);
	});
	it('names share sizes and channels in the explanation', () => {
		const steps = explainCell(page, engineInput(page), 7, '2027-W24');
		expect(steps.map((s) => [s.label, s.value])).toEqual([
			['Full share', 90],
			['Half share', 30],
			['Market stand', 20],
			['Restaurants', 5],
			['Target', 145]
		]);
	});
	it("shows a share size's weeks, and a channel the span of the shares", () => {
		expect(gridWeeks(page, 'share:2', { first: '2026-W53', last: '2027-W52' })).toEqual([
			'2027-W24',
			'2027-W25',
			'2027-W26'
		]);
		expect(gridWeeks(page, 'market', { first: '2026-W53', last: '2027-W52' })).toEqual([
			'2027-W24',
			'2027-W25',
			'2027-W26'
		]);
		// 2026-W53 … 2027-W52: 1 + 52 weeks. Source: ISO 8601 (2026 has 53 weeks; 2027-12-31 is 2027-W52-5)
		expect(
			gridWeeks({ ...page, shareSizes: [], channelDemand: [] }, 'market', { first: '2026-W53', last: '2027-W52' })
		).toHaveLength(53);
	});
});

describe('demand schemas', () => {
	const share = {
		name: 'Full',
		members: '60',
		firstWeek: '2027-W24',
		lastWeek: '2027-W43',
		pickupDays: ['Fri', 'Tue'],
		price: '720'
	};
	it('keeps money in whole cents without float drift', () => {
		// 720 dollars = 72,000 cents; 0.29 dollars = 29 cents (0.29 × 100 in floating point is 28.999…)
		expect(shareSizeSchema.parse(share).price).toBe(72_000);
		expect(shareSizeSchema.parse({ ...share, price: '0.29' }).price).toBe(29);
		expect(shareSizeSchema.parse({ ...share, price: '$1,250.5' }).price).toBe(125_050);
		expect(shareSizeSchema.safeParse({ ...share, price: '1.999' }).success).toBe(false);
		expect(shareSizeSchema.parse(share).pickupDays).toEqual(['Tue', 'Fri']);
	});
	it('knows which years have a week 53', () => {
		// Source: ISO 8601 (REFERENCES: 2026 has 53 weeks, 2027 has 52)
		expect(isoWeekField('w').safeParse('2026-W53').success).toBe(true);
		expect(isoWeekField('w').safeParse('2027-W53').success).toBe(false);
		expect(isoWeekField('w').safeParse('2027-w05').data).toBe('2027-W05');
		expect(isoWeekField('w').safeParse('2027-W00').success).toBe(false);
	});
	it('checks grid cells and upload rows', () => {
		expect(
			cellsSchema.safeParse({ grid: 'share:3', cells: [{ crop: 1, week: '2027-W24', quantity: '', unit: 'lb' }] }).data
				?.cells[0].quantity
		).toBeNull();
		const bad = cellsSchema.safeParse({
			grid: 'share:3',
			cells: [{ crop: 1, week: '2027-W24', quantity: -1, unit: 'kg' }]
		});
		expect(bad.error?.issues.map((i) => i.path.join('.')).sort()).toEqual(['cells.0.quantity', 'cells.0.unit']);
		expect(
			uploadRowSchema.parse({ channel: 'market', crop: 'Kale', week: '2027-W30', quantity: '20', unit: ' Bunch ' })
		).toEqual({ channel: 'market', crop: 'Kale', week: '2027-W30', quantity: 20, unit: 'bunch' });
		expect(
			uploadRowSchema.parse({ channel: 'market', crop: 'Kale', week: '2027-W30', quantity: '20', unit: '' }).unit
		).toBeUndefined();
	});
});
