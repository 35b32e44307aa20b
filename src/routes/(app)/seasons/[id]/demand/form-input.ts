// Turns the demand page's posted forms into the shapes the shared schemas take, and maps the
// errors back to the inputs that caused them.
import type { FieldErrors } from '$lib/schemas/common';

export function text(form: FormData): Record<string, string> {
	const out: Record<string, string> = {};
	for (const [k, v] of form.entries()) if (typeof v === 'string' && k !== 'pickupDays') out[k] = v;
	return out;
}

/** A share size form: pickup days are checkboxes, so there may be several values. */
export function shareFields(form: FormData): Record<string, unknown> {
	const { name = '', members = '', firstWeek = '', lastWeek = '', price = '' } = text(form);
	return { name, members, firstWeek, lastWeek, price, pickupDays: form.getAll('pickupDays').map(String) };
}

/**
 * The grid form: inputs `q.<cropId>.<week>` for each shown cell with `u.<cropId>` the row's unit
 * and `was.<cropId>.<week>` what the cell held when the page was drawn,
 * and the add-a-crop row `newCrop` with `n.<week>` inputs. Returns the cells for the schema and,
 * per cell index, the input name to hang an error on.
 */
export function gridFields(
	form: FormData,
	unitOf: Map<number, string>
): { body: { grid: string; cells: Record<string, unknown>[] }; names: string[] } {
	const values = text(form);
	const cells: Record<string, unknown>[] = [];
	const names: string[] = [];
	for (const [k, v] of Object.entries(values)) {
		const m = /^q\.(\d+)\.(\d{4}-W\d{2})$/.exec(k);
		if (!m) continue;
		const was = values[`was.${m[1]}.${m[2]}`];
		cells.push({
			crop: m[1],
			week: m[2],
			quantity: v,
			unit: values[`u.${m[1]}`] ?? '',
			...(was === undefined ? {} : { was })
		});
		names.push(k);
	}
	const newCrop = Number(values.newCrop);
	if (newCrop > 0) {
		for (const [k, v] of Object.entries(values)) {
			const m = /^n\.(\d{4}-W\d{2})$/.exec(k);
			if (!m || v.trim() === '') continue;
			cells.push({ crop: newCrop, week: m[1], quantity: v, unit: unitOf.get(newCrop) ?? '' });
			names.push(k);
		}
	}
	return { body: { grid: values.grid ?? '', cells }, names };
}

/** `cells.3.quantity` → the name of the input behind cell 3; other keys stay as they are. */
export function cellErrorsToInputs(errors: FieldErrors, names: string[]): FieldErrors {
	const out: FieldErrors = {};
	for (const [k, v] of Object.entries(errors)) {
		const m = /^cells\.(\d+)\./.exec(k);
		out[m ? (names[Number(m[1])] ?? k) : k] ??= v;
	}
	return out;
}
