// Writes a checked import in one transaction: crops, varieties, blocks and beds matched by
// name (created when new, updated to the file's figures when they exist), then the season and
// its plantings. Plantings go only into a season that has none yet: an import never merges a
// second copy of a plan into one that is already there.
import type { Knex } from 'knex';
import type { ImportIssue } from '$lib/schemas/import';
import { db } from '../db';
import { lockSeason } from '../seasons';
import { insertPlantings } from '../planting-query';
import { seasonDateProblem } from '$lib/schemas/common';
import type { ImportPlan } from './validate';
import {
	figureColumns,
	fileFieldNames,
	pick,
	plantingFigureNames,
	toColumns,
	type FileField,
	type PlantingFigures,
	type PlantingValues
} from '$lib/plantings/fields';
import { plantingsSheet } from '../export/layout';
import { columnLabel } from '../export/planting-columns';

export interface ImportSummary {
	seasonId: number | null;
	seasonCreated: boolean;
	crops: number;
	varieties: number;
	blocks: number;
	beds: number;
	plantings: number;
}

/** Refuses the whole import (the transaction rolls back) with issues to show. */
export class ImportRefused extends Error {
	constructor(
		public issues: ImportIssue[],
		public status: 400 | 404 = 400
	) {
		super(issues.map((i) => i.message).join(' '));
	}
}

const lower = (s: string): string => s.trim().toLowerCase();

async function idsByName(trx: Knex.Transaction, table: string, farmId: number): Promise<Map<string, number>> {
	const rows: { id: number; name: string }[] = await trx(table)
		.where({ farm_id: farmId })
		.forUpdate()
		.select('id', 'name');
	return new Map(rows.map((r) => [lower(r.name), r.id]));
}

/** A checked row of the Plantings sheet (fields and figures) as the plantings table's columns. */
export function plantingColumnsOf(
	p: Pick<PlantingValues, FileField> & { [K in keyof PlantingFigures]: PlantingFigures[K] | null },
	varietyId: number,
	bedId: number | null
): Record<string, unknown> {
	const values = { ...pick(p, fileFieldNames), varietyId, bedId } as PlantingValues;
	// The figures are worked out before anything is written (season-update.ts deriveNewPlantings).
	return { ...toColumns(values), ...figureColumns(pick(p, plantingFigureNames) as PlantingFigures) };
}

/** Updates the farm's row that `ids` holds under `key`, or inserts it and keeps its new id there. */
async function upsert(
	trx: Knex.Transaction,
	table: 'crops' | 'varieties' | 'beds',
	farmId: number,
	ids: Map<string, number>,
	key: string,
	row: Record<string, unknown>
): Promise<void> {
	const id = ids.get(key);
	if (id) await trx(table).where({ id, farm_id: farmId }).update(row);
	else ids.set(key, (await trx(table).insert({ farm_id: farmId, ...row }))[0]);
}

export async function writeLibrary(
	trx: Knex.Transaction,
	farmId: number,
	plan: ImportPlan
): Promise<{ crops: Map<string, number>; varieties: Map<string, number> }> {
	const crops = await idsByName(trx, 'crops', farmId);
	for (const { data: c } of plan.crops) {
		const row = {
			name: c.crop,
			family: c.family,
			harvest_unit: c.harvestUnit,
			frost_tolerance: c.frostTolerance,
			heat_limit_f: c.heatLimitF,
			base_temp_f: c.baseTempF,
			// A file without the field-date columns leaves the crop's as they are.
			...(c.sowFrom === undefined ? {} : { sow_from: c.sowFrom, sow_to: c.sowTo ?? null })
		};
		await upsert(trx, 'crops', farmId, crops, lower(c.crop), row);
	}
	const existing: { id: number; name: string; crop_id: number }[] = await trx('varieties')
		.where({ farm_id: farmId })
		.forUpdate()
		.select('id', 'name', 'crop_id');
	const varieties = new Map(existing.map((v) => [`${v.crop_id}\u0000${lower(v.name)}`, v.id]));
	for (const { data: v } of plan.varieties) {
		const cropId = crops.get(lower(v.crop))!;
		const row = {
			crop_id: cropId,
			name: v.variety,
			method: v.method,
			days_to_maturity: v.daysToMaturity,
			days_in_tray: v.daysInTray,
			harvest_window_days: v.harvestWindowDays,
			yield_per_bed_foot: v.yieldPerBedFoot,
			rows_per_bed: v.rows,
			in_row_spacing_in: v.inRowSpacingIn,
			seeds_per_spot: v.seedsPerSpot,
			germination_rate: v.germinationRate,
			seeds_per_gram: v.seedsPerGram,
			seed_price_cents_per_gram: v.seedPrice,
			seeds_per_packet: v.seedsPerPacket,
			cells_per_tray: v.cellsPerTray,
			margin: v.margin,
			gdd_to_maturity: v.gddToMaturity
		};
		await upsert(trx, 'varieties', farmId, varieties, `${cropId}\u0000${lower(v.variety)}`, row);
	}
	return { crops, varieties };
}

