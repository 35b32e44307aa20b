// What a Plantings sheet would change in a season that already holds plantings. Rows are
// matched by the export's "Planting id" column: a row with a known id is that planting (changed
// field by field, or unchanged), a row without one is a new planting, and a planting of the
// season that no row names is removed. Rows that repeat another row exactly are flagged and
// left out. New and changed plantings go through the grid's derivation (deriveRow), so tray
// sowing, harvest dates, expected yield and seeds needed follow the edited figures.
import type { ImportIssue, PlantingRow } from '$lib/schemas/import';
import { deriveRow, type GridFarm } from '$lib/plantings/derive';
import type { VarietyView } from '$lib/types';
import { headerIn, plantingsSheet } from '../export/layout';
import { formatNumber, formatQuantity, type UnitSystem } from '$lib/format';
import { toFileValue } from '$lib/format/file-units';
import {
	fieldSpec,
	figuresOf,
	fileFieldNames,
	pick,
	plantingFigureNames,
	plantingFigureTable,
	type FileField,
	type PlantingFigures,
	type PlantingValues
} from '$lib/plantings/fields';
import { columnLabel } from '../export/planting-columns';
import type { ValidRow } from './validate';

/** A planting as the file wants it: the names it refers to, its fields and its figures. */
export type WantedPlanting = Pick<PlantingValues, FileField> &
	PlantingFigures & { varietyKey: string; crop: string; variety: string; bed: string | null };

/** A planting of the season as the diff compares it. */
export type ExistingPlanting = WantedPlanting & { id: number; version: number; harvests: number };

export interface FieldChange {
	field: string;
	label: string;
	from: string;
	to: string;
	/** Worked out again from the edited figures rather than read from the file. */
	derived: boolean;
}

export interface SeasonDiff {
	added: { row: number; planting: WantedPlanting }[];
	changed: { row: number; id: number; planting: WantedPlanting; changes: FieldChange[] }[];
	removed: ExistingPlanting[];
	unchanged: number;
	duplicates: { row: number; of: number }[];
	/** id:version of every planting of the season when the diff was made, to spot a stale preview. */
	fingerprint: string;
}

export const varietyKey = (crop: string, variety: string): string =>
	`${crop.trim().toLowerCase()}\u0000${variety.trim().toLowerCase()}`;

/** Fields compared, in the Plantings sheet's order, with the labels the preview shows. */
const inputs: readonly (readonly [string, string])[] = [
	['variety', 'Crop · variety'],
	['bed', 'Bed'],
	...fileFieldNames.map((f) => [f, columnLabel(fieldSpec(f).file!.header)] as const)
];
const derivedFields = plantingFigureNames.map((f) => [f, columnLabel(plantingFigureTable[f].file.header)] as const);

/** A field's value as the preview shows it, measured figures in the farm's units (15.24 for 50 ft, "56.7 kg"). */
function shown(p: WantedPlanting, field: string, system: UnitSystem, unit: string | undefined): string {
	if (field === 'variety') return `${p.crop} · ${p.variety}`;
	const v = (p as unknown as Record<string, unknown>)[field];
	if (v === null || v === undefined || v === '') return '—';
	if (typeof v !== 'number') return String(v);
	if (field === 'expectedYield' && unit) return formatQuantity(v, unit, system, 2);
	const measure = plantingsSheet.columns.find((c) => c.key === field)?.units?.measure;
	const n = measure && measure !== 'harvest' ? Number(toFileValue(measure, v, system)) : v;
	return formatNumber(n, 2);
}

function same(a: unknown, b: unknown): boolean {
	if (typeof a === 'number' && typeof b === 'number') return Math.abs(a - b) < 1e-6;
	if (typeof a === 'string' && typeof b === 'string') return a.trim().toLowerCase() === b.trim().toLowerCase();
	return (a ?? null) === (b ?? null);
}

function valueOf(p: WantedPlanting, field: string): unknown {
	return field === 'variety' ? varietyKey(p.crop, p.variety) : (p as unknown as Record<string, unknown>)[field];
}

/** The row's values as the file gives them, before derivation. */
function fromRow(d: PlantingRow): WantedPlanting {
	return {
		varietyKey: varietyKey(d.crop, d.variety),
		crop: d.crop,
		variety: d.variety,
		bed: d.bed,
		...pick(d, fileFieldNames),
		traySowDate: d.traySowDate,
		// Blank in a new row: worked out by derive() before anything is compared or written.
		firstHarvest: d.firstHarvest ?? d.fieldDate,
		lastHarvest: d.lastHarvest ?? d.firstHarvest ?? d.fieldDate,
		expectedYield: d.expectedYield,
		seedsNeeded: d.seedsNeeded
	};
}

