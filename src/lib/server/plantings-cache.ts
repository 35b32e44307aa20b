// The answer of GET /api/seasons/{id}/plantings, kept ready in memory.
//
// The grid asks for a whole season at once (5,000 rows make 3.5 MB of JSON). Building that takes
// the database and Node far longer than sending it, and it rarely changes between two asks. So the
// finished answer is kept, per farm, season and role, with its brotli and gzip bytes once a client
// has asked for them, and beside it the season's stamp: the (count, highest change_seq) of every
// table the answer is read from (db/migrations/20261203_11d_change_stamps.ts). Each ask reads the
// stamp again, in one indexed query, and sends the kept bytes only while it is unchanged; any write
// to those tables, by any path (the app, an import, a script, SQL by hand), changes it.
//
// The stamp is read before the answer is built: a write that lands in between makes the kept
// answer newer than its stamp, never older, so the next ask builds it again.
//
// Every table that plantings-json.ts or gridContext reads must be in `stampSql` below.
import { createHash } from 'node:crypto';
import { promisify } from 'node:util';
import { brotliCompress, constants, gzip } from 'node:zlib';
import { env } from '$env/dynamic/private';
import { db } from './db';

const brotli = promisify(brotliCompress);
const gz = promisify(gzip);

type Encoding = 'br' | 'gzip' | 'identity';

interface Entry {
	stamp: string;
	etag: string;
	body: Buffer;
	encoded: Partial<Record<'br' | 'gzip', Promise<Buffer>>>;
	size: number;
}

const entries = new Map<string, Entry>(); // in use order: the first is the least recently used
const building = new Map<string, Promise<Entry>>();
let held = 0;

function budgetBytes(): number {
	const mb = Number(env.FC_ANSWER_CACHE_MB ?? 64);
	return Number.isFinite(mb) && mb >= 0 ? mb * 1024 * 1024 : 64 * 1024 * 1024;
}

function forget(key: string): void {
	const e = entries.get(key);
	if (!e) return;
	entries.delete(key);
	held -= e.size;
}

function evict(): void {
	const budget = budgetBytes();
	for (const [k] of entries) {
		if (held <= budget) break;
		forget(k);
	}
}

function keep(key: string, e: Entry): void {
	forget(key);
	entries.set(key, e);
	held += e.size;
	evict();
}

/** Count and highest stamp, per table, as one string: `n.max|n.max|…`. */
const part = (table: string, where: string) =>
	`(SELECT CONCAT(COUNT(*), '.', COALESCE(MAX(change_seq), 0)) FROM ${table} WHERE ${where})`;
const stampSql = `SELECT CONCAT_WS('|',
	${part('plantings', 'farm_id = ? AND season_id = ?')},
	${part('seasons', 'farm_id = ?')},
	${part('varieties', 'farm_id = ?')},
	${part('crops', 'farm_id = ?')},
	${part('beds', 'farm_id = ?')},
	${part('blocks', 'farm_id = ?')},
	${part('farm_weekly_temps', 'farm_id = ?')},
	(SELECT change_seq FROM farms WHERE id = ?),
	(SELECT COALESCE(MAX(change_seq), 0) FROM users)
) AS stamp`;

/** The season's stamp: changes with every write to what its plantings answer is made of. */
export async function seasonStamp(farmId: number, seasonId: number): Promise<string> {
	const [rows] = (await db().raw(stampSql, [farmId, seasonId, ...Array(7).fill(farmId)])) as [{ stamp: string }[]];
	return String(rows[0]?.stamp ?? '');
}

/** The best encoding the client accepts, by its Accept-Encoding (q=0 refuses one). */
export function pickEncoding(header: string | null): Encoding {
	const accepted = new Map<string, number>();
	for (const item of (header ?? '').toLowerCase().split(',')) {
		const [name, ...params] = item.trim().split(';');
		if (!name) continue;
		const q = params.map((p) => p.trim()).find((p) => p.startsWith('q='));
		const weight = q ? Number(q.slice(2)) : 1;
		accepted.set(name, Number.isFinite(weight) ? weight : 0);
	}
	const ok = (name: string) => (accepted.get(name) ?? accepted.get('*') ?? 0) > 0;
	if (ok('br')) return 'br';
	if (ok('gzip')) return 'gzip';
	return 'identity';
}

function encode(entry: Entry, key: string, encoding: 'br' | 'gzip'): Promise<Buffer> {
	let p = entry.encoded[encoding];
	if (!p) {
		p =
			encoding === 'br'
				? brotli(entry.body, {
						params: {
							[constants.BROTLI_PARAM_QUALITY]: 5,
							[constants.BROTLI_PARAM_MODE]: constants.BROTLI_MODE_TEXT,
							[constants.BROTLI_PARAM_SIZE_HINT]: entry.body.length
						}
					})
				: gz(entry.body, { level: 6 });
		entry.encoded[encoding] = p;
		void p.then(
			(bytes) => {
				entry.size += bytes.length;
				if (entries.get(key) !== entry) return;
				held += bytes.length;
				evict();
			},
			() => delete entry.encoded[encoding]
		);
	}
	return p;
}

/**
 * The plantings answer for a season as the given role sees it: from memory while the season's
 * stamp is unchanged, else built by `build` (the JSON text) and kept. Answers 304 to a matching
 * If-None-Match, and sends brotli or gzip bytes to a client that accepts them.
 */
export async function cachedAnswer(
	request: Request,
	farmId: number,
	seasonId: number,
	role: string,
	build: () => Promise<string>
): Promise<Response> {
	const key = `${farmId}:${seasonId}:${role}`;
	const stamp = await seasonStamp(farmId, seasonId);
	let entry = entries.get(key);
	if (entry?.stamp === stamp) {
		keep(key, entry); // most recently used now
	} else {
		const job = `${key}@${stamp}`;
		let pending = building.get(job);
		if (!pending) {
			pending = build().then((text) => {
				const body = Buffer.from(text, 'utf8');
				const hash = createHash('sha256').update(body).digest('base64url').slice(0, 27);
				return { stamp, etag: `W/"${hash}"`, body, encoded: {}, size: body.length };
			});
			building.set(job, pending);
			void pending.then(
				(e) => {
					building.delete(job);
					// Should an older build finish last, the next ask finds its stamp stale and builds anew.
					keep(key, e);
				},
				() => building.delete(job)
			);
		}
		entry = await pending;
	}
	const headers: Record<string, string> = {
		'content-type': 'application/json',
		etag: entry.etag,
		// No Cache-Control of its own: hooks.server.ts makes it no-store, so a farm's data stays off the
		// disk of a shared computer. The ETag serves clients that keep their own copy.
		vary: 'Accept-Encoding'
	};
	const ifNoneMatch = request.headers.get('if-none-match');
	if (ifNoneMatch && ifNoneMatch.split(',').some((t) => t.trim() === entry.etag || t.trim() === '*'))
		return new Response(null, { status: 304, headers });
	const encoding = pickEncoding(request.headers.get('accept-encoding'));
	const bytes = encoding === 'identity' ? entry.body : await encode(entry, key, encoding);
	if (encoding !== 'identity') headers['content-encoding'] = encoding;
	headers['content-length'] = String(bytes.length);
	// A stream of the kept bytes themselves: a Response made from the bytes would copy them first.
	const body = new ReadableStream<Uint8Array>({
		start(controller) {
			controller.enqueue(bytes);
			controller.close();
		}
	});
	return new Response(body, { headers });
}
