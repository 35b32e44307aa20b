import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	type Bed,
	type BedPlanting,
	addDays,
	addWeeks,
	checkBedConflicts,
	forecast,
	isoWeek,
	placePlantings,
	planSuccessions,
	seedNeed,
	weekStart
} from '../../../src/lib/planning/index';
import { farm42, variety } from './fixtures';

const dayNum = (d: string): number => Date.parse(`${d}T00:00:00Z`) / 86_400_000;

describe('properties', () => {
	it('when every target week is reachable, planned weekly supply meets the target every week', () => {
		fc.assert(
			fc.property(
				fc.record({
					harvestWindowDays: fc.integer({ min: 1, max: 63 }),
					yieldPerBedFoot: fc.double({ min: 0.05, max: 10, noNaN: true }),
					daysToMaturity: fc.integer({ min: 20, max: 140 }),
					method: fc.constantFrom('direct' as const, 'transplant' as const)
				}),
				fc.integer({ min: 10, max: 40 }),
				fc.array(fc.oneof(fc.constant(0), fc.double({ min: 0.1, max: 500, noNaN: true })), {
					minLength: 1,
					maxLength: 25
				}),
				fc.option(fc.integer({ min: 1, max: 4 }), { nil: undefined }),
				fc.double({ min: 0, max: 0.5, noNaN: true }),
				fc.constantFrom(1, 2.5, 5, 10),
				fc.boolean(),
				(vr, startWeek, quantities, intervalWeeks, margin, bedFootIncrement, shortDays) => {
					const v = variety({ ...vr, daysInTray: 21, cellsPerTray: 128 });
					const first = `2026-W${String(startWeek).padStart(2, '0')}`;
					const targets = quantities.map((quantity, i) => ({ week: addWeeks(first, i), quantity }));
					const plan = planSuccessions({
						variety: v,
						targets,
						farm: { ...farm42, latitude: shortDays ? 60 : 42 },
						options: { intervalWeeks, margin, bedFootIncrement }
					});
					expect(plan.shortfall).toEqual([]);
					const supply = new Map(
						forecast(
							plan.successions.map((s) => ({ ...s, crop: 'x' })),
							[]
						).map((r) => [r.week, r.supply])
					);
					for (const t of targets) {
						expect(supply.get(t.week) ?? 0).toBeGreaterThanOrEqual(t.quantity * (1 - 1e-9));
					}
				}
			),
			{ numRuns: 300 }
		);
	});

	it('with an earliest field date, every week not reported short is still met', () => {
		fc.assert(
			fc.property(fc.integer({ min: 30, max: 120 }), fc.integer({ min: 0, max: 90 }), (dtm, lateDays) => {
				const v = variety({ daysToMaturity: dtm, harvestWindowDays: 14, yieldPerBedFoot: 1 });
				const targets = Array.from({ length: 20 }, (_, i) => ({ week: addWeeks('2026-W15', i), quantity: 10 + i }));
				const plan = planSuccessions({
					variety: v,
					targets,
					farm: farm42,
					options: { earliestFieldDate: addDays('2026-02-01', lateDays) }
				});
				const short = new Set(plan.shortfall.map((s) => s.week));
				const supply = new Map(
					forecast(
						plan.successions.map((s) => ({ ...s, crop: 'x' })),
						[]
					).map((r) => [r.week, r.supply])
				);
				for (const t of targets) {
					if (!short.has(t.week)) expect(supply.get(t.week) ?? 0).toBeGreaterThanOrEqual(t.quantity * (1 - 1e-9));
				}
				for (const s of plan.successions)
					expect(dayNum(s.fieldDate)).toBeGreaterThanOrEqual(dayNum(addDays('2026-02-01', lateDays)));
			}),
			{ numRuns: 200 }
		);
	});

	it('bed placement never overlaps: same bed and overlapping time ⇒ disjoint feet', () => {
		const planting = fc.record({
			start: fc.integer({ min: 0, max: 150 }),
			length: fc.integer({ min: 1, max: 90 }),
			feet: fc.integer({ min: 1, max: 160 }),
			family: fc.constantFrom('A', 'B', undefined)
		});
		fc.assert(
			fc.property(
				fc.array(fc.integer({ min: 10, max: 120 }), { minLength: 1, maxLength: 6 }),
				fc.array(planting, { minLength: 1, maxLength: 40 }),
				fc.array(planting, { maxLength: 4 }),
				fc.integer({ min: 0, max: 14 }),
				fc.boolean(),
				(lengths, reqs, fixedRaw, turnaroundDays, allowSplit) => {
					const beds: Bed[] = lengths.map((lengthFt, i) => ({ id: `b${i}`, lengthFt }));
					const toDates = (p: { start: number; length: number }) => ({
						fieldDate: addDays('2026-03-01', p.start),
						lastHarvest: addDays('2026-03-01', p.start + p.length)
					});
					const fixed: BedPlanting[] = fixedRaw.map((p, i) => {
						const bed = beds[i % beds.length];
						const lengthFt = Math.min(p.feet, bed.lengthFt);
						return { key: `fixed${i}`, bedId: bed.id, startFt: 0, lengthFt, ...toDates(p) };
					});
					const requests = reqs.map((p, i) => ({ key: `p${i}`, bedFeet: p.feet, family: p.family, ...toDates(p) }));
					const r = placePlantings(requests, beds, {
						turnaroundDays,
						allowSplit,
						fixed,
						previousFamilyByBed: { b0: ['A'] }
					});
					// every planting is either wholly placed or listed unplaced, never both, never dropped
					const placedFeet = new Map<string, number>();
					for (const p of r.placed) placedFeet.set(p.plantingKey, (placedFeet.get(p.plantingKey) ?? 0) + p.lengthFt);
					const unplaced = new Set(r.unplaced.map((u) => u.plantingKey));
					for (const q of requests) {
						expect(placedFeet.has(q.key) !== unplaced.has(q.key)).toBe(true);
						if (placedFeet.has(q.key)) expect(placedFeet.get(q.key)).toBeCloseTo(q.bedFeet, 9);
					}
					const byKey = new Map(requests.map((q) => [q.key, q]));
					const placedAsPlantings: BedPlanting[] = r.placed.map((p, i) => {
						const q = byKey.get(p.plantingKey);
						if (!q) throw new Error(`placed an unknown planting ${p.plantingKey}`);
						return {
							key: `${p.plantingKey}/${i}`,
							bedId: p.bedId,
							startFt: p.startFt,
							lengthFt: p.lengthFt,
							fieldDate: q.fieldDate,
							lastHarvest: q.lastHarvest
						};
					});
					const all = [...fixed, ...placedAsPlantings];
					// brute-force pairwise check, independent of the engine's sweep
					for (let i = 0; i < all.length; i++) {
						const a = all[i];
						const bed = beds.find((b) => b.id === a.bedId)!;
						expect(a.startFt).toBeGreaterThanOrEqual(0);
						expect(a.startFt + a.lengthFt).toBeLessThanOrEqual(bed.lengthFt + 1e-9);
						for (let j = i + 1; j < all.length; j++) {
							const b = all[j];
							// fixed obstacles are given, not placed: they may overlap each other
							if (a.bedId !== b.bedId || (a.key.startsWith('fixed') && b.key.startsWith('fixed'))) continue;
							const timeOverlap =
								dayNum(a.fieldDate) <= dayNum(b.lastHarvest) + turnaroundDays &&
								dayNum(b.fieldDate) <= dayNum(a.lastHarvest) + turnaroundDays;
							const feetOverlap =
								a.startFt < b.startFt + b.lengthFt - 1e-9 && b.startFt < a.startFt + a.lengthFt - 1e-9;
							expect(timeOverlap && feetOverlap).toBe(false);
						}
					}
					// and the grid's conflict check agrees
					expect(checkBedConflicts(placedAsPlantings, beds, turnaroundDays)).toEqual([]);
				}
			),
			{ numRuns: 300 }
		);
	});

	it('seed need never falls as bed-feet grow', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 0, max: 500, noNaN: true }),
				fc.double({ min: 0, max: 50, noNaN: true }),
				fc.record({
					method: fc.constantFrom('direct' as const, 'transplant' as const),
					rows: fc.integer({ min: 1, max: 6 }),
					inRowSpacingIn: fc.double({ min: 0.25, max: 24, noNaN: true }),
					seedsPerSpot: fc.integer({ min: 1, max: 6 }),
					germinationRate: fc.double({ min: 0.05, max: 1, noNaN: true }),
					seedsPerGram: fc.double({ min: 1, max: 2000, noNaN: true }),
					margin: fc.double({ min: 0, max: 1, noNaN: true }),
					cellsPerTray: fc.constantFrom(50, 72, 128, 200)
				}),
				(bedFeet, extra, rest) => {
					const a = seedNeed({ ...rest, bedFeet });
					const b = seedNeed({ ...rest, bedFeet: bedFeet + extra });
					expect(b.spots).toBeGreaterThanOrEqual(a.spots);
					expect(b.seeds).toBeGreaterThanOrEqual(a.seeds);
					expect(b.grams).toBeGreaterThanOrEqual(a.grams);
					expect(b.cells).toBeGreaterThanOrEqual(a.cells);
					expect(b.trays).toBeGreaterThanOrEqual(a.trays);
				}
			),
			{ numRuns: 500 }
		);
	});

	it('weekStart and isoWeek round-trip for any date', () => {
		fc.assert(
			fc.property(fc.integer({ min: -50_000, max: 50_000 }), (n) => {
				const d = addDays('2000-01-01', n);
				const monday = weekStart(isoWeek(d));
				const gap = dayNum(d) - dayNum(monday);
				expect(gap >= 0 && gap <= 6).toBe(true);
			})
		);
	});
});
