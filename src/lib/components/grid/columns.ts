// The grid's columns: what each shows, how it is typed or pasted, and which field it edits.
import { formatWeekDate } from '$lib/planning';
import { checkCell, plantingStatuses, type CellCheck, type PlantingField } from '$lib/schemas/planting';
import { readDateText } from '$lib/schemas/date-text';
import { fieldSpec, plantingFieldNames } from '$lib/plantings/fields';
import type { GridRow } from './rows';
import type { GridBed, GridVariety } from '$lib/plantings/derive';
import {
	bedLengthWord,
	fromDisplayFeet,
	fromDisplayInches,
	lengthUnit,
	seedWeightDigits,
	seedWeightUnit,
	spacingUnit,
	toDisplayFeet,
	toDisplayInches,
	toDisplayQuantity,
	toDisplaySeedWeight,
	unitLabel,
	type UnitSystem
} from '$lib/format';

export type ColumnKind = 'text' | 'number' | 'date' | 'select';

export interface Lookups {
	varieties: GridVariety[];
	varietyById: Map<number, GridVariety>;
	beds: GridBed[];
	bedById: Map<number, GridBed>;
	/** How pasted dates are read besides ISO (the browser's locale, e.g. 'en-US'). */
	locale?: string;
	/** The farm's units: lengths and spacing are shown, typed and pasted in them (feet when not given). */
	units?: UnitSystem;
}

export interface GridColumn {
	id: string;
	label: string;
	/** The field it edits; derived columns have none. */
	field?: PlantingField;
	/** The crop column edits the variety (a crop is chosen through one of its varieties). */
	kind: ColumnKind;
	width: number;
	numeric?: boolean;
	/** The canonical unit of a typed figure that converts ('ft', 'in'), if any. */
	unit?: string;
	/** Display text, with its unit. */
	show(row: GridRow, l: Lookups): string;
	/** The value to sort by. */
	sortValue(row: GridRow, l: Lookups): string | number;
	/** Text an editor starts from, and what a copy puts on the clipboard. */
	text?(row: GridRow, l: Lookups): string;
	/** Dropdown choices (label → value) for select columns. */
	options?(row: GridRow, l: Lookups): { label: string; value: string }[];
}

// One formatter, made once: toLocaleString builds a new one per call, too slow for hundreds of cells per edit.
const numberFormat = new Intl.NumberFormat('en-US', { maximumFractionDigits: 2 });
const n = (x: number): string => numberFormat.format(x);

// Counted units read in the singular for one ("1 seed", "1 row"); feet, inches and harvest units do not change.
const singular: Record<string, string> = { rows: 'row', seeds: 'seed', cells: 'cell', trays: 'tray', plants: 'plant' };
const counted = (x: number, unit: string): string => `${n(x)} ${x === 1 ? (singular[unit] ?? unit) : unit}`;
const wd = (d: string | null | undefined): string => (d ? formatWeekDate(d) : '');
export const bedLabel = (b: GridBed): string => `${b.blockName} · ${b.name}`;
/** The row's bed as "Block · bed"; undefined when not placed or the bed is gone. */
function bedName(r: GridRow, l: Lookups): string | undefined {
	const b = r.values.bedId === null ? undefined : l.bedById.get(r.values.bedId);
	return b && bedLabel(b);
}

function unitOf(row: GridRow, l: Lookups): string {
	return l.varietyById.get(row.values.varietyId)?.harvestUnit ?? '';
}

/** How a column's figure reads on this farm: lengths in metres and spacing in cm on a metric farm. */
function measured(unit: string, l: Lookups): { label: string; to: (x: number) => number; from: (x: number) => number } {
	const u = l.units ?? 'imperial';
	if (unit === 'ft')
		return { label: lengthUnit(u), to: (x) => toDisplayFeet(x, u), from: (x) => fromDisplayFeet(x, u) };
	if (unit === 'in')
		return { label: spacingUnit(u), to: (x) => toDisplayInches(x, u), from: (x) => fromDisplayInches(x, u) };
	return { label: unit, to: (x) => x, from: (x) => x };
}
const hundredths = (x: number): number => Math.round(x * 100) / 100;

