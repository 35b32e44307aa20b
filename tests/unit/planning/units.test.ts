import { describe, expect, it } from 'vitest';
import {
	G_PER_OZ,
	KG_PER_LB,
	M2_PER_ACRE,
	SQFT_PER_ACRE,
	acresToM2,
	cToF,
	fToC,
	ftToM,
	gToOz,
	kgToLb,
	lbToKg,
	mToFt,
	ozToG,
	perAcreFromPerBedFoot,
	plantsPerAcre,
	seedsPerOzToPerGram,
	sqftToM2
} from '../../../src/lib/planning/index';

describe('units', () => {
	it('uses the exact international pound, ounce and foot', () => {
		// Source: international yard and pound agreement (1959); NIST Handbook 44 Appendix C
		expect(KG_PER_LB).toBe(0.45359237);
		expect(G_PER_OZ).toBe(28.349523125);
		expect(ftToM(1)).toBe(0.3048);
		expect(lbToKg(1)).toBe(0.45359237);
		// 16 oz = 1 lb: 16 × 28.349523125 g = 453.59237 g
		expect(ozToG(16)).toBeCloseTo(453.59237, 10);
		expect(kgToLb(lbToKg(37.5))).toBeCloseTo(37.5, 12);
		expect(gToOz(ozToG(0.25))).toBeCloseTo(0.25, 12);
		expect(mToFt(ftToM(100))).toBeCloseTo(100, 12);
	});

	it('gives an acre as 43,560 ft² = 4,046.8564224 m²', () => {
		// Source: NIST (acre = 43,560 ft² = 4,046.8564224 m²)
		expect(SQFT_PER_ACRE).toBe(43_560);
		expect(sqftToM2(43_560)).toBeCloseTo(4_046.8564224, 7);
		expect(acresToM2(1)).toBe(M2_PER_ACRE);
	});

	it('gives 7,260 plants per acre at 2 ft × 3 ft', () => {
		// Source: L. H. Bailey, Farm and Garden Rule-Book: 43,560 ÷ (2 × 3) = 7,260
		expect(plantsPerAcre(2, 3)).toBe(7260);
		// 1 ft × 1 ft: one plant per square foot
		expect(plantsPerAcre(1, 1)).toBe(43_560);
	});

	it('converts seeds per ounce to seeds per gram with the NIST ounce', () => {
		// Source: University of Illinois Extension vegetable guide (carrot 18,000–25,000 seeds/oz); NIST ounce
		// 18,000 ÷ 28.349523125 = 634.9313…; 25,000 ÷ 28.349523125 = 881.8490…
		expect(seedsPerOzToPerGram(18_000)).toBeCloseTo(634.9313, 3);
		expect(seedsPerOzToPerGram(25_000)).toBeCloseTo(881.849, 3);
		// 28,349.523125 seeds per ounce is exactly 1,000 per gram
		expect(seedsPerOzToPerGram(28_349.523125)).toBeCloseTo(1000, 9);
	});

	it('turns a per-row yield into a per-acre yield inside the published range', () => {
		// Source: University of Illinois Extension vegetable guide (carrot ≈ 100 lb per 100 ft of row)
		// Rows 18 in apart (common practice (no published source)): 43,560 ÷ 1.5 = 29,040 ft of row per acre → 29,040 lb
		const perAcre = perAcreFromPerBedFoot(100 / 100, 1.5);
		expect(perAcre).toBe(29_040);
		// Source: New England Vegetable Management Guide, Table 15 (after Knott's): carrot 20,000 low – 30,000 excellent lb/acre
		expect(perAcre).toBeGreaterThanOrEqual(20_000);
		expect(perAcre).toBeLessThanOrEqual(30_000);
	});

	it('converts temperatures', () => {
		expect(fToC(32)).toBe(0);
		expect(fToC(212)).toBe(100);
		// Source: Oklahoma State University GDD calculator notes: 40 °F (4.4 °C), 50 °F (10 °C)
		expect(fToC(40)).toBeCloseTo(4.4, 1);
		expect(cToF(10)).toBe(50);
	});
});