export async function writeBeds(
	trx: Knex.Transaction,
	farmId: number,
	plan: ImportPlan
): Promise<{ beds: Map<string, number>; blocks: number }> {
	const blocks = await idsByName(trx, 'blocks', farmId);
	let newBlocks = 0;
	for (const { data: b } of plan.beds) {
		const id = blocks.get(lower(b.block));
		if (id) {
			if (b.blockPosition !== null)
				await trx('blocks').where({ id, farm_id: farmId }).update({ position: b.blockPosition });
			continue;
		}
		const position = b.blockPosition ?? blocks.size + 1;
		blocks.set(lower(b.block), (await trx('blocks').insert({ farm_id: farmId, name: b.block, position }))[0]);
		newBlocks++;
	}
	const beds = await idsByName(trx, 'beds', farmId);
	for (const { data: b } of plan.beds) {
		const row = {
			block_id: blocks.get(lower(b.block))!,
			name: b.bed,
			length_ft: b.lengthFt,
			width_in: b.widthIn,
			position: b.position
		};
		await upsert(trx, 'beds', farmId, beds, lower(b.bed), row);
	}
	return { beds, blocks: newBlocks };
}

/** The season that receives the plantings: the one named, or the file's year (created if new). */
async function targetSeason(
	trx: Knex.Transaction,
	farmId: number,
	plan: ImportPlan,
	seasonId: number | undefined
): Promise<{ id: number; created: boolean }> {
	let id = seasonId;
	let created = false;
	if (id !== undefined && !(await lockSeason(trx, farmId, id))) {
		// Checked here too, whatever the caller did: a season of another farm never takes rows.
		throw new ImportRefused(
			[{ sheet: 'upload', row: null, column: null, header: 'seasonId', message: 'No such season on this farm.' }],
			404
		);
	}
	if (id === undefined) {
		const s = plan.season!;
		const found = await trx('seasons').where({ farm_id: farmId, year: s.year }).forUpdate().first('id');
		if (found) {
			id = found.id as number;
			await lockSeason(trx, farmId, id);
		} else {
			id = (
				await trx('seasons').insert({
					farm_id: farmId,
					year: s.year,
					name: s.name,
					starts_on: s.startsOn,
					ends_on: s.endsOn
				})
			)[0];
			created = true;
		}
	}
	const n = Number(
		(await trx('plantings').where({ farm_id: farmId, season_id: id }).count({ n: '*' }).first())?.n ?? 0
	);
	if (n > 0) {
		throw new ImportRefused([
			{
				sheet: plan.season && seasonId === undefined ? 'Season' : 'Plantings',
				row: plan.season && seasonId === undefined ? plan.season.row : null,
				column: plan.season && seasonId === undefined ? 'B' : null,
				header: plan.season && seasonId === undefined ? 'Value' : null,
				message: `That season already holds ${n} plantings; plantings are imported only into a season without any (start a new season, or import into an empty farm).`
			}
		]);
	}
	return { id: id!, created };
}

export async function writeImport(
	farmId: number,
	userId: string,
	plan: ImportPlan,
	seasonId: number | undefined
): Promise<ImportSummary> {
	return db().transaction(async (trx) => {
		// The receiving season is locked before the library rows, in the order every writer of plantings
		// takes its locks (season first): a plan apply or a harvest logged meanwhile waits, or is waited for.
		const season = plan.plantings.length ? await targetSeason(trx, farmId, plan, seasonId) : null;
		const library = await writeLibrary(trx, farmId, plan);
		const bedsOut = await writeBeds(trx, farmId, plan);
		const summary: ImportSummary = {
			seasonId: seasonId ?? null,
			seasonCreated: false,
			crops: plan.crops.length,
			varieties: plan.varieties.length,
			blocks: bedsOut.blocks,
			beds: plan.beds.length,
			plantings: 0
		};
		if (!season) return summary;
		// Every planting date within the receiving season's year ± 1, as in the grid and the API.
		const year = Number((await trx('seasons').where({ id: season.id }).first('year')).year);
		const dateIssues: ImportIssue[] = [];
		// Every date column the sheet reads (fields and figures alike), by its header.
		const dateColumns = plantingsSheet.columns.filter((c) => c.kind === 'date' && !c.derived);
		for (const { row, data: p } of plan.plantings) {
			const cells = p as unknown as Record<string, unknown>;
			for (const c of dateColumns) {
				const v = cells[c.key];
				const header = columnLabel(c.header);
				const problem = typeof v === 'string' ? seasonDateProblem(header, v, year) : null;
				if (problem) dateIssues.push({ sheet: 'Plantings', row, column: null, header, message: problem });
			}
		}
		if (dateIssues.length) throw new ImportRefused(dateIssues);
		summary.seasonId = season.id;
		summary.seasonCreated = season.created;
		const rows = plan.plantings.map(({ data: p }) => {
			const cropId = library.crops.get(lower(p.crop));
			const varietyId = cropId === undefined ? undefined : library.varieties.get(`${cropId}\u0000${lower(p.variety)}`);
			return {
				...plantingColumnsOf(p, varietyId!, p.bed === null ? null : bedsOut.beds.get(lower(p.bed))!),
				farm_id: farmId,
				season_id: season.id,
				updated_by: userId
			};
		});
		await insertPlantings(trx, rows);
		summary.plantings = rows.length;
		return summary;
	});
}
