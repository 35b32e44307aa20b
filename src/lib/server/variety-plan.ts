// A plan request's varietyPlan names crops and varieties by id: each must be this farm's, and
// each variety must be of the crop it is listed under. Anything else is a 400 naming the entry
// (varietyPlan.<cropId> or varietyPlan.<cropId>.<i>.varietyId), never a plan with a warning.
import type { FieldErrors } from '$lib/schemas/common';
import { db } from './db';

export async function varietyPlanErrors(
	farmId: number,
	varietyPlan: Record<string, { varietyId: number }[]> | undefined
): Promise<FieldErrors | null> {
	if (!varietyPlan || Object.keys(varietyPlan).length === 0) return null;
	const ids = [...new Set(Object.values(varietyPlan).flatMap((shares) => shares.map((s) => s.varietyId)))];
	const crops = Object.keys(varietyPlan).map(Number);
	const [varieties, ownCrops] = await Promise.all([
		db()('varieties').where({ farm_id: farmId }).whereIn('id', ids).select('id', 'crop_id'),
		db()('crops').where({ farm_id: farmId }).whereIn('id', crops).select('id')
	]);
	const cropOf = new Map(varieties.map((v: { id: number; crop_id: number }) => [v.id, v.crop_id]));
	const cropIds = new Set(ownCrops.map((c: { id: number }) => c.id));
	const errors: FieldErrors = {};
	for (const [crop, shares] of Object.entries(varietyPlan)) {
		if (!cropIds.has(Number(crop))) {
			errors[`varietyPlan.${crop}`] = `No crop ${crop} on this farm.`;
			continue;
		}
		shares.forEach((s, i) => {
			const of = cropOf.get(s.varietyId);
			if (of === undefined) errors[`varietyPlan.${crop}.${i}.varietyId`] = `No variety ${s.varietyId} on this farm.`;
			else if (of !== Number(crop))
				errors[`varietyPlan.${crop}.${i}.varietyId`] = `Variety ${s.varietyId} is not a variety of crop ${crop}.`;
		});
	}
	return Object.keys(errors).length ? errors : null;
}
