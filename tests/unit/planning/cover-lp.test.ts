// The engine's own covering-program solver against an independent one: the HiGHS solver (the
// `highs` package from npm, HiGHS compiled to WebAssembly) on the same programs.
import fc from 'fast-check';
import highsLoader from 'highs';
import { beforeAll, describe, expect, it } from 'vitest';
import { type CoverRow, solveCover } from '../../../src/lib/planning/cover-lp';

type Highs = Awaited<ReturnType<typeof highsLoader>>;
let highs: Highs;
beforeAll(async () => {
	highs = await highsLoader();
});

const lpText = (rows: CoverRow[], cost: number[]): string =>
	`Minimize\n obj: ${cost.map((c, i) => `${c} x${i}`).join(' + ')}\nSubject To\n` +
	rows.map((r, j) => ` r${j}: ${r.terms.map(([i, a]) => `${a} x${i}`).join(' + ')} >= ${r.need}`).join('\n') +
	'\nEnd\n';

describe('solveCover', () => {
	it('a worked example: two starts, two weeks', () => {
		// minimise 10a + 12b with a + b ≥ 4 (week 1) and 2b ≥ 2 (week 2): b = 1 meets week 2, a = 3
		// the rest of week 1 (cheaper than more b): 30 + 12 = 42.
		const x = solveCover(
			[
				{
					need: 4,
					terms: [
						[0, 1],
						[1, 1]
					]
				},
				{ need: 2, terms: [[1, 2]] }
			],
			[10, 12]
		)!;
		expect(x[0]).toBeCloseTo(3, 9);
		expect(x[1]).toBeCloseTo(1, 9);
	});

	it('reaches the same optimum as HiGHS on generated covering programs, and its x is feasible', () => {
		const program = fc.integer({ min: 1, max: 12 }).chain((m) =>
			fc.record({
				cost: fc.array(fc.double({ min: 1, max: 400, noNaN: true }), { minLength: m, maxLength: m }),
				rows: fc.array(
					fc.record({
						need: fc.double({ min: 0.01, max: 500, noNaN: true }),
						terms: fc.uniqueArray(
							fc.tuple(fc.integer({ min: 0, max: m - 1 }), fc.double({ min: 0.001, max: 20, noNaN: true })),
							{ minLength: 1, maxLength: m, selector: (t) => t[0] }
						)
					}),
					{ minLength: 1, maxLength: 15 }
				)
			})
		);
		fc.assert(
			fc.property(program, ({ cost, rows }) => {
				const x = solveCover(rows, cost);
				expect(x).not.toBeNull();
				const ours = cost.reduce((a, c, i) => a + c * x![i], 0);
				for (const r of rows) {
					const got = r.terms.reduce((a, [i, coef]) => a + coef * x![i], 0);
					expect(got).toBeGreaterThanOrEqual(r.need * (1 - 1e-9) - 1e-9);
				}
				const ref = highs.solve(lpText(rows, cost));
				expect(ref.Status).toBe('Optimal');
				expect(ours).toBeCloseTo(ref.ObjectiveValue, 5 - Math.ceil(Math.log10(Math.max(1, ref.ObjectiveValue))));
			}),
			{ numRuns: 200 }
		);
	}, 60_000);
});
