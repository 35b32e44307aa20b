import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	type Bed,
	type BedPlanting,
	PlanningInputError,
	type PlacementRequest,
	addDays,
	checkBedConflicts,
	freeSpace,
	placePlantings
} from '../../../src/lib/planning/index';

const beds: Bed[] = [
	{ id: 'b1', lengthFt: 100 },
	{ id: 'b2', lengthFt: 100 }
];
const req = (
	key: string,
	bedFeet: number,
	fieldDate: string,
	lastHarvest: string,
	family?: string
): PlacementRequest => ({
	key,
	bedFeet,
	fieldDate,
	lastHarvest,
	family
});

describe('placePlantings', () => {
	it('places first fit by field date into free bed-foot ranges', () => {
		const r = placePlantings(
			[
				// given out of order: placement goes by field date
				req('C', 40, '2026-05-10', '2026-07-01'),
				req('A', 60, '2026-05-01', '2026-06-30'),
				req('B', 60, '2026-05-05', '2026-07-01')
			],
			beds
		);
		expect(r.placed).toEqual([
			{ plantingKey: 'A', bedId: 'b1', startFt: 0, lengthFt: 60 },
			{ plantingKey: 'B', bedId: 'b2', startFt: 0, lengthFt: 60 },
			{ plantingKey: 'C', bedId: 'b1', startFt: 60, lengthFt: 40 }
		]);
		expect(r.unplaced).toEqual([]);
	});

	it('holds the bed through last harvest plus turnaround days', () => {
		const first = req('A', 100, '2026-05-01', '2026-06-30');
		// 7 turnaround days: A holds b1 through 30 Jun + 7 = 7 Jul; free again on 8 Jul
		const onTime = placePlantings([first, req('B', 100, '2026-07-08', '2026-08-30')], [beds[0]]);
		expect(onTime.placed.map((p) => p.bedId)).toEqual(['b1', 'b1']);
		const early = placePlantings([first, req('B', 100, '2026-07-07', '2026-08-30')], [beds[0]]);
		expect(early.unplaced.map((u) => u.plantingKey)).toEqual(['B']);
		expect(early.unplaced[0].reason).toMatch(/No bed has 100 ft free/);
		const noTurn = placePlantings([first, req('B', 100, '2026-07-01', '2026-08-30')], [beds[0]], { turnaroundDays: 0 });
		expect(noTurn.unplaced).toEqual([]);
	});

	it('keeps a family off the beds it held last season when another has room', () => {
		const previousFamilyByBed = { b1: ['Apiaceae'] };
		const r = placePlantings(
			[
				req('carrot1', 80, '2026-04-20', '2026-07-12', 'Apiaceae'),
				req('carrot2', 80, '2026-04-21', '2026-07-12', 'Apiaceae')
			],
			beds,
			{ previousFamilyByBed }
		);
		// carrot1 skips b1 for b2; carrot2 finds b2 full and goes to b1 with a warning
		expect(r.placed.map((p) => [p.plantingKey, p.bedId])).toEqual([
			['carrot1', 'b2'],
			['carrot2', 'b1']
		]);
		expect(r.warnings).toEqual([expect.objectContaining({ plantingKey: 'carrot2', code: 'rotation_conflict' })]);
	});

	it('works around fixed plantings', () => {
		const fixed: BedPlanting[] = [
			{ key: 'garlic', bedId: 'b1', startFt: 0, lengthFt: 50, fieldDate: '2025-10-20', lastHarvest: '2026-07-15' }
		];
		const r = placePlantings(
			[req('A', 60, '2026-05-01', '2026-06-30'), req('B', 50, '2026-05-01', '2026-06-30')],
			beds,
			{ fixed }
		);
		expect(r.placed).toEqual([
			{ plantingKey: 'A', bedId: 'b2', startFt: 0, lengthFt: 60 },
			{ plantingKey: 'B', bedId: 'b1', startFt: 50, lengthFt: 50 }
		]);
	});

	it('splits a planting longer than any bed, or reports it when splitting is off', () => {
		const r = placePlantings([req('A', 150, '2026-05-01', '2026-06-30')], beds);
		expect(r.placed).toEqual([
			{ plantingKey: 'A', bedId: 'b1', startFt: 0, lengthFt: 100 },
			{ plantingKey: 'A', bedId: 'b2', startFt: 0, lengthFt: 50 }
		]);
		expect(r.warnings.map((w) => w.code)).toEqual(['split_across_beds']);
		const whole = placePlantings([req('A', 150, '2026-05-01', '2026-06-30')], beds, { allowSplit: false });
		expect(whole.placed).toEqual([]);
		expect(whole.unplaced.map((u) => u.plantingKey)).toEqual(['A']);
	});

	it('never splits a piece under minPieceFt: 25 ft into an 18 ft gap goes 15 + 10, not 18 + 7', () => {
		// b1 has 18 ft free (82 ft held), b2 has 10 ft free (90 ft held): a 25 ft planting must split.
		const r = placePlantings(
			[
				req('X', 82, '2026-05-01', '2026-06-30'),
				req('Y', 90, '2026-05-01', '2026-06-30'),
				req('A', 25, '2026-05-02', '2026-06-30')
			],
			beds,
			{ minPieceFt: 10 }
		);
		const pieces = r.placed.filter((p) => p.plantingKey === 'A').map((p) => p.lengthFt);
		// 25 − 18 = 7 would be under 10, so the first piece leaves 10: 15 + 10.
		expect(pieces).toEqual([15, 10]);
	});

	it('property: no piece of a split planting is under minPieceFt', () => {
		fc.assert(
			fc.property(
				fc.array(
					fc.record({
						feet: fc.integer({ min: 1, max: 180 }),
						day: fc.integer({ min: 0, max: 60 }),
						len: fc.integer({ min: 10, max: 90 })
					}),
					{ minLength: 1, maxLength: 25 }
				),
				fc.integer({ min: 2, max: 30 }),
				(ps, minPieceFt) => {
					const reqs = ps.map((p, i) =>
						req(`p${i}`, p.feet, addDays('2026-04-01', p.day), addDays('2026-04-01', p.day + p.len))
					);
					const r = placePlantings(reqs, [...beds, { id: 'b3', lengthFt: 60 }], { minPieceFt });
					const byKey = new Map<string, number[]>();
					for (const p of r.placed) byKey.set(p.plantingKey, [...(byKey.get(p.plantingKey) ?? []), p.lengthFt]);
					for (const pieces of byKey.values())
						if (pieces.length > 1) for (const l of pieces) expect(l).toBeGreaterThanOrEqual(minPieceFt - 1e-9);
				}
			),
			{ numRuns: 200 }
		);
	});

	it('rolls back pieces when even split there is not room, and says how much was free', () => {
		const r = placePlantings(
			[req('A', 150, '2026-05-01', '2026-06-30'), req('B', 120, '2026-05-02', '2026-06-30')],
			beds
		);
		expect(r.placed.filter((p) => p.plantingKey === 'B')).toEqual([]);
		expect(r.unplaced).toEqual([{ plantingKey: 'B', reason: expect.stringMatching(/only 50 ft is free/) }]);
		// the rolled-back pieces left room for a later 50 ft planting
		const r2 = placePlantings(
			[
				req('A', 150, '2026-05-01', '2026-06-30'),
				req('B', 120, '2026-05-02', '2026-06-30'),
				req('C', 50, '2026-05-03', '2026-06-30')
			],
			beds
		);
		expect(r2.placed.find((p) => p.plantingKey === 'C')).toEqual({
			plantingKey: 'C',
			bedId: 'b2',
			startFt: 50,
			lengthFt: 50
		});
	});

	it('rejects bad input', () => {
		expect(() => placePlantings([req('A', 0, '2026-05-01', '2026-06-30')], beds)).toThrow(PlanningInputError);
		expect(() => placePlantings([req('A', 10, '2026-07-01', '2026-06-30')], beds)).toThrow(/lastHarvest/);
		expect(() => placePlantings([], [beds[0], beds[0]])).toThrow(/duplicates bed b1/);
	});
});

