/**
 * Exact conversion constants: international yard and pound agreement (1959);
 * NIST Handbook 44, Appendix C. The UI stores imperial (the trade's unit) and
 * converts for farms that choose metric.
 */
export const KG_PER_LB = 0.45359237;
export const G_PER_OZ = 28.349523125;
export const OZ_PER_LB = 16;
export const M_PER_FT = 0.3048;
export const IN_PER_FT = 12;
export const CM_PER_IN = 2.54;
export const SQFT_PER_ACRE = 43_560;
export const M2_PER_ACRE = 4_046.8564224;
export const M2_PER_HECTARE = 10_000;

export const lbToKg = (lb: number): number => lb * KG_PER_LB;
export const kgToLb = (kg: number): number => kg / KG_PER_LB;
export const ozToG = (oz: number): number => oz * G_PER_OZ;
export const gToOz = (g: number): number => g / G_PER_OZ;
export const ftToM = (ft: number): number => ft * M_PER_FT;
export const mToFt = (m: number): number => m / M_PER_FT;
export const inToCm = (inches: number): number => inches * CM_PER_IN;
export const cmToIn = (cm: number): number => cm / CM_PER_IN;
export const acresToM2 = (acres: number): number => acres * M2_PER_ACRE;
export const sqftToM2 = (sqft: number): number => sqft * M_PER_FT * M_PER_FT;
export const fToC = (f: number): number => ((f - 32) * 5) / 9;
export const cToF = (c: number): number => (c * 9) / 5 + 32;

/** Seed catalogues quote seeds per ounce; the engine works per gram. */
export const seedsPerOzToPerGram = (perOz: number): number => perOz / G_PER_OZ;
export const seedsPerGramToPerOz = (perGram: number): number => perGram * G_PER_OZ;

/** Yield per bed-foot (lb/ft) as kg per metre of bed. */
export const lbPerFtToKgPerM = (lbPerFt: number): number => (lbPerFt * KG_PER_LB) / M_PER_FT;

/** Plants per acre at a square-grid spacing, both in feet (L. H. Bailey, Farm and Garden Rule-Book). */
export function plantsPerAcre(rowSpacingFt: number, inRowSpacingFt: number): number {
	return SQFT_PER_ACRE / (rowSpacingFt * inRowSpacingFt);
}

/** Harvest per acre from a per-bed-foot yield and the bed's centre-to-centre width in feet. */
export function perAcreFromPerBedFoot(yieldPerBedFoot: number, bedCentresFt: number): number {
	return (yieldPerBedFoot * SQFT_PER_ACRE) / bedCentresFt;
}
