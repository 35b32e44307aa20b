/**
 * Load benchmark of the planting API against the running test app (autocannon), plus what a
 * grower on a slow rural link waits for. Invented bench farms, created here and removed again.
 *
 * - api.plantings.p95_ms / api.bare.p95_ms / api.plantings.p95_ratio / api.errors:
 *   GET /api/seasons/{id}/plantings for a season of 5,000 plantings, 20 connections, a fixed count
 *   of requests; beside it in the same run, the same JSON bytes from memory served by a bare
 *   node:http server in a child process of the bench (the floor: Node writing these bytes). The bare
 *   server is not a route of the app on purpose: nothing bench-only can then be reached in
 *   production, not even by a misset environment variable. The two are run in alternating rounds.
 * - api.multitenant.p95_ratio: GET plantings for one farm's season of 500 plantings, p95 with
 *   1,000 farms of 500 plantings each in the database ÷ p95 with that farm alone.
 * - api.patch.p95_ms / api.patch.errors / api.patch.conflicts: PATCH /api/plantings/{id} (a new
 *   bed length, so the server derives the row again) at 10 connections, each request a different
 *   planting on its current version; errors are anything but 200 and 409, 409s are counted apart.
 * - grid.transfer_kb: bytes over the wire (headers and compressed bodies, as Chromium counts them)
 *   for a first visit of the 5,000-row grid page with an empty cache: the page, its scripts,
 *   styles and fonts, and its JSON data.
 * - grid.first_paint_rural_ms: the grid's first painted rows (measured as grid.first_paint_ms is)
 *   under Chromium's network emulation: 4 Mbit/s down, 1 Mbit/s up, 100 ms round trip, with an
 *   empty browser cache (median of PAINT_RUNS). grid.first_paint_rural_after_write_ms: the same,
 *   each right after a write to the season, so the server builds its answer anew rather than
 *   sending the one it kept. grid.first_paint_rural_warm_ms: scripts, styles, fonts and the
 *   answer's ETag in the browser's cache from an earlier visit.
 */
import autocannon from 'autocannon';
import knex, { type Knex } from 'knex';
import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium } from 'playwright-core';
import { knexConfig } from '../knexfile';
import { chromiumFlags } from '../tests/helpers/browser';
import { Client } from '../tests/helpers/http';
import { confirmedSignUp } from '../tests/helpers/signup';
import { benchGround } from './bench-ground';

// 200 requests per target, in four alternating rounds: load from other programs on a shared
// machine then falls on both targets alike rather than on one.
const GET_REQUESTS = 50; // per target and round
const ROUNDS = 4;
const PATCH_REQUESTS = 500;
const TENANTS = 1000;
const TENANT_ROWS = 500;
const PAINT_RUNS = 3;

const started = Date.now();
const phase = (what: string) =>
	process.stderr.write(`[bench-api] ${what} at ${((Date.now() - started) / 1000).toFixed(1)} s\n`);
const round = (x: number, places = 2) => Math.round(x * 10 ** places) / 10 ** places;
function p95(xs: number[]): number {
	if (!xs.length) return NaN;
	const s = [...xs].sort((a, b) => a - b);
	return s[Math.min(s.length - 1, Math.ceil(0.95 * s.length) - 1)];
}

interface Load {
	times: number[];
	status: Map<number, number>;
	errors: number;
}

/** Runs autocannon and keeps every response's time and status (autocannon's own summary has no p95). */
function load(opts: autocannon.Options): Promise<Load> {
	return new Promise((resolve, reject) => {
		const out: Load = { times: [], status: new Map(), errors: 0 };
		const inst = autocannon({ timeout: 60, ...opts }, (err, result) => {
			if (err) return reject(err);
			out.errors += result.errors;
			resolve(out);
		});
		inst.on('response', (_client: unknown, statusCode: number, _bytes: number, ms: number) => {
			out.times.push(ms);
			out.status.set(statusCode, (out.status.get(statusCode) ?? 0) + 1);
		});
	});
}
const non2xx = (l: Load) => [...l.status].filter(([s]) => s < 200 || s > 299).reduce((n, [, c]) => n + c, 0);

