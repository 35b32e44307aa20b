// Adding a planting field touches the migration, the field table and tests only. Here a new field,
// an irrigation line number, is added exactly so: a migration (fixtures/planting-field-migration.ts)
// and one entry in the field table (added below, before any module reads the table), and nothing
// else. It must then reach every place built from the table: the API's schemas and the repository,
// the grid's column and its JSON answer, the season workbook's export, both imports (into an
// empty season and as an update of the same season), and next season's copy. A path that listed
// the fields by hand or by position would miss it, and this test would fail there.
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import ExcelJS from 'exceljs';
import { z } from 'zod';
import { numberField } from '../../src/lib/schemas/common';
import { closeTestDb, testDb } from '../helpers/db';
import { addSeason, harvestFarm, type HarvestFarm } from './harvest-fixture';
import * as migration from './fixtures/planting-field-migration';

// The app's modules run in this process and reach the test database with the app's own account.
vi.mock('$env/dynamic/private', () => ({ env: process.env }));

// The one entry a contributor writes (DEVELOPERS.md, "How to add a planting field").
vi.mock('$lib/plantings/table', async (importOriginal) => {
	const t = await importOriginal<typeof import('../../src/lib/plantings/table')>();
	const irrigationLine = {
		column: 'irrigation_line',
		schema: z.preprocess(
			(v) => (v === '' ? null : v),
			numberField('Irrigation line', 1, 999, { int: true }).nullable()
		),
		kind: 'int',
		edit: 'plan',
		nextSeason: 'keep',
		initial: null,
		grid: { id: 'irrigationLine', label: 'Line', width: 64 },
		file: { header: 'Irrigation line', width: 14 }
	};
	return { ...t, plantingFieldTable: { ...t.plantingFieldTable, irrigationLine } };
});

const plantings = await import('../../src/lib/server/plantings');
const { seasonPlantingsJson } = await import('../../src/lib/server/plantings-json');
const { plantingBatchSchema } = await import('../../src/lib/schemas/planting');
const { columns } = await import('../../src/lib/components/grid/columns');
const { valuesOf } = await import('../../src/lib/components/grid/rows');
const { exportSeason } = await import('../../src/lib/server/export');
const { importUpload } = await import('../../src/lib/server/import');
const { applySeasonUpdate } = await import('../../src/lib/server/import/season-update');
const { copySeason } = await import('../../src/lib/server/season-copy');
const seasons = await import('../../src/lib/server/seasons');
const { closeDb } = await import('../../src/lib/server/db');

type Loose = Record<string, unknown>;
const line = (p: object): unknown => (p as Loose).irrigationLine;

let own: HarvestFarm;
let seasonId: number;
let ids: number[];
let workbook: Buffer;

async function season(farmId: number, id: number) {
	const s = await seasons.get(farmId, id);
	if (!s) throw new Error(`no season ${id}`);
	return s;
}

async function exported(farmId: number, id: number): Promise<Buffer> {
	const out = await exportSeason(farmId, await season(farmId, id));
	return Buffer.from(await new Response(out.body).arrayBuffer());
}

/** The Plantings sheet's irrigation line per planting id, and the header row. */
async function sheetLines(file: Buffer): Promise<{ headers: string[]; byId: Map<number, unknown> }> {
	const wb = new ExcelJS.Workbook();
	await wb.xlsx.load(file as unknown as ArrayBuffer);
	const ws = wb.getWorksheet('Plantings')!;
	const headers = (ws.getRow(1).values as unknown[]).slice(1).map(String);
	const lineCol = headers.indexOf('Irrigation line') + 1;
	const idCol = headers.indexOf('Planting id') + 1;
	const byId = new Map<number, unknown>();
	for (let r = 2; r <= ws.rowCount; r++)
		byId.set(Number(ws.getRow(r).getCell(idCol).value), ws.getRow(r).getCell(lineCol).value ?? null);
	return { headers, byId };
}

async function storedLines(farmId: number, id: number): Promise<(number | null)[]> {
	const rows = await testDb()('plantings').where({ farm_id: farmId, season_id: id }).orderBy('field_date');
	return rows.map((r: Loose) => (r.irrigation_line === null ? null : Number(r.irrigation_line)));
}

beforeAll(async () => {
	await migration.up(testDb());
	own = await harvestFarm('new-field');
	seasonId = await addSeason(own.farmId, 2026);
});

afterAll(async () => {
	await closeDb();
	await migration.down(testDb());
	await closeTestDb();
});

