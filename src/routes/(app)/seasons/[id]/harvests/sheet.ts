// The keyboard table's form fields (rows.{n}.plantingId, rows.{n}.quantity, …) turned into
// records for the batch: blank rows are skipped, and errors name the row as the user sees it.
import { harvestSchema, type HarvestInput } from '$lib/schemas/harvest';
import { fieldErrors, type FieldErrors } from '$lib/schemas/common';

export function sheetRows(values: Record<string, string>): {
	records: HarvestInput[];
	rowOf: number[];
	errors: FieldErrors;
} {
	const rows = new Set<number>();
	for (const k of Object.keys(values)) {
		const m = /^rows\.(\d+)\./.exec(k);
		if (m) rows.add(Number(m[1]));
	}
	const records: HarvestInput[] = [];
	const rowOf: number[] = [];
	const errors: FieldErrors = {};
	for (const n of [...rows].sort((a, b) => a - b)) {
		const get = (f: string): string => (values[`rows.${n}.${f}`] ?? '').trim();
		if (get('plantingId') === '' && get('quantity') === '') continue;
		const parsed = harvestSchema.safeParse({
			plantingId: get('plantingId'),
			quantity: get('quantity'),
			unit: get('unit'),
			notes: get('notes'),
			finished: get('finished'),
			harvestedOn: values.harvestedOn ?? '',
			harvestedBy: values.harvestedBy ?? ''
		});
		if (!parsed.success) {
			for (const [f, msg] of Object.entries(fieldErrors(parsed.error)))
				errors[f === 'harvestedOn' || f === 'harvestedBy' ? f : `rows.${n}.${f}`] = msg;
			continue;
		}
		records.push(parsed.data);
		rowOf.push(n);
	}
	if (rows.size > 0 && records.length === 0 && Object.keys(errors).length === 0)
		errors._form = 'Enter at least one row: a planting and a quantity.';
	return { records, rowOf, errors };
}

/** records.{i}.field (the i-th non-blank row) → rows.{n}.field (the row on screen); shared fields stay as they are. */
export function remapRowErrors(errors: FieldErrors, rowOf: number[]): FieldErrors {
	const out: FieldErrors = {};
	for (const [k, v] of Object.entries(errors)) {
		const m = /^records\.(\d+)\.(.+)$/.exec(k);
		if (!m) {
			out[k] = v;
			continue;
		}
		const field = m[2];
		out[field === 'harvestedOn' || field === 'harvestedBy' ? field : `rows.${rowOf[Number(m[1])]}.${field}`] = v;
	}
	return out;
}
