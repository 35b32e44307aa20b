// Stored crop and variety figures as their forms show them (percents, dollars), and a posted
// form as plain text values to hand back when it fails.
import { cropFields, formValue, varietyFields } from '$lib/schemas/crop';
import { measuredFields, type UnitContext } from '$lib/schemas/crop-units';
import type { CropView, VarietyView } from '$lib/types';

export function cropFormValues(c: CropView, ctx: UnitContext): Record<string, string> {
	return Object.fromEntries(
		Object.entries(measuredFields(cropFields, ctx)).map(([k, spec]) => [k, formValue(spec, c[k as keyof typeof c])])
	);
}

export function varietyFormValues(v: VarietyView, ctx: UnitContext): Record<string, string> {
	const stored: Record<string, unknown> = {
		...v,
		seedPrice: v.seedPriceCentsPerGram / 100,
		harvestCurve: v.ownHarvestCurve ?? ''
	};
	return Object.fromEntries(
		Object.entries(measuredFields(varietyFields, ctx)).map(([k, spec]) => [k, formValue(spec, stored[k])])
	);
}

/** A new crop's form: a cool-season base temperature (40 °F) in the farm's units. */
export function newCropValues(ctx: UnitContext): Record<string, string> {
	return {
		harvestUnit: 'lb',
		frostTolerance: 'hardy',
		baseTempF: formValue(measuredFields(cropFields, ctx).baseTempF, 40),
		harvestCurve: 'flat'
	};
}
export const newVarietyValues: Record<string, string> = {
	method: 'direct',
	harvestCurve: '',
	daysInTray: '0',
	seedsPerSpot: '1',
	germinationRate: '80',
	seedPrice: '0',
	cellsPerTray: '128',
	margin: '10'
};

/** A posted form's fields as text, capped so a hostile post cannot echo megabytes back. */
export function textValues(form: FormData): Record<string, string> {
	const out: Record<string, string> = {};
	for (const [k, v] of form.entries()) if (typeof v === 'string' && k.length < 64) out[k] = v.slice(0, 1000);
	return out;
}