/** A column's header on this farm ("Bed-feet" is "Bed-metres" on a metric farm). */
export function columnLabel(c: GridColumn, units: UnitSystem): string {
	return c.label === 'Bed-feet' ? bedLengthWord(units).replace(/^./, (x) => x.toUpperCase()) : c.label;
}

/** A harvest quantity in the farm's unit ("4.5 lb", "2.04 kg", "12 bunch"). */
const harvestFigure = (x: number, r: GridRow, l: Lookups): string => {
	const u = l.units ?? 'imperial';
	return counted(hundredths(toDisplayQuantity(x, unitOf(r, l), u)), unitLabel(unitOf(r, l), u, 1));
};

/** A column naming the row's variety or its crop; choosing in it sets the row's variety. */
function varietyColumn(
	id: string,
	label: string,
	width: number,
	name: (v: GridVariety) => string,
	options: GridColumn['options']
): GridColumn {
	const get = (r: GridRow, l: Lookups): string | undefined => {
		const v = l.varietyById.get(r.values.varietyId);
		return v ? name(v) : undefined;
	};
	return {
		id,
		label,
		field: 'varietyId',
		kind: 'select',
		width,
		show: (r, l) => get(r, l) ?? '?',
		sortValue: (r, l) => get(r, l) ?? '',
		text: (r, l) => get(r, l) ?? '',
		options
	};
}

// Choosing a crop picks its first variety; the variety column then narrows to that crop.
const cropChoices: GridColumn['options'] = (_r, l) => {
	const seen = new Map<string, number>();
	for (const v of l.varieties) if (!seen.has(v.crop)) seen.set(v.crop, v.id);
	return [...seen].map(([label, id]) => ({ label, value: String(id) }));
};
const varietyChoices: GridColumn['options'] = (r, l) => {
	const crop = l.varietyById.get(r.values.varietyId)?.crop;
	return l.varieties.filter((v) => v.crop === crop).map((v) => ({ label: v.name, value: String(v.id) }));
};

/** Fields the grid draws with a column of its own (names to ids, lists); the rest come from the field table. */
const ownColumns: Partial<Record<PlantingField, GridColumn[]>> = {
	varietyId: [
		varietyColumn('crop', 'Crop', 120, (v) => v.crop, cropChoices),
		varietyColumn('variety', 'Variety', 140, (v) => v.name, varietyChoices)
	],
	bedId: [
		{
			id: 'bed',
			label: 'Bed',
			field: 'bedId',
			kind: 'select',
			width: 130,
			show: (r, l) => (r.values.bedId === null ? 'not placed' : (bedName(r, l) ?? '?')),
			sortValue: (r, l) => (r.values.bedId === null ? '~' : (bedName(r, l) ?? '')),
			text: (r, l) => bedName(r, l) ?? '',
			options: (_r, l) => [
				{ label: 'not placed', value: '' },
				...l.beds.map((b) => ({ label: bedLabel(b), value: String(b.id) }))
			]
		}
	],
	method: [
		{
			id: 'method',
			label: 'Method',
			field: 'method',
			kind: 'select',
			width: 96,
			show: (r) => r.values.method,
			sortValue: (r) => r.values.method,
			text: (r) => r.values.method,
			options: () => [
				{ label: 'direct', value: 'direct' },
				{ label: 'transplant', value: 'transplant' }
			]
		}
	],
	fieldDate: [
		{
			id: 'fieldDate',
			label: 'Field date',
			field: 'fieldDate',
			kind: 'date',
			width: 140,
			show: (r) => wd(r.values.fieldDate),
			sortValue: (r) => r.values.fieldDate,
			text: (r) => r.values.fieldDate
		}
	]
};

const statusColumn: GridColumn = {
	id: 'status',
	label: 'Status',
	field: 'status',
	kind: 'select',
	width: 104,
	show: (r) => r.values.status,
	sortValue: (r) => plantingStatuses.indexOf(r.values.status),
	text: (r) => r.values.status,
	options: () => plantingStatuses.map((s) => ({ label: s, value: s }))
};