interface BenchFarm {
	farmId: number;
	seasonId: number;
	cookie: string;
	email: string;
}

/** Signs a bench farm up like anyone, then writes its ground and `rows` plantings straight in. */
export async function benchFarm(db: Knex, base: string, tag: string, rows: number): Promise<BenchFarm> {
	const email = `bench-${tag}-${Date.now().toString(36)}@bench.furrowcast.test`;
	// Signed up as a person does: the form, then the link the confirmation mail carries.
	const client = new Client();
	const signup = await confirmedSignUp(client, {
		name: 'Bench Grower (invented)',
		email,
		password: 'Furrow-bench-7Qx-pl2',
		farmName: `Bench ${tag} (invented)`,
		latitude: '42',
		lastSpringFrost: '2027-05-10',
		firstFallFrost: '2027-10-05'
	});
	if (signup.status !== 303) throw new Error(`bench sign-up answered ${signup.status}`);
	const cookie = [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
	const user = await db('users').where({ email }).first('id');
	const farmId = (await db('farm_members').where({ user_id: user.id }).first('farm_id')).farm_id as number;
	const { seasonId, varietyId, bedIds } = await benchGround(db, farmId);
	const list = Array.from({ length: rows }, (_, i) => ({
		farm_id: farmId,
		season_id: seasonId,
		variety_id: varietyId,
		bed_id: bedIds[i % 100],
		start_ft: (Math.floor(i / 100) % 5) * 20,
		length_ft: 20,
		rows: 4,
		in_row_spacing_in: 1,
		seeds_per_spot: 1,
		method: 'direct',
		field_date: `2027-0${4 + (Math.floor(i / 500) % 5)}-${String(1 + (i % 28)).padStart(2, '0')}`,
		first_harvest: '2027-07-01',
		last_harvest: '2027-07-14',
		expected_yield: 30,
		seeds_needed: 1000
	}));
	for (let i = 0; i < list.length; i += 1000) await db('plantings').insert(list.slice(i, i + 1000));
	return { farmId, seasonId, cookie, email };
}

export async function removeFarm(db: Knex, f: BenchFarm): Promise<void> {
	await db('plantings').where({ farm_id: f.farmId }).delete();
	await db('farms').where({ id: f.farmId }).delete();
	await db('users').where({ email: f.email }).delete();
}

/**
 * 1,000 invented farms of 500 plantings each, written by the database itself (INSERT … SELECT over
 * MariaDB's built-in sequence tables), so half a million rows take seconds, not minutes.
 */
async function manyFarms(db: Knex, tag: string): Promise<void> {
	const name = `Bench tenant ${tag} (invented)`;
	await db.raw(
		`INSERT INTO farms (name, latitude, last_spring_frost, first_fall_frost) SELECT CONCAT(?, ' ', seq), 42, '2027-05-10', '2027-10-05' FROM seq_1_to_${TENANTS - 1}`,
		[name]
	);
	const like = `${name}%`;
	await db.raw(
		`INSERT INTO crops (farm_id, name, family, harvest_unit, frost_tolerance) SELECT id, 'Tenant carrot', 'Apiaceae', 'lb', 'hardy' FROM farms WHERE name LIKE ?`,
		[like]
	);
	await db.raw(
		`INSERT INTO varieties (farm_id, crop_id, name, method, days_to_maturity, harvest_window_days, yield_per_bed_foot, rows_per_bed, in_row_spacing_in, seeds_per_spot, germination_rate, seeds_per_gram)
		 SELECT c.farm_id, c.id, 'Tenant Orange', 'direct', 70, 14, 1.5, 4, 1, 1, 0.65, 776 FROM crops c JOIN farms f ON f.id = c.farm_id WHERE f.name LIKE ?`,
		[like]
	);
	// Ground like a small farm's: one block of 40 beds each (the grid's context lists them).
	await db.raw(
		`INSERT INTO blocks (farm_id, name, position) SELECT id, 'Tenant block', 1 FROM farms WHERE name LIKE ?`,
		[like]
	);
	await db.raw(
		`INSERT INTO beds (farm_id, block_id, name, length_ft, position)
		 SELECT k.farm_id, k.id, CONCAT('Bed ', q.seq), 100, q.seq FROM blocks k JOIN farms f ON f.id = k.farm_id JOIN seq_1_to_40 q WHERE f.name LIKE ?`,
		[like]
	);
	await db.raw(
		`INSERT INTO seasons (farm_id, year, name, starts_on, ends_on) SELECT id, 2027, 'Tenant 2027 (invented)', '2027-01-01', '2027-12-31' FROM farms WHERE name LIKE ?`,
		[like]
	);
	await db.raw(
		`INSERT INTO plantings (farm_id, season_id, variety_id, length_ft, \`rows\`, in_row_spacing_in, method, field_date, first_harvest, last_harvest, expected_yield, seeds_needed)
		 SELECT s.farm_id, s.id, v.id, 20, 4, 1, 'direct', '2027-04-01' + INTERVAL (q.seq MOD 120) DAY, '2027-07-01', '2027-07-14', 30, 1000
		 FROM seasons s JOIN farms f ON f.id = s.farm_id JOIN varieties v ON v.farm_id = s.farm_id JOIN seq_1_to_${TENANT_ROWS} q WHERE f.name LIKE ?`,
		[like]
	);
	await db.raw('ANALYZE TABLE plantings, farms, seasons, varieties, crops, blocks, beds');
}

/**
 * Waits (30 s at most) for InnoDB to write out the pages dirtied by the 500,000-row insert, so
 * the "among 1,000 farms" run measures the queries and their indexes, not the flush of that
 * insert competing for the same two cores.
 */
async function settle(db: Knex): Promise<void> {
	const dirty = async (): Promise<number> => {
		const [rows] = (await db.raw("SHOW GLOBAL STATUS LIKE 'Innodb_buffer_pool_pages_dirty'")) as [{ Value: string }[]];
		return Number(rows[0]?.Value ?? 0);
	};
	for (let waited = 0; waited < 30_000 && (await dirty()) > 200; waited += 500)
		await new Promise((r) => setTimeout(r, 500));
}

async function removeManyFarms(db: Knex, tag: string): Promise<void> {
	const ids = (await db('farms').where('name', 'like', `Bench tenant ${tag} (invented)%`).pluck('id')) as number[];
	for (let i = 0; i < ids.length; i += 100) {
		const part = ids.slice(i, i + 100);
		await db('plantings').whereIn('farm_id', part).delete();
		await db('beds').whereIn('farm_id', part).delete();
		await db('farms').whereIn('id', part).delete();
	}
}

/** The same bytes from memory, in a child process so the load generator does not slow it down. */
async function bareServer(body: Buffer): Promise<{ url: string; stop: () => void; dir: string }> {
	const dir = mkdtempSync(join(tmpdir(), 'fc-bench-bare-'));
	const file = join(dir, 'plantings.json');
	writeFileSync(file, body);
	const code = `const b = require('fs').readFileSync(${JSON.stringify(file)});
		const s = require('http').createServer((q, r) => { r.writeHead(200, { 'content-type': 'application/json', 'content-length': b.length }); r.end(b); });
		s.listen(0, '127.0.0.1', () => console.log(s.address().port));`;
	const child = spawn(process.execPath, ['-e', code], { stdio: ['ignore', 'pipe', 'inherit'] });
	const port = await new Promise<number>((resolve, reject) => {
		child.stdout!.once('data', (d) => resolve(Number(String(d).trim())));
		child.once('exit', () => reject(new Error('the bare server exited')));
	});
	return { url: `http://127.0.0.1:${port}/`, stop: () => child.kill(), dir };
}

async function getLoad(url: string, cookie: string | undefined, amount: number, connections = 20): Promise<Load> {
	return load({ url, connections, amount, headers: cookie ? { cookie } : {} });
}

export async function runApiBench(): Promise<Record<string, number>> {
	const base = process.env.FC_BASE_URL;
	if (!base) throw new Error('FC_BASE_URL is not set: run through scripts/bench.sh');
	const db = knex(knexConfig(process.env.FC_DB_NAME));
	const tag = Date.now().toString(36);
	const farms: BenchFarm[] = [];
	let bare: Awaited<ReturnType<typeof bareServer>> | undefined;
	let many = false;
	const out: Record<string, number> = {};
	try {
		// ---- Many farms: one farm's 500 plantings alone, then among 1,000 farms.
		const one = await benchFarm(db, base, `tenant-${tag}`, TENANT_ROWS);
		farms.push(one);
		const oneUrl = `${base}/api/seasons/${one.seasonId}/plantings`;
		const tenantRun = async () => {
			await getLoad(oneUrl, one.cookie, 40); // warm-up, not counted
			return getLoad(oneUrl, one.cookie, 300);
		};
		const alone = await tenantRun();
		phase('one farm measured');
		many = true;
		await manyFarms(db, tag);
		await settle(db);
		phase('1,000 farms written');
		const among = await tenantRun();
		phase('among 1,000 farms measured');
		out['api.multitenant.alone_p95_ms'] = round(p95(alone.times));
		out['api.multitenant.p95_ms'] = round(p95(among.times));
		out['api.multitenant.p95_ratio'] = round(p95(among.times) / p95(alone.times), 3);
		out['api.multitenant.errors'] = alone.errors + among.errors + non2xx(alone) + non2xx(among);

		// ---- 5,000 plantings: the API beside the same bytes from memory.
		const big = await benchFarm(db, base, `api-${tag}`, 5000);
		farms.push(big);
		const url = `${base}/api/seasons/${big.seasonId}/plantings`;
		const res = await fetch(url, { headers: { cookie: big.cookie } });
		const body = Buffer.from(await res.arrayBuffer());
		if (res.status !== 200) throw new Error(`the plantings API answered ${res.status}`);
		bare = await bareServer(body);
		phase('5,000-row farm ready');
		await getLoad(url, big.cookie, 20);
		await getLoad(bare.url, undefined, 20);
		const api: Load[] = [];
		const floor: Load[] = [];
		for (let r = 0; r < ROUNDS; r++) {
			api.push(await getLoad(url, big.cookie, GET_REQUESTS));
			floor.push(await getLoad(bare.url, undefined, GET_REQUESTS));
		}
		const apiTimes = api.flatMap((l) => l.times);
		phase('GET loads done');
		const bareTimes = floor.flatMap((l) => l.times);
		out['api.plantings.p95_ms'] = round(p95(apiTimes));
		out['api.bare.p95_ms'] = round(p95(bareTimes));
		out['api.plantings.p95_ratio'] = round(p95(apiTimes) / p95(bareTimes), 3);
		out['api.plantings.bytes'] = body.length;
		out['api.errors'] = api.reduce((n, l) => n + l.errors + non2xx(l), 0);

		// ---- Writes: each PATCH a different planting, on its current version.
		const rows = (
			JSON.parse(body.toString('utf8')).plantings as { id: number; version: number; lengthFt: number }[]
		).slice(0, PATCH_REQUESTS);
		let next = 0;
		const patch = await load({
			url: base,
			connections: 10,
			amount: rows.length,
			headers: { cookie: big.cookie, 'content-type': 'application/json' },
			requests: [
				{
					method: 'PATCH',
					setupRequest: (req) => {
						const p = rows[next++ % rows.length];
						return {
							...req,
							path: `/api/plantings/${p.id}`,
							body: JSON.stringify({ version: p.version, lengthFt: p.lengthFt === 25 ? 30 : 25 })
						};
					}
				}
			]
		});
		out['api.patch.p95_ms'] = round(p95(patch.times));
		phase('PATCH load done');
		out['api.patch.conflicts'] = patch.status.get(409) ?? 0;
		out['api.patch.errors'] =
			patch.errors + [...patch.status].filter(([s]) => s !== 200 && s !== 409).reduce((n, [, c]) => n + c, 0);

		// ---- The grid page on a rural link.
		Object.assign(out, await gridOverTheWire(base, big));
		return out;
	} finally {
		bare?.stop();
		if (bare) rmSync(bare.dir, { recursive: true, force: true });
		for (const f of farms) await removeFarm(db, f);
		if (many) await removeManyFarms(db, tag);
		await db.destroy();
	}
}

export async function gridOverTheWire(base: string, farm: BenchFarm): Promise<Record<string, number>> {
	const browser = await chromium.launch({
		executablePath: process.env.FC_CHROMIUM ?? '/usr/bin/chromium',
		headless: true,
		args: chromiumFlags
	});
	try {
		const context = await browser.newContext({ baseURL: base, viewport: { width: 1600, height: 1000 } });
		await context.addCookies(
			farm.cookie.split('; ').map((pair) => {
				const i = pair.indexOf('=');
				return { name: pair.slice(0, i), value: pair.slice(i + 1), url: base };
			})
		);
		const page = await context.newPage();
		const cdp = await context.newCDPSession(page);
		await cdp.send('Network.enable');
		let bytes = 0;
		cdp.on('Network.loadingFinished', (e) => (bytes += e.encodedDataLength));
		const gridUrl = `/seasons/${farm.seasonId}/plantings`;
		const paint = async (): Promise<number> => {
			await page.goto('about:blank');
			const t0 = Date.now();
			await page.goto(gridUrl, { waitUntil: 'commit' });
			await page.locator('[data-row="0"]').first().waitFor({ state: 'visible', timeout: 60_000 });
			await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => r(null))));
			return Date.now() - t0;
		};

		// Everything a first visit fetches, with an empty cache.
		await cdp.send('Network.setCacheDisabled', { cacheDisabled: true });
		await page.goto('about:blank');
		bytes = 0;
		await page.goto(gridUrl);
		await page.locator('[data-row="0"]').first().waitFor({ state: 'visible' });
		await page.waitForLoadState('networkidle');
		const transferKb = round(bytes / 1024, 1);

		await cdp.send('Network.emulateNetworkConditions', {
			offline: false,
			latency: 100,
			downloadThroughput: 4_000_000 / 8,
			uploadThroughput: 1_000_000 / 8
		});
		const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
		// Empty browser cache each time: the page, its scripts, styles, fonts and data all come over the link.
		const cold: number[] = [];
		for (let i = 0; i < PAINT_RUNS; i++) cold.push(await paint());
		// The same, right after a write to the season: the server builds its answer anew (plantings-cache.ts).
		const db = knex(knexConfig(process.env.FC_DB_NAME));
		const afterWrite: number[] = [];
		try {
			for (let i = 0; i < PAINT_RUNS; i++) {
				await db('plantings')
					.where({ farm_id: farm.farmId, season_id: farm.seasonId })
					.orderBy('id')
					.limit(1)
					.update({ notes: `bench write ${i}` });
				afterWrite.push(await paint());
			}
		} finally {
			await db.destroy();
		}
		await cdp.send('Network.setCacheDisabled', { cacheDisabled: false });
		await paint(); // fills the cache with the page's scripts, styles and fonts
		const warm: number[] = [];
		for (let i = 0; i < PAINT_RUNS; i++) warm.push(await paint());
		return {
			'grid.transfer_kb': transferKb,
			'grid.first_paint_rural_ms': median(cold),
			'grid.first_paint_rural_after_write_ms': median(afterWrite),
			'grid.first_paint_rural_warm_ms': median(warm)
		};
	} finally {
		await browser.close();
	}
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
	runApiBench().then((r) => {
		for (const [k, v] of Object.entries(r)) console.log(`${k}: ${v}`);
	});
}
