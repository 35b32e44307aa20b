// Every entry of the planting field table reaches each place built from it: the cell and API
// schemas, the crew lead's editable list, the database mapping, the grid's values and columns,
// a new row's defaults and next season's copy. A new field that passes here needs no other file.
import { describe, expect, it } from 'vitest';
import {
	fieldSpec,
	fromColumns,
	initialValue,
	nextSeasonColumns,
	plantingFieldNames,
	recordFields,
	toColumns
} from '$lib/plantings/fields';
import {
	checkCell,
	editableFields,
	plantingCreateSchema,
	plantingFields,
	plantingPatchSchema
} from '$lib/schemas/planting';
import { columns } from '$lib/components/grid/columns';
import { valuesOf } from '$lib/components/grid/rows';
import { defaultValues } from '$lib/components/grid/grid-state.svelte';
import type { PlantingView } from '$lib/types';
import { plantingColumns } from '$lib/server/export/planting-columns';
import { plantingRowSchema } from '$lib/schemas/import';

// A stored row as MariaDB answers it (DECIMAL columns as strings), written by hand.
const stored: Record<string, unknown> = {
	variety_id: 7,
	bed_id: 3,
	start_ft: '12.50',
	length_ft: '40.00',
	rows: 3,
	in_row_spacing_in: '2.00',
	seeds_per_spot: 1,
	method: 'transplant',
	field_date: '2027-05-10',
	status: 'harvesting',
	actual_tray_sow_date: '2027-04-02',
	actual_field_date: '2027-05-11',
	actual_first_harvest: '2027-06-20',
	actual_last_harvest: null,
	notes: 'north end wet'
};

describe('the planting field table', () => {
	it('names a distinct database column for every field, and every column the hand-written row holds', () => {
		const cols = plantingFieldNames.map((f) => fieldSpec(f).column);
		expect(new Set(cols).size).toBe(cols.length);
		expect([...cols].sort()).toEqual(Object.keys(stored).sort());
	});

	it('reads a stored row into values (decimals as numbers) and writes the same columns back', () => {
		const values = fromColumns(stored);
		expect(values).toMatchObject({
			varietyId: 7,
			startFt: 12.5,
			lengthFt: 40,
			inRowSpacingIn: 2,
			status: 'harvesting',
			actualLastHarvest: null
		});
		expect(toColumns(values)).toEqual({ ...stored, start_ft: 12.5, length_ft: 40, in_row_spacing_in: 2 });
	});

	it('gives every field a cell schema, a PATCH key and, with no initial value, a required POST key', () => {
		for (const f of plantingFieldNames) {
			expect(plantingFields[f]).toBe(fieldSpec(f).schema);
			expect(plantingPatchSchema.safeParse({ version: 1, [f]: fromColumns(stored)[f] }).success).toBe(true);
		}
		const missing = plantingCreateSchema.safeParse({});
		const required = plantingFieldNames.filter((f) => fieldSpec(f).initial === undefined);
		expect(required).toEqual(['varietyId', 'lengthFt', 'fieldDate']);
		const named = missing.success ? [] : missing.error.issues.map((i) => String(i.path[0]));
		expect(named.sort()).toEqual([...required].sort());
		expect(checkCell('lengthFt', '0').ok).toBe(false);
	});

	it("lets the crew lead edit exactly the 'record' fields", () => {
		expect(recordFields).toEqual(plantingFieldNames.filter((f) => fieldSpec(f).edit === 'record'));
		expect(editableFields('crew_lead')).toEqual(recordFields);
	});

	it('gives every field a grid column that edits it, and the grid row its value', () => {
		for (const f of plantingFieldNames) expect(columns.some((c) => c.field === f)).toBe(true);
		const view = { ...fromColumns(stored), id: 1 } as unknown as PlantingView;
		expect(valuesOf(view)).toEqual(fromColumns(stored));
		const plain = plantingFieldNames.filter((f) => fieldSpec(f).grid);
		for (const f of plain) expect(columns.find((c) => c.id === fieldSpec(f).grid!.id)?.field).toBe(f);
	});

	it("starts a new grid row from each field's initial value", () => {
		const row = defaultValues(undefined);
		for (const f of plantingFieldNames)
			if (!['varietyId', 'lengthFt', 'fieldDate'].includes(f)) expect(row[f]).toEqual(initialValue(f, undefined));
	});

	it("copies 'keep' fields to next season, clears 'clear' ones and leaves 'moved' ones to the copy", () => {
		const next = nextSeasonColumns(stored);
		for (const f of plantingFieldNames) {
			const { column, nextSeason } = fieldSpec(f);
			if (nextSeason === 'keep') expect(next[column]).toEqual(fromColumns(stored)[f]);
			else if (nextSeason === 'clear') expect(next[column]).toEqual(initialValue(f, undefined));
			else expect(column in next).toBe(false);
		}
		expect(next).toMatchObject({ status: 'planned', actual_tray_sow_date: null, length_ft: 40, method: 'transplant' });
	});

	it('gives every field with a file column a Plantings sheet column, and the import a cell of it', () => {
		const keys = plantingColumns.map((c) => c.key);
		for (const f of plantingFieldNames) {
			const file = fieldSpec(f).file;
			if (!file) continue;
			expect(plantingColumns.find((c) => c.key === f)?.header).toBe(file.header);
			expect(Object.keys(plantingRowSchema.shape)).toContain(f);
		}
		// Only the references are written as names: the variety as crop and variety, the bed by its name.
		expect(plantingFieldNames.filter((f) => !fieldSpec(f).file)).toEqual(['varietyId', 'bedId']);
		expect(keys.slice(0, 4)).toEqual(['crop', 'variety', 'block', 'bed']);
		expect(keys.at(-1)).toBe('id');
	});
});
