// Checks every row of an upload against its zod schema and the rows against each other
// (a planting's variety and bed must exist in the file or on the farm), collecting every
// issue rather than stopping at the first, so one round of fixes is enough.
import type { z } from 'zod';
import {
	bedRowSchema,
	cropRowSchema,
	plantingRowSchema,
	seasonRowsSchema,
	varietyRowSchema,
	type BedRow,
	type CropRow,
	type ImportIssue,
	type PlantingRow,
	type SeasonRows,
	type VarietyRow
} from '$lib/schemas/import';
import { formatNumber } from '$lib/format';
import { toFileValue } from '$lib/format/file-units';
import { headerIn, seasonFields, type ColumnSpec, type SheetSpec } from '../export/layout';
import type { RawRow, RawSheet, Sheets } from './read';

export interface ValidRow<T> {
	row: number;
	data: T;
}

export interface ImportPlan {
	season: (SeasonRows & { row: number }) | null;
	crops: ValidRow<CropRow>[];
	varieties: ValidRow<VarietyRow & { crop: string }>[];
	beds: ValidRow<BedRow>[];
	plantings: ValidRow<PlantingRow>[];
	/** Variety and bed names the file lists, valid or not: a planting naming a row that failed
	 * its own checks is not reported a second time as naming something unknown. */
	named: { varieties: Set<string>; beds: Set<string> };
}

/** What the farm already holds, by name, so a file may refer to it without repeating it. */
export interface FarmLibrary {
	/** 'crop\u0000variety' (lower case) of every existing variety. */
	varieties: Set<string>;
	/** Lower-case bed names. */
	beds: Set<string>;
}

const key = (...parts: string[]): string => parts.map((p) => p.trim().toLowerCase()).join('\u0000');

class Issues {
	list: ImportIssue[] = [];
	constructor(private sheet: RawSheet) {}
	at(row: number, field: string | null, message: string): void {
		const spec: SheetSpec = this.sheet.spec;
		const column = field ? spec.columns.find((c) => c.key === field) : undefined;
		const system = field ? this.sheet.systems[field] : undefined;
		this.list.push({
			sheet: spec.name,
			row,
			column: field ? (this.sheet.letters[field] ?? null) : null,
			// Named as the file names it, with a bound in the file's units ("Length (m) … at least 0.15").
			header: column ? headerIn(column, system ?? 'imperial') : null,
			message: column && system ? boundsIn(column, system, message) : message
		});
	}
}

/** A row check's "must be at least 0.5" (stored units) in the units the file's header names. */
function boundsIn(c: ColumnSpec, system: 'imperial' | 'metric', message: string): string {
	const m = c.units?.measure;
	if (!m || m === 'harvestUnit' || m === 'harvest' || m === 'harvestPerLength') return message;
	return message.replace(/(must be at (?:least|most)) (-?\d+(?:\.\d+)?)/, (_all, words: string, n: string) => {
		const v = toFileValue(m, Number(n), system);
		return typeof v === 'number' && v !== Number(n) ? `${words} ${formatNumber(v, 2)}` : `${words} ${n}`;
	});
}

/** Parses one row; every failing cell becomes an issue at its column. */
function parseRow<S extends z.ZodType>(schema: S, r: RawRow, issues: Issues): z.infer<S> | null {
	const out = schema.safeParse(r.cells);
	if (out.success) return out.data;
	const seen = new Set<string>();
	for (const issue of out.error.issues) {
		const field = String(issue.path[0] ?? '');
		if (seen.has(field)) continue;
		seen.add(field);
		issues.at(r.row, field || null, issue.message);
	}
	return null;
}

function checkSeason(sheet: RawSheet, issues: ImportIssue[]): (SeasonRows & { row: number }) | null {
	const is = new Issues(sheet);
	const byLabel = new Map(
		sheet.rows.map((r) => [
			String(r.cells.field ?? '')
				.trim()
				.toLowerCase(),
			r
		])
	);
	const wanted = {
		name: seasonFields.name,
		year: seasonFields.year,
		startsOn: seasonFields.startsOn,
		endsOn: seasonFields.endsOn
	};
	const values: Record<string, unknown> = {};
	const rowOf: Record<string, number> = {};
	for (const [k, label] of Object.entries(wanted)) {
		const r = byLabel.get(label.toLowerCase());
		if (!r) is.at(1, null, `The row "${label}" is missing.`);
		else {
			values[k] = r.cells.value;
			rowOf[k] = r.row;
		}
	}
	const out = seasonRowsSchema.safeParse(values);
	if (!out.success) {
		for (const i of out.error.issues) if (rowOf[String(i.path[0])]) is.at(rowOf[String(i.path[0])], 'value', i.message);
	} else if (out.data.endsOn < out.data.startsOn) is.at(rowOf.endsOn, 'value', 'Ends on is before Starts on.');
	issues.push(...is.list);
	return out.success && !is.list.length ? { ...out.data, row: rowOf.year } : null;
}

