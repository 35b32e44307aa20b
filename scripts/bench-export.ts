/**
 * Workbook export benchmark: the season workbook of an invented bench farm with 5,000
 * plantings, downloaded from the running app (queries, engine figures, streaming, HTTP),
 * beside writing the very same rows with bare exceljs (no queries, no styles). Prints the
 * medians `export.xlsx_ms`, `export.bare_ms` and their `export.ratio` (goal: at most 1.5).
 *
 * Assumes what scripts/bench.sh sets up: FC_BASE_URL of an app on the test database and the
 * FC_DB_* settings. The bench farm is created here and removed again afterwards.
 */
import ExcelJS from 'exceljs';
import { Writable } from 'node:stream';
import { pathToFileURL } from 'node:url';
import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { testDb, closeTestDb } from '../tests/helpers/db';
import { signedIn } from '../tests/helpers/http';
import { hashPassword } from '../src/lib/server/password';

const PLANTINGS = 5_000;
const RUNS = 7;
export const PASSWORD = 'bench-export-password';

const median = (xs: number[]): number => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

export interface BenchFarm {
	farmId: number;
	userId: string;
	email: string;
	seasonId: number;
}

/** An invented farm: 4 blocks × 25 beds of 100 ft, 20 crops × 2 varieties, 5,000 plantings of 20 ft. */
export async function createBenchFarm(db: Knex): Promise<BenchFarm> {
	const userId = randomUUID();
	const email = `bench-export-${Date.now().toString(36)}@bench.furrowcast.test`;
	const passwordHash = await hashPassword(PASSWORD);
	return db.transaction(async (trx) => {
		const [farmId] = await trx('farms').insert({
			name: 'Benchmark Acres (invented)',
			latitude: 42.5,
			last_spring_frost: '2031-05-10',
			first_fall_frost: '2031-10-05'
		});
		await trx('users').insert({ id: userId, email, name: 'Bench owner (invented)', password_hash: passwordHash });
		await trx('farm_members').insert({ farm_id: farmId, user_id: userId, role: 'owner' });
		const bedIds: number[] = [];
		for (let b = 0; b < 4; b++) {
			const [blockId] = await trx('blocks').insert({ farm_id: farmId, name: `Block ${b + 1}`, position: b + 1 });
			for (let i = 0; i < 25; i++) {
				const [bedId] = await trx('beds').insert({
					farm_id: farmId,
					block_id: blockId,
					name: `B${b + 1}-${String(i + 1).padStart(2, '0')}`,
					length_ft: 100,
					width_in: 30,
					position: i + 1
				});
				bedIds.push(bedId);
			}
		}
		const varieties: { id: number; method: 'direct' | 'transplant'; window: number; cropId: number }[] = [];
		for (let c = 0; c < 20; c++) {
			const [cropId] = await trx('crops').insert({
				farm_id: farmId,
				name: `Bench crop ${c + 1}`,
				family: `Family ${(c % 8) + 1}`,
				harvest_unit: 'lb',
				frost_tolerance: c % 3 ? 'hardy' : 'tender',
				base_temp_f: 40
			});
			for (let v = 0; v < 2; v++) {
				const method = v === 0 ? 'direct' : 'transplant';
				const window = 7 + ((c + v) % 4) * 7;
				const [id] = await trx('varieties').insert({
					farm_id: farmId,
					crop_id: cropId,
					name: `Bench variety ${c + 1}${v ? 'T' : 'D'}`,
					method,
					days_to_maturity: 40 + c,
					days_in_tray: method === 'transplant' ? 28 : 0,
					harvest_window_days: window,
					yield_per_bed_foot: 1.5,
					rows_per_bed: 3,
					in_row_spacing_in: method === 'transplant' ? 12 : 2,
					seeds_per_spot: 1,
					germination_rate: 0.85,
					seeds_per_gram: 300,
					seed_price_cents_per_gram: 40,
					seeds_per_packet: 1000,
					cells_per_tray: 128,
					margin: 0.1
				});
				varieties.push({ id, method, window, cropId });
			}
		}
		const [seasonId] = await trx('seasons').insert({
			farm_id: farmId,
			year: 2031,
			name: 'Bench season 2031',
			starts_on: '2031-01-01',
			ends_on: '2031-12-31'
		});
		const day = (n: number): string => new Date(Date.UTC(2031, 2, 1) + n * 86_400_000).toISOString().slice(0, 10);
		const rows = Array.from({ length: PLANTINGS }, (_, i) => {
			const v = varieties[i % varieties.length];
			const field = (i * 7) % 150;
			const first = field + 50;
			return {
				farm_id: farmId,
				season_id: seasonId,
				variety_id: v.id,
				bed_id: bedIds[i % bedIds.length],
				start_ft: (Math.floor(i / bedIds.length) % 5) * 20,
				length_ft: 20,
				rows: 3,
				in_row_spacing_in: v.method === 'transplant' ? 12 : 2,
				seeds_per_spot: 1,
				method: v.method,
				tray_sow_date: v.method === 'transplant' ? day(field - 28) : null,
				field_date: day(field),
				first_harvest: day(first),
				last_harvest: day(first + v.window - 1),
				expected_yield: 30,
				seeds_needed: 400,
				status: 'planned'
			};
		});
		for (let i = 0; i < rows.length; i += 500) await trx('plantings').insert(rows.slice(i, i + 500));
		await trx('channel_demand').insert(
			varieties
				.filter((_, i) => i % 2 === 0)
				.map((v, i) => ({
					farm_id: farmId,
					season_id: seasonId,
					channel: 'market',
					crop_id: v.cropId,
					week: `2031-W${String(20 + (i % 20)).padStart(2, '0')}`,
					quantity: 40
				}))
		);
		return { farmId, userId, email, seasonId };
	});
}