describe('checkBedConflicts', () => {
	const p = (
		key: string,
		bedId: string,
		startFt: number,
		lengthFt: number,
		fieldDate: string,
		lastHarvest: string
	): BedPlanting => ({
		key,
		bedId,
		startFt,
		lengthFt,
		fieldDate,
		lastHarvest
	});

	it('reports overlaps on both plantings, counting turnaround days', () => {
		const plantings = [
			p('A', 'b1', 0, 60, '2026-05-01', '2026-06-30'),
			// overlaps A's feet 40–60 while both are in the ground
			p('B', 'b1', 40, 40, '2026-06-01', '2026-07-30'),
			// same feet as A but after A's turnaround (30 Jun + 7 = 7 Jul)
			p('C', 'b1', 0, 40, '2026-07-08', '2026-08-30'),
			// inside A's turnaround
			p('D', 'b2', 0, 10, '2026-05-01', '2026-05-31'),
			p('E', 'b2', 0, 10, addDays('2026-05-31', 7), '2026-07-31')
		];
		const out = checkBedConflicts(plantings, beds, 7);
		const pairs = out.map((c) => `${c.plantingKey}-${c.withKey}`).sort();
		// C (0–40 ft) meets B (40–80 ft) edge to edge: touching is not overlapping
		expect(pairs).toEqual(['A-B', 'B-A', 'D-E', 'E-D']);
		expect(out.every((c) => c.code === 'overlap')).toBe(true);
		expect(checkBedConflicts(plantings, beds, 6).filter((c) => c.plantingKey === 'D')).toEqual([]);
	});

	it('reports ranges past the bed end and unknown beds', () => {
		const out = checkBedConflicts(
			[p('A', 'b1', 70, 40, '2026-05-01', '2026-06-30'), p('B', 'b9', 0, 10, '2026-05-01', '2026-06-30')],
			beds
		);
		expect(out.map((c) => [c.plantingKey, c.code])).toEqual([
			['A', 'past_bed_end'],
			['B', 'unknown_bed']
		]);
		expect(out[0].message).toMatch(/70–110 ft runs past bed b1 \(0–100 ft\)/);
	});
});

describe('freeSpace', () => {
	it('lists the feet free for the whole period, per bed', () => {
		const plantings: BedPlanting[] = [
			{ key: 'A', bedId: 'b1', startFt: 0, lengthFt: 30, fieldDate: '2026-05-01', lastHarvest: '2026-06-30' },
			{ key: 'B', bedId: 'b1', startFt: 50, lengthFt: 20, fieldDate: '2026-07-20', lastHarvest: '2026-08-30' }
		];
		// 1 Jul – 31 Jul: A still holds its turnaround to 7 Jul; B arrives 20 Jul
		const out = freeSpace(plantings, beds, '2026-07-01', '2026-07-31');
		expect(out[0]).toEqual({
			bedId: 'b1',
			ranges: [
				{ startFt: 30, endFt: 50, lengthFt: 20 },
				{ startFt: 70, endFt: 100, lengthFt: 30 }
			],
			freeFt: 50,
			longestFt: 30
		});
		expect(out[1]).toMatchObject({ bedId: 'b2', freeFt: 100, longestFt: 100 });
		// from 8 Jul to 19 Jul the whole of b1 is free
		expect(freeSpace(plantings, beds, '2026-07-08', '2026-07-19')[0].freeFt).toBe(100);
	});
});
