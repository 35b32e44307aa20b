/**
 * Workbook import benchmark, on the invented 5,000-planting bench farm of bench-export.ts:
 * - `import.xlsx_5000_ms`: the season's own export, edited (50 lengths changed, 10 rows gone),
 *   uploaded into the season (preview) and applied (one transaction), as the owner does it.
 *   Median of RUNS, each on a fresh export.
 * - `import.peak_rss_mb`: how far the app server's resident memory rises above its idle level
 *   while it previews the same export after LibreOffice Calc opened it, deleted a row and saved
 *   it as .xlsx (the file declares a million rows). Goal: under 300 MB. Read from /proc.
 *
 * Assumes what scripts/bench.sh sets up (FC_BASE_URL, FC_DB_*, FC_PID_DIR, FC_PORT).
 */
import ExcelJS from 'exceljs';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { testDb, closeTestDb } from '../tests/helpers/db';
import { signedIn, type Client } from '../tests/helpers/http';
import { baseUrl } from '../tests/helpers/env';
import { createBenchFarm, removeBenchFarm, PASSWORD } from './bench-export';

const RUNS = 3;
const median = (xs: number[]): number => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

async function upload(
	client: Client,
	name: string,
	bytes: Uint8Array,
	seasonId: number
): Promise<{ token: string; changed: number }> {
	const form = new FormData();
	form.set('file', new Blob([new Uint8Array(bytes)]), name);
	form.set('seasonId', String(seasonId));
	const res = await client.request('/api/import', {
		method: 'POST',
		body: form,
		headers: { origin: baseUrl(), accept: 'application/json' }
	});
	const body = await res.json();
	if (res.status !== 200) throw new Error(`import answered ${res.status}: ${JSON.stringify(body).slice(0, 400)}`);
	return { token: body.preview.token, changed: body.preview.changed.length };
}

async function apply(client: Client, token: string): Promise<void> {
	const res = await client.json('/api/import/apply', 'POST', { token });
	if (res.status !== 200) throw new Error(`apply answered ${res.status}: ${(await res.text()).slice(0, 400)}`);
}

async function exported(client: Client, seasonId: number): Promise<Buffer> {
	const res = await client.get(`/api/seasons/${seasonId}/export`, { headers: { accept: '*/*' } });
	if (res.status !== 200) throw new Error(`export answered ${res.status}`);
	return Buffer.from(await res.arrayBuffer());
}

/** The export as a grower edits it: some lengths changed, some rows deleted. */
async function edited(bytes: Buffer, run: number): Promise<Buffer> {
	const wb = new ExcelJS.Workbook();
	await wb.xlsx.load(bytes as unknown as ArrayBuffer);
	const ws = wb.getWorksheet('Plantings')!;
	const col = (ws.getRow(1).values as unknown[]).indexOf('Length (ft)');
	for (let i = 0; i < 50; i++) ws.getRow(2 + i * 90 + run).getCell(col).value = 15 + run;
	for (let i = 0; i < 10; i++) ws.spliceRows(3 + i * 400 + run, 1);
	return Buffer.from(await wb.xlsx.writeBuffer());
}

function rssMb(pid: number): number {
	const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
	return m ? Number(m[1]) / 1024 : 0;
}

export async function runImportBench(): Promise<Record<string, number>> {
	const db = testDb();
	const farm = await createBenchFarm(db);
	try {
		const client = await signedIn(farm.email, PASSWORD);
		const times: number[] = [];
		for (let run = 0; run < RUNS; run++) {
			const file = await edited(await exported(client, farm.seasonId), run);
			const t = performance.now();
			const preview = await upload(client, 'edited.xlsx', file, farm.seasonId);
			await apply(client, preview.token);
			times.push(performance.now() - t);
		}
		// The LibreOffice-saved file: one soffice start, its own profile.
		const dir = mkdtempSync(join(tmpdir(), 'fc-bench-import-'));
		writeFileSync(join(dir, 'export.xlsx'), await exported(client, farm.seasonId));
		const jobs = [
			{
				open: join(dir, 'export.xlsx'),
				ops: [{ deleteRow: { sheet: 'Plantings', row: 5 } }],
				save: [{ path: join(dir, 'lo.xlsx'), as: 'xlsx' }]
			}
		];
		writeFileSync(join(dir, 'jobs.json'), JSON.stringify(jobs));
		execFileSync(
			'/usr/bin/python3',
			[resolve('tests/helpers/lo_batch.py'), mkdtempSync(join(tmpdir(), 'fc-lo-profile-')), join(dir, 'jobs.json')],
			{ timeout: 180_000 }
		);
		const lo = readFileSync(join(dir, 'lo.xlsx'));
		const pid = Number(
			readFileSync(join(process.env.FC_PID_DIR ?? '.data/run', `app-${process.env.FC_PORT}.pid`), 'utf8').trim()
		);
		global.gc?.();
		await new Promise((r) => setTimeout(r, 1000));
		const idle = rssMb(pid);
		let peak = idle;
		const timer = setInterval(() => (peak = Math.max(peak, rssMb(pid))), 10);
		try {
			await upload(client, 'lo.xlsx', lo, farm.seasonId);
		} finally {
			clearInterval(timer);
		}
		peak = Math.max(peak, rssMb(pid));
		return { 'import.xlsx_5000_ms': Math.round(median(times)), 'import.peak_rss_mb': Math.round(peak - idle) };
	} finally {
		await removeBenchFarm(db, farm);
	}
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
	runImportBench()
		.then((r) => {
			for (const [k, v] of Object.entries(r)) console.log(`${k}: ${v}`);
		})
		.finally(closeTestDb);
}