function checkCrops(sheet: RawSheet, plan: ImportPlan, issues: ImportIssue[]): void {
	const is = new Issues(sheet);
	const crops = new Map<string, ValidRow<CropRow>>();
	const varieties = new Set<string>();
	const cropFields = [
		'family',
		'harvestUnit',
		'frostTolerance',
		'heatLimitF',
		'baseTempF',
		'sowFrom',
		'sowTo'
	] as const;
	for (const r of sheet.rows) {
		plan.named.varieties.add(key(String(r.cells.crop ?? ''), String(r.cells.variety ?? '')));
		const crop = parseRow(cropRowSchema, r, is);
		const hasVariety = !(
			r.cells.variety === null ||
			r.cells.variety === undefined ||
			String(r.cells.variety).trim() === ''
		);
		const variety = hasVariety ? parseRow(varietyRowSchema, r, is) : null;
		if (!crop) continue;
		// Field dates come as a pair (the crop form's rule): both or neither.
		if (((crop.sowFrom ?? null) === null) !== ((crop.sowTo ?? null) === null))
			is.at(r.row, crop.sowTo ? 'sowFrom' : 'sowTo', 'Give both field dates (earliest and latest) or neither.');
		// A crop's own figures repeat on each of its variety rows: they must agree.
		const first = crops.get(key(crop.crop));
		if (!first) {
			crops.set(key(crop.crop), { row: r.row, data: crop });
			plan.crops.push({ row: r.row, data: crop });
		} else {
			for (const f of cropFields)
				if (first.data[f] !== crop[f])
					is.at(r.row, f, `Differs from row ${first.row} for the same crop "${crop.crop}".`);
		}
		if (!variety) continue;
		const vk = key(crop.crop, variety.variety);
		if (varieties.has(vk)) is.at(r.row, 'variety', `"${crop.crop} · ${variety.variety}" appears twice.`);
		varieties.add(vk);
		if (variety.method === 'direct' && variety.daysInTray > 0)
			is.at(r.row, 'daysInTray', 'A direct-sown variety spends no days in a tray; leave it 0 or blank.');
		plan.varieties.push({ row: r.row, data: { ...variety, crop: crop.crop } });
	}
	issues.push(...is.list);
}

function checkBeds(sheet: RawSheet, plan: ImportPlan, issues: ImportIssue[]): void {
	const is = new Issues(sheet);
	const names = new Map<string, number>();
	const blockOrder = new Map<string, { row: number; position: number | null }>();
	for (const r of sheet.rows) {
		const name = String(r.cells.bed ?? '').trim();
		plan.named.beds.add(key(name));
		const seen = name ? names.get(key(name)) : undefined;
		if (seen) is.at(r.row, 'bed', `The bed "${name}" is already on row ${seen}.`);
		else if (name) names.set(key(name), r.row);
		const bed = parseRow(bedRowSchema, r, is);
		if (!bed) continue;
		const order = blockOrder.get(key(bed.block));
		if (!order) blockOrder.set(key(bed.block), { row: r.row, position: bed.blockPosition });
		else if (bed.blockPosition !== null && order.position !== null && order.position !== bed.blockPosition) {
			is.at(r.row, 'blockPosition', `Differs from row ${order.row} for the same block "${bed.block}".`);
		}
		plan.beds.push({ row: r.row, data: bed });
	}
	issues.push(...is.list);
}

function checkPlantings(sheet: RawSheet, plan: ImportPlan, library: FarmLibrary, issues: ImportIssue[]): void {
	const is = new Issues(sheet);
	const varieties = new Set([...library.varieties, ...plan.named.varieties]);
	const beds = new Set([...library.beds, ...plan.named.beds]);
	for (const r of sheet.rows) {
		const p = parseRow(plantingRowSchema, r, is);
		if (!p) continue;
		if (!varieties.has(key(p.crop, p.variety)))
			is.at(r.row, 'variety', `No variety "${p.variety}" of crop "${p.crop}" in the file or on this farm.`);
		if (p.bed !== null && !beds.has(key(p.bed))) is.at(r.row, 'bed', `No bed "${p.bed}" in the file or on this farm.`);
		plan.plantings.push({ row: r.row, data: p });
	}
	issues.push(...is.list);
}

export type Checked = { ok: true; plan: ImportPlan } | { ok: false; issues: ImportIssue[] };

/** Every row checked; the plan is returned only when nothing at all is wrong. */
export function checkImport(sheets: Sheets, library: FarmLibrary, needsSeasonSheet: boolean): Checked {
	const issues: ImportIssue[] = [];
	const plan: ImportPlan = {
		season: null,
		crops: [],
		varieties: [],
		beds: [],
		plantings: [],
		named: { varieties: new Set(), beds: new Set() }
	};
	if (sheets.season) plan.season = checkSeason(sheets.season, issues);
	if (sheets.crops) checkCrops(sheets.crops, plan, issues);
	if (sheets.beds) checkBeds(sheets.beds, plan, issues);
	if (sheets.plantings) {
		checkPlantings(sheets.plantings, plan, library, issues);
		if (needsSeasonSheet && !sheets.season && plan.plantings.length) {
			issues.push({
				sheet: 'Season',
				row: null,
				column: null,
				header: null,
				message: 'Plantings need a season: add the "Season" sheet, or import from the season\'s Export & import page.'
			});
		}
	}
	return issues.length ? { ok: false, issues } : { ok: true, plan };
}