/** A field's plain column, from its field-table entry (grid id, label, width, unit and kind). */
function plainColumn(f: PlantingField): GridColumn[] {
	const g = fieldSpec(f).grid;
	if (!g) return [];
	const kind = fieldSpec(f).kind;
	if (kind === 'number' || kind === 'int') return [num(g.id, g.label, g.unit ?? '', g.width, f)];
	if (kind === 'date') return [dateCol(g.id, g.label, f, g.width)];
	const get = (r: GridRow): string => (r.values[f] as string | null) ?? '';
	return [{ id: g.id, label: g.label, field: f, kind: 'text', width: g.width, show: get, sortValue: get, text: get }];
}

const fieldColumns = (edit: 'plan' | 'record'): GridColumn[] =>
	plantingFieldNames
		.filter((f) => f !== 'status' && fieldSpec(f).edit === edit)
		.flatMap((f) => ownColumns[f] ?? plainColumn(f));

// The plan's fields, the status, the engine's figures, then the record of what happened.
export const columns: GridColumn[] = [
	...fieldColumns('plan'),
	statusColumn,
	derivedDate('traySow', 'Tray sowing', (r) => r.derived?.traySowDate ?? null),
	derivedDate('firstHarvest', 'First harvest', (r) => r.derived?.firstHarvest ?? null),
	derivedDate('lastHarvest', 'Last harvest', (r) => r.derived?.lastHarvest ?? null),
	derivedNum('weeklyYield', 'Weekly yield', (r) => r.derived?.weeklyYield, unitOf, 96, harvestFigure),
	derivedNum('totalYield', 'Total yield', (r) => r.derived?.expectedYield, unitOf, 96, harvestFigure),
	derivedNum(
		'seeds',
		'Seeds',
		(r) => r.derived?.seed.seeds,
		() => 'seeds',
		96
	),
	derivedNum(
		'grams',
		'Seed',
		(r) => r.derived?.seed.grams,
		() => 'g',
		80,
		(g, _r, l) => {
			const w = toDisplaySeedWeight(g, l.units ?? 'imperial');
			return `${Number(w.toFixed(seedWeightDigits(w)))} ${seedWeightUnit(l.units ?? 'imperial')}`;
		}
	),
	derivedNum(
		'cells',
		'Cells',
		(r) => (r.values.method === 'transplant' ? r.derived?.seed.cells : undefined),
		() => 'cells',
		84
	),
	derivedNum(
		'trays',
		'Trays',
		(r) => (r.values.method === 'transplant' ? r.derived?.seed.trays : undefined),
		() => 'trays',
		72
	),
	{
		id: 'warnings',
		label: 'Warnings',
		kind: 'text',
		width: 160,
		show: (r) => warningLabels(r).join(', '),
		sortValue: (r) => warningLabels(r).length,
		text: (r) => warningLabels(r).join(', ')
	},
	...fieldColumns('record')
];

const warningNames: Record<string, string> = {
	frost_before_last_spring: 'frost (spring)',
	frost_after_first_fall: 'frost (fall)',
	heat_in_harvest: 'heat',
	heat_in_growth: 'heat (growing)',
	outside_sowing_window: 'out of field dates',
	too_cold_to_sow: 'too cold to sow',
	overlap: 'overlap',
	past_bed_end: 'past bed end',
	unknown_bed: 'unknown bed',
	gdd_not_met: 'degree days short',
	gdd_data_missing: 'no temperatures'
};

/** Short names of a row's warnings (engine warnings and bed conflicts). */
export function warningLabels(r: GridRow): string[] {
	const codes = new Set<string>();
	for (const w of r.derived?.warnings ?? []) codes.add(w.code);
	for (const c of r.conflicts) codes.add(c.code);
	if (r.deriveError) codes.add('error');
	return [...codes].map((c) => warningNames[c] ?? c);
}

function num(id: string, label: string, unit: string, width: number, field: PlantingField): GridColumn {
	const get = (r: GridRow): number => r.values[field] as number;
	return {
		id,
		label,
		field,
		kind: 'number',
		width,
		numeric: true,
		unit,
		show: (r, l) => {
			const m = measured(unit, l);
			return counted(hundredths(m.to(get(r))), m.label);
		},
		sortValue: get,
		text: (r, l) => String(hundredths(measured(unit, l).to(get(r))))
	};
}

