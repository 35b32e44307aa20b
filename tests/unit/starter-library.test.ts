// The starter library a new farm picks from: about 30 crops, every figure passing the same
// schema the crop library's forms use, every variety naming where its figures come from, and the
// handbook figures carried over with the exact unit conversion.
import { describe, expect, it } from 'vitest';
import { starterCrops } from '../../src/lib/server/starter-library';
import { cropFields, cropSchema, formValue, varietyFields, varietySchema } from '../../src/lib/schemas/crop';

const asForm = (
	fields: Record<string, Parameters<typeof formValue>[0]>,
	values: Record<string, unknown>
): Record<string, string> =>
	Object.fromEntries(Object.entries(fields).map(([k, spec]) => [k, formValue(spec, values[k])]));

describe('starter library', () => {
	it('holds about 30 crops with one or two varieties each, under unique names', () => {
		expect(starterCrops.length).toBeGreaterThanOrEqual(28);
		expect(starterCrops.length).toBeLessThanOrEqual(35);
		for (const c of starterCrops) expect(c.varieties.length === 1 || c.varieties.length === 2).toBe(true);
		expect(new Set(starterCrops.map((c) => c.name.toLowerCase())).size).toBe(starterCrops.length);
		expect(new Set(starterCrops.map((c) => c.key)).size).toBe(starterCrops.length);
	});

	it("passes the crop library's own schemas, crop and variety, and keeps every figure through the form", () => {
		for (const c of starterCrops) {
			const crop = cropSchema.safeParse(asForm(cropFields, { harvestCurve: 'flat', ...c, price: null }));
			expect(crop.success, `${c.name}: ${JSON.stringify(crop.error?.issues)}`).toBe(true);
			for (const v of c.varieties) {
				const parsed = varietySchema.safeParse(asForm(varietyFields, { ...v, seedPrice: 0 }));
				expect(parsed.success, `${v.name}: ${JSON.stringify(parsed.error?.issues)}`).toBe(true);
				expect(parsed.data?.germinationRate).toBeCloseTo(v.germinationRate, 9);
				expect(parsed.data?.seedsPerGram).toBeCloseTo(v.seedsPerGram, 9);
			}
		}
	});

	it('gives field dates only as a pair of month-days, and garlic its autumn planting', () => {
		for (const c of starterCrops) {
			expect(c.sowFrom === undefined, c.name).toBe(c.sowTo === undefined);
			if (c.sowFrom) expect(`${c.sowFrom} ${c.sowTo}`).toMatch(/^(0\d|1[0-2])-[0-3]\d (0\d|1[0-2])-[0-3]\d$/);
		}
		// Common practice (no published source): garlic is planted in autumn for a harvest the next summer.
		const garlic = starterCrops.find((c) => c.key === 'garlic')!;
		expect([garlic.sowFrom, garlic.sowTo]).toEqual(['10-01', '11-30']);
		expect(garlic.source).toMatch(/field dates .*common practice/);
		// Frost dates and soil temperature set the others' seasons: no fixed days for them.
		expect(starterCrops.filter((c) => c.sowFrom).map((c) => c.key)).toEqual(['garlic']);
	});

	it('names a source for every variety, or marks its figures common practice', () => {
		for (const c of starterCrops) {
			for (const v of c.varieties) {
				expect(v.source.length).toBeGreaterThan(20);
				expect(v.source.length).toBeLessThanOrEqual(500);
				expect(/Extension|Handbook|Guide|AgriLife|supplier|common practice/i.test(v.source), v.name).toBe(true);
			}
		}
	});

	it('carries handbook seed counts over with the exact ounce', () => {
		const carrot = starterCrops.find((c) => c.key === 'carrot')!.varieties[0];
		// Source: University of Illinois Extension vegetable guide, carrot 18,000–25,000 seeds per ounce
		// (22,000 taken); 1 oz = 28.349523125 g exactly (NIST Handbook 44, Appendix C).
		expect(carrot.seedsPerGram).toBeCloseTo(22_000 / 28.349523125, 2);
		expect(carrot.seedsPerGram).toBeCloseTo(776.03, 2);
		// Source: Kansas State MF-315 / Univ. of Illinois, bush snap bean about 100 seeds per ounce.
		const bean = starterCrops.find((c) => c.key === 'bean')!.varieties[0];
		expect(bean.seedsPerGram).toBeCloseTo(3.53, 2);
		// Source: New England Vegetable Management Guide Table 15, carrot 26,000 lb/acre (good); on 4 ft
		// bed centres an acre holds 43,560 ÷ 4 = 10,890 bed-feet (NIST: 1 acre = 43,560 ft²).
		expect(carrot.yieldPerBedFoot).toBeCloseTo(26_000 / 10_890, 2);
	});

	it('keeps handbook days to maturity inside the published ranges', () => {
		// Source: University of Illinois Extension vegetable guide; Kansas State MF-315 (ranges as in the table).
		const ranges: Record<string, [number, number]> = {
			carrot: [65, 75],
			beet: [52, 70],
			radish: [22, 28],
			spinach: [45, 45],
			kale: [50, 60],
			bean: [51, 58],
			onion: [90, 110]
		};
		for (const [key, [lo, hi]] of Object.entries(ranges)) {
			const c = starterCrops.find((x) => x.key === key)!;
			const direct = c.varieties.filter((v) => v.method === 'direct' || key === 'kale' || key === 'onion');
			for (const v of direct.slice(0, 1)) {
				expect(v.daysToMaturity, v.name).toBeGreaterThanOrEqual(lo);
				expect(v.daysToMaturity, v.name).toBeLessThanOrEqual(hi);
			}
		}
	});

	it('gives beans a rising curve and head lettuce one cut', () => {
		// common practice (no published source): beans pick over 2–3 weeks peaking in the second; heads are one cut.
		expect(starterCrops.find((c) => c.key === 'bean')!.harvestCurve).toBe('ramp');
		expect(starterCrops.find((c) => c.key === 'lettuce')!.harvestCurve).toBe('single');
		expect(starterCrops.find((c) => c.key === 'carrot')!.harvestCurve).toBeUndefined();
	});

	it('keeps cilantro out of weeks above 85 °F', () => {
		// Source: Texas A&M AgriLife, Cilantro in the Garden (bolts above 85 °F).
		expect(starterCrops.find((c) => c.key === 'cilantro')!.heatLimitF).toBe(85);
	});
});
