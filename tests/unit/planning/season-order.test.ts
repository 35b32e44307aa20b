import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { byDayThenRank, inPlanOrder, keyRanks, pieceRanks } from '../../../src/lib/planning/season-order';
import { planSeason, type SeasonVariety } from '../../../src/lib/planning/index';
import { farm42, variety } from './fixtures';

// The plan's order is a rule of our own (field date, then key in plain string order);
// these checks hold the fast ranked path to what one string sort of the keys gives.
const byDateThenKey = <T extends { fieldDate: string; key: string }>(xs: T[]): T[] =>
	[...xs].sort((a, b) =>
		a.fieldDate < b.fieldDate ? -1 : a.fieldDate > b.fieldDate ? 1 : a.key < b.key ? -1 : a.key > b.key ? 1 : 0
	);

// Prefixes from characters that sit on both sides of '#' and '/' in string order.
const prefixArb = fc.string({
	unit: fc.constantFrom('v', '1', '0', '!', '.', '@', 'w', '#', 'Z', '-'),
	minLength: 1,
	maxLength: 5
});

describe('plan order', () => {
	it('ranks keys as a string sort of `${prefix}#${n}` and its pieces would, or declines', () => {
		fc.assert(
			fc.property(
				fc.uniqueArray(prefixArb, { minLength: 1, maxLength: 8 }),
				fc.array(fc.integer({ min: 1, max: 23 }), { minLength: 8, maxLength: 8 }),
				fc.integer({ min: 1, max: 12 }),
				fc.array(fc.integer({ min: 0, max: 3 }), { minLength: 1, maxLength: 200 }),
				(prefixes, counts, pieceCount, days) => {
					const groups: { prefix: string; start: number; count: number }[] = [];
					const keys: string[] = [];
					for (const [g, prefix] of prefixes.entries()) {
						groups.push({ prefix, start: keys.length, count: counts[g] });
						for (let n = 1; n <= counts[g]; n++) keys.push(`${prefix}#${n}`);
					}
					const ranks = keyRanks(groups, keys.length);
					if (prefixes.some((p) => p.includes('#'))) {
						expect(ranks).toBeNull();
						return;
					}
					expect(ranks).not.toBeNull();
					const pieces = pieceRanks(pieceCount);
					// Every (record, piece) once, on a day drawn for its record.
					const items: { key: string; fieldDate: string; day: number; rank: number }[] = [];
					keys.forEach((key, r) => {
						const day = days[r % days.length];
						for (let k = 0; k < pieceCount; k++) {
							items.push({
								key: k === 0 ? key : `${key}/${k + 1}`,
								fieldDate: `2026-05-0${day + 1}`,
								day,
								rank: ranks![r] * pieceCount + pieces[k]
							});
						}
					});
					const ranked = byDayThenRank(
						items,
						items.map((i) => i.day),
						items.map((i) => i.rank),
						keys.length * pieceCount
					);
					expect(ranked!.map((i) => i.key)).toEqual(byDateThenKey(items).map((i) => i.key));
				}
			),
			{ numRuns: 300 }
		);
	});

	it('declines rather than round when the sort numbers would pass 2^53', () => {
		const items = [{ id: 'a' }, { id: 'b' }];
		expect(byDayThenRank(items, [0, 1e9], [0, 1], 2 ** 44)).toBeNull();
		expect(byDayThenRank(items, [5, 3], [0, 1], 2)!.map((i) => i.id)).toEqual(['b', 'a']);
	});

	it('lists a season plan by field date, then key, with or without a # in a variety id', () => {
		fc.assert(
			fc.property(
				fc.uniqueArray(prefixArb, { minLength: 1, maxLength: 6 }),
				fc.integer({ min: 1, max: 4 }),
				(ids, beds) => {
					const varieties: SeasonVariety[] = ids.map((id, i) => ({
						...variety({ harvestWindowDays: 7 + 7 * (i % 3), daysToMaturity: 40 + 9 * i, yieldPerBedFoot: 1 }),
						id,
						cropId: `crop${i}`
					}));
					const targets = varieties.flatMap((v, i) =>
						Array.from({ length: 6 }, (_, k) => ({
							crop: v.cropId,
							week: `2026-W${String(24 + k + (i % 2)).padStart(2, '0')}`,
							quantity: 20 + 13 * ((i + k) % 4)
						}))
					);
					const plan = planSeason({
						farm: farm42,
						varieties,
						beds: Array.from({ length: beds }, (_, b) => ({ id: `b${b}`, lengthFt: 30 })),
						targets,
						options: { bedFootIncrement: 5 }
					});
					expect(plan.plantings.length).toBeGreaterThan(0);
					expect(plan.plantings.map((p) => p.key)).toEqual(byDateThenKey(plan.plantings).map((p) => p.key));
					// The ranked order and the string-sorting fallback agree.
					const placed = plan.plantings.filter((p) => p.bedId !== null);
					const unplaced = plan.plantings.filter((p) => p.bedId === null);
					expect(inPlanOrder(placed, unplaced).map((p) => p.key)).toEqual(plan.plantings.map((p) => p.key));
				}
			),
			{ numRuns: 60 }
		);
	});
});