function derivedDate(id: string, label: string, get: (r: GridRow) => string | null): GridColumn {
	return {
		id,
		label,
		kind: 'date',
		width: 140,
		show: (r) => wd(get(r)),
		sortValue: (r) => get(r) ?? '',
		text: (r) => get(r) ?? ''
	};
}

function derivedNum(
	id: string,
	label: string,
	get: (r: GridRow) => number | undefined,
	unit: (r: GridRow, l: Lookups) => string,
	width: number,
	display?: (x: number, r: GridRow, l: Lookups) => string
): GridColumn {
	return {
		id,
		label,
		kind: 'number',
		width,
		numeric: true,
		show: (r, l) => (get(r) === undefined ? '' : display ? display(get(r)!, r, l) : counted(get(r)!, unit(r, l))),
		sortValue: (r) => get(r) ?? -1,
		text: (r) => (get(r) === undefined ? '' : String(get(r)))
	};
}

function dateCol(id: string, label: string, field: PlantingField, width: number): GridColumn {
	const get = (r: GridRow): string | null => r.values[field] as string | null;
	return {
		id,
		label,
		field,
		kind: 'date',
		width,
		show: (r) => wd(get(r)),
		sortValue: (r) => get(r) ?? '',
		text: (r) => get(r) ?? ''
	};
}

export const columnById = new Map(columns.map((c) => [c.id, c]));

/**
 * A typed or pasted text turned into the field's value: names of crops, varieties and beds
 * become ids; anything else goes through the field's own zod schema (shared with the server).
 */
export function readCell(col: GridColumn, text: string, row: GridRow, l: Lookups): CellCheck {
	if (!col.field) return { ok: false, message: `${col.label} is worked out, not typed.` };
	const t = text.trim();
	const low = t.toLowerCase();
	if (col.id === 'crop') {
		const cur = l.varietyById.get(row.values.varietyId);
		if (cur && cur.crop.toLowerCase() === low) return { ok: true, value: cur.id };
		const v = l.varieties.find((x) => x.crop.toLowerCase() === low);
		return v ? { ok: true, value: v.id } : { ok: false, message: `No crop named "${t}" in the crop library.` };
	}
	if (col.id === 'variety') {
		const crop = l.varietyById.get(row.values.varietyId)?.crop;
		const v =
			l.varieties.find((x) => x.name.toLowerCase() === low && x.crop === crop) ??
			l.varieties.find((x) => x.name.toLowerCase() === low);
		return v ? { ok: true, value: v.id } : { ok: false, message: `No variety named "${t}" in the crop library.` };
	}
	if (col.id === 'bed') {
		if (t === '' || low === 'not placed') return { ok: true, value: null };
		const b = l.beds.find((x) => bedLabel(x).toLowerCase() === low) ?? l.beds.find((x) => x.name.toLowerCase() === low);
		return b ? { ok: true, value: b.id } : { ok: false, message: `No bed named "${t}" on this farm.` };
	}
	// A date as ISO or as the locale writes it ("6/24/2028" in en-US); an order that could be read
	// two ways is read the locale's way and the note says which.
	if (col.kind === 'date' && t !== '' && !/^\d{4}-\d{2}-\d{2}$/.test(t)) {
		const d = readDateText(t, l.locale ?? 'en-US');
		if (!d.ok) return { ok: false, message: d.message };
		const out = checkCell(col.field, d.iso);
		return out.ok && d.note ? { ...out, note: d.note } : out;
	}
	// A pasted number may carry its unit ("25 ft", "7.6 m"): keep the figure, in the farm's units.
	const raw = col.kind === 'number' ? t.replace(/\s*(ft|in|m|cm|rows?|seeds?)$/i, '') : t;
	const typed = Number(raw.replace(',', '.'));
	if (col.unit && (l.units ?? 'imperial') === 'metric' && raw !== '' && Number.isFinite(typed)) {
		const stored = measured(col.unit, l).from(typed);
		return checkCell(col.field, String(Math.round(stored * 100) / 100));
	}
	return checkCell(col.field, raw);
}
