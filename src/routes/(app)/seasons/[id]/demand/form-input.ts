// Turns the demand page's posted forms into the shapes the shared schemas take, and maps the
// errors back to the inputs that caused them.
import type { FieldErrors } from '$lib/schemas/common';
import { storedQuantity, typedQuantity, type UnitSystem } from '$lib/format';

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
	unitOf: Map<number, string>,
	system: UnitSystem = 'imperial'
): { body: { grid: string; cells: Record<string, unknown>[] }; names: string[] } {
	const values = text(form);
	// Typed in the farm's unit (kg on a metric farm). A cell left as drawn keeps its stored figure
	// exactly; a changed one is converted. Text that is not a plain number goes on for the schema to name.
	const stored = (typed: string, unit: string, was: string | undefined): string => {
		if (system === 'imperial' || unit !== 'lb' || typed.trim() === '') return typed;
		if (was !== undefined && was !== '' && typed.trim() === typedQuantity(Number(was), unit, system)) return was;
		const n = Number(typed.trim().replace(',', '.'));
		return Number.isFinite(n) ? String(storedQuantity(n, unit, system)) : typed;
	};
	const cells: Record<string, unknown>[] = [];
	const names: string[] = [];
	for (const [k, v] of Object.entries(values)) {
		const m = /^q\.(\d+)\.(\d{4}-W\d{2})$/.exec(k);
		if (!m) continue;
		const was = values[`was.${m[1]}.${m[2]}`];
		cells.push({
			crop: m[1],
			week: m[2],
			quantity: stored(v, values[`u.${m[1]}`] ?? '', was),
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
			const unit = unitOf.get(newCrop) ?? '';
			cells.push({ crop: newCrop, week: m[1], quantity: stored(v, unit, undefined), unit });
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