/** A compared field's label as the farm's files head it ("Length (m)" on a metric farm). */
function labelIn(field: string, label: string, system: UnitSystem): string {
	const c = plantingsSheet.columns.find((col) => col.key === field);
	return c?.units ? headerIn(c, system) : label;
}

/** Every cell of a row in one string: two rows with the same string are exact copies. */
const rowText = (d: PlantingRow): string =>
	JSON.stringify(Object.entries(d).map(([k, v]) => [k, typeof v === 'string' ? v.trim().toLowerCase() : v]));

export function diffSeason(
	rows: ValidRow<PlantingRow>[],
	existing: ExistingPlanting[],
	varieties: Map<string, VarietyView>,
	farm: GridFarm,
	issues: ImportIssue[],
	letters: Record<string, string>,
	system: UnitSystem = 'imperial'
): SeasonDiff {
	const at = (row: number, field: string | null, message: string): void => {
		const header = field ? (plantingsSheet.columns.find((c) => c.key === field)?.header ?? null) : null;
		issues.push({ sheet: plantingsSheet.name, row, column: field ? (letters[field] ?? null) : null, header, message });
	};
	const show = (p: WantedPlanting, field: string): string =>
		shown(p, field, system, varieties.get(p.varietyKey)?.harvestUnit);
	const byId = new Map(existing.map((p) => [p.id, p]));
	const seenText = new Map<string, number>();
	const seenId = new Map<number, number>();
	const diff: SeasonDiff = {
		added: [],
		changed: [],
		removed: [],
		unchanged: 0,
		duplicates: [],
		fingerprint: existing
			.map((p) => `${p.id}:${p.version}`)
			.sort()
			.join(',')
	};
	const derive = (w: WantedPlanting, row: number): WantedPlanting | null => {
		const v = varieties.get(w.varietyKey);
		if (!v) {
			at(row, 'variety', `No variety "${w.variety}" of crop "${w.crop}".`);
			return null;
		}
		const d = deriveRow(w, v, farm);
		if (!d.ok) {
			const field = d.field === 'bedFeet' ? 'lengthFt' : d.field in w ? d.field : null;
			at(row, field, d.message);
			return null;
		}
		return { ...w, ...figuresOf(d.value) };
	};
	for (const { row, data } of rows) {
		const text = rowText(data);
		const copyOf = seenText.get(text);
		if (copyOf !== undefined) {
			diff.duplicates.push({ row, of: copyOf });
			continue;
		}
		seenText.set(text, row);
		const wanted = fromRow(data);
		if (data.id === null) {
			const d = derive(wanted, row);
			if (d) diff.added.push({ row, planting: d });
			continue;
		}
		const twin = seenId.get(data.id);
		if (twin !== undefined) {
			at(
				row,
				'id',
				`Planting id ${data.id} is also on row ${twin} with other figures; keep one of the two rows, or clear the id of a new planting.`
			);
			continue;
		}
		seenId.set(data.id, row);
		const cur = byId.get(data.id);
		if (!cur) {
			at(row, 'id', `No planting with id ${data.id} in this season; clear the cell to add the row as a new planting.`);
			continue;
		}
		const changes: FieldChange[] = [];
		for (const [field, label] of inputs) {
			if (!same(valueOf(wanted, field), valueOf(cur, field)))
				changes.push({
					field,
					label: labelIn(field, label, system),
					from: show(cur, field),
					to: show(wanted, field),
					derived: false
				});
		}
		if (!changes.length) {
			diff.unchanged++;
			continue;
		}
		const d = derive(wanted, row);
		if (!d) continue;
		for (const [field, label] of derivedFields) {
			if (!same(valueOf(d, field), valueOf(cur, field)))
				changes.push({ field, label, from: show(cur, field), to: show(d, field), derived: true });
		}
		diff.changed.push({ row, id: cur.id, planting: d, changes });
	}
	for (const p of existing) {
		if (seenId.has(p.id)) continue;
		if (p.harvests > 0) {
			issues.push({
				sheet: plantingsSheet.name,
				row: null,
				column: null,
				header: null,
				message: `The file leaves out planting id ${p.id} (${p.crop} · ${p.variety}, field date ${p.fieldDate}), which has ${p.harvests} harvest record(s) logged and cannot be removed; put its row back.`
			});
		} else diff.removed.push(p);
	}
	return diff;
}