export async function removeBenchFarm(db: Knex, f: BenchFarm): Promise<void> {
	await db.transaction(async (trx) => {
		// Plantings first: varieties refuse to go while a planting points at them.
		for (const table of [
			'channel_demand',
			'plantings',
			'seasons',
			'varieties',
			'crops',
			'beds',
			'blocks',
			'farm_members'
		])
			await trx(table).where({ farm_id: f.farmId }).delete();
		await trx('user_sessions').where({ user_id: f.userId }).delete();
		await trx('users').where({ id: f.userId }).delete();
		await trx('farms').where({ id: f.farmId }).delete();
	});
}

/** Every sheet's rows (header included) as plain arrays, read back from an export. */
async function sheetsOf(bytes: ArrayBuffer): Promise<{ name: string; rows: ExcelJS.CellValue[][] }[]> {
	const wb = new ExcelJS.Workbook();
	await wb.xlsx.load(bytes);
	return wb.worksheets.map((ws) => {
		const rows: ExcelJS.CellValue[][] = [];
		ws.eachRow((row) => rows.push((row.values as ExcelJS.CellValue[]).slice(1)));
		return { name: ws.name, rows };
	});
}

/** The same rows with bare exceljs: streaming writer, no styles, no widths, into a byte counter. */
async function writeBare(sheets: { name: string; rows: ExcelJS.CellValue[][] }[]): Promise<number> {
	let bytes = 0;
	const sink = new Writable({
		write(chunk: Buffer, _enc, done) {
			bytes += chunk.length;
			done();
		}
	});
	const wb = new ExcelJS.stream.xlsx.WorkbookWriter({ stream: sink, useStyles: false, useSharedStrings: false });
	for (const s of sheets) {
		const ws = wb.addWorksheet(s.name);
		for (const r of s.rows) ws.addRow(r).commit();
		ws.commit();
	}
	await wb.commit();
	return bytes;
}

export async function runExportBench(): Promise<Record<string, number>> {
	const db = testDb();
	const farm = await createBenchFarm(db);
	try {
		const client = await signedIn(farm.email, PASSWORD);
		const path = `/api/seasons/${farm.seasonId}/export`;
		const fetchOnce = async (): Promise<ArrayBuffer> => {
			const res = await client.get(path, { headers: { accept: '*/*' } });
			if (res.status !== 200) throw new Error(`export answered ${res.status}`);
			return res.arrayBuffer();
		};
		const sample = await fetchOnce(); // warm-up, and the rows for the bare run
		const sheets = await sheetsOf(sample);
		await writeBare(sheets);
		const xlsx: number[] = [];
		const bare: number[] = [];
		for (let i = 0; i < RUNS; i++) {
			let t = performance.now();
			await fetchOnce();
			xlsx.push(performance.now() - t);
			t = performance.now();
			await writeBare(sheets);
			bare.push(performance.now() - t);
		}
		const x = median(xlsx);
		const b = median(bare);
		return {
			'export.xlsx_ms': Math.round(x),
			'export.bare_ms': Math.round(b),
			'export.ratio': Math.round((x / b) * 100) / 100
		};
	} finally {
		await removeBenchFarm(db, farm);
	}
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
	runExportBench()
		.then((r) => {
			for (const [k, v] of Object.entries(r)) console.log(`${k}: ${v}`);
		})
		.finally(closeTestDb);
}