describe('a planting field added through the field table alone', () => {
	it('is taken by the API schema, stored by the repository and answered in the grid JSON', async () => {
		const body = plantingBatchSchema.parse({
			plantings: [
				{
					varietyId: own.carrot.varietyId,
					bedId: own.bedIds[0],
					lengthFt: 20,
					fieldDate: '2026-06-01',
					irrigationLine: 7
				},
				{ varietyId: own.carrot.varietyId, bedId: own.bedIds[1], lengthFt: 30, fieldDate: '2026-06-15' }
			]
		});
		const made = await plantings.create(own.farmId, seasonId, own.userId, body.plantings);
		expect(made.ok).toBe(true);
		if (!made.ok) return;
		ids = made.plantings.map((p) => p.id);
		expect(made.plantings.map(line)).toEqual([7, null]);
		expect(await storedLines(own.farmId, seasonId)).toEqual([7, null]);
		// A bad value is refused with the field's own message, as every cell is.
		expect(plantingBatchSchema.safeParse({ plantings: [{ ...body.plantings[0], irrigationLine: 0 }] }).success).toBe(
			false
		);
		const json = JSON.parse(await seasonPlantingsJson(own.farmId, seasonId)) as Loose[];
		expect(json.map(line)).toEqual([7, null]);
	});

	it('gets a grid column that edits it, and the grid row its value; the owner may edit it, the crew lead not', async () => {
		const col = columns.find((c) => c.field === ('irrigationLine' as never));
		expect(col).toMatchObject({ id: 'irrigationLine', label: 'Line', width: 64 });
		const view = (await plantings.listForSeason(own.farmId, seasonId))[1];
		expect(line(valuesOf(view))).toBe(null);
		const crew = await plantings.update(own.farmId, view.id, { id: own.userId, role: 'crew_lead' }, {
			version: view.version,
			irrigationLine: 3
		} as never);
		expect(crew.kind).toBe('forbidden');
		const owner = await plantings.update(own.farmId, view.id, { id: own.userId, role: 'owner' }, {
			version: view.version,
			irrigationLine: 12
		} as never);
		expect(owner.kind).toBe('ok');
		expect(await storedLines(own.farmId, seasonId)).toEqual([7, 12]);
	});

	it('is a column of the exported Plantings sheet, keyed by planting', async () => {
		workbook = await exported(own.farmId, seasonId);
		const { headers, byId } = await sheetLines(workbook);
		// Placed after the table's last field, before the planting's id; the other headers stay as they were.
		expect(headers.slice(-3)).toEqual(['Notes', 'Irrigation line', 'Planting id']);
		expect(byId).toEqual(
			new Map([
				[ids[0], 7],
				[ids[1], 12]
			])
		);
	});

	it('comes back through an import that updates the same season: previewed, then written', async () => {
		const wb = new ExcelJS.Workbook();
		await wb.xlsx.load(workbook as unknown as ArrayBuffer);
		const ws = wb.getWorksheet('Plantings')!;
		const headers = (ws.getRow(1).values as unknown[]).slice(1).map(String);
		ws.getRow(2).getCell(headers.indexOf('Irrigation line') + 1).value = 9;
		const edited = Buffer.from(await wb.xlsx.writeBuffer());
		const file = new File([edited], 'season.xlsx');
		const out = await importUpload(own.farmId, own.userId, file, { seasonId });
		expect(out.ok && 'preview' in out).toBe(true);
		if (!out.ok || !('preview' in out)) return;
		expect(out.preview.changed).toHaveLength(1);
		expect(out.preview.changed[0].changes).toEqual([
			expect.objectContaining({ field: 'irrigationLine', label: 'Irrigation line', from: '7', to: '9', derived: false })
		]);
		const applied = await applySeasonUpdate(own.farmId, own.userId, out.preview.token);
		expect(applied).toMatchObject({ ok: true, changed: 1, added: 0, removed: 0 });
		expect(await storedLines(own.farmId, seasonId)).toEqual([9, 12]);
	});

	it('comes back through an import into another farm (a new season), and a blank cell imports as the initial value', async () => {
		const file = await exported(own.farmId, seasonId);
		const wb = new ExcelJS.Workbook();
		await wb.xlsx.load(file as unknown as ArrayBuffer);
		const ws = wb.getWorksheet('Plantings')!;
		const headers = (ws.getRow(1).values as unknown[]).slice(1).map(String);
		ws.getRow(3).getCell(headers.indexOf('Irrigation line') + 1).value = null;
		const other = await harvestFarm('new-field-other');
		const out = await importUpload(
			other.farmId,
			other.userId,
			new File([Buffer.from(await wb.xlsx.writeBuffer())], 'a.xlsx'),
			{}
		);
		expect(out).toMatchObject({ ok: true, summary: { plantings: 2, seasonCreated: true } });
		if (!out.ok || !('summary' in out)) return;
		expect(await storedLines(other.farmId, out.summary.seasonId!)).toEqual([9, null]);
	});

	it("is copied to next season ('keep')", async () => {
		const copy = await copySeason(own.farmId, await season(own.farmId, seasonId), own.userId);
		expect(copy.ok).toBe(true);
		if (!copy.ok) return;
		expect(copy.report.plantings).toBe(2);
		expect(await storedLines(own.farmId, copy.report.season.id)).toEqual([9, 12]);
	});
});
