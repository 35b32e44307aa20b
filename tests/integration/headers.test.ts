// Response headers on every kind of answer the server gives, and compression by Accept-Encoding.
// Source: OWASP ASVS 4.0.3 V14.4 (HTTP security headers: nosniff, CSP frame-ancestors, Referrer-Policy,
// Cache-Control on sensitive data) and RFC 9110 §8.4 / §12.5.3 (Content-Encoding, Accept-Encoding).
// Bodies are decoded with node:zlib (Node.js's own brotli and gzip), not by the app.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import http from 'node:http';
import { brotliDecompressSync, gunzipSync } from 'node:zlib';
import { Client, signedIn } from '../helpers/http';
import { baseUrl, demo } from '../helpers/env';
import { closeTestDb, testDb } from '../helpers/db';

interface Raw {
	status: number;
	headers: http.IncomingHttpHeaders;
	body: Buffer;
}

/** A plain node:http GET: unlike fetch, it neither asks for nor undoes compression by itself. */
function get(path: string, headers: Record<string, string> = {}): Promise<Raw> {
	return new Promise((resolve, reject) => {
		const req = http.get(baseUrl() + path, { headers }, (res) => {
			const chunks: Buffer[] = [];
			res.on('data', (c: Buffer) => chunks.push(c));
			res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }));
			res.on('error', reject);
		});
		req.on('error', reject);
	});
}

let owner: Client;
let cookie: string;
let seasonId: number;
let staticPath: string;
beforeAll(async () => {
	owner = await signedIn(demo.owner, demo.password);
	cookie = [...owner.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
	const u = await testDb()('users').where({ email: demo.owner }).first('id');
	const farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id as number;
	// The demo's main season: the one with the most plantings.
	const main = await testDb()('plantings')
		.where({ farm_id: farmId })
		.groupBy('season_id')
		.orderByRaw('count(*) desc')
		.first('season_id');
	seasonId = main.season_id as number;
	// A built script the sign-in page links to: served from disk by adapter-node's static handler.
	const page = (await get('/signin')).body.toString('utf8');
	const m = /"\.?(\/_app\/immutable\/[^"]+\.js)"/.exec(page);
	if (!m) throw new Error('the sign-in page links no built script');
	staticPath = m[1];
});
afterAll(async () => {
	await closeTestDb();
});

function expectBase(h: http.IncomingHttpHeaders): void {
	expect(h['x-content-type-options']).toBe('nosniff');
	expect(String(h['content-security-policy'])).toMatch(/frame-ancestors 'none'/);
	expect(h['referrer-policy']).toBe('same-origin');
}

describe('security headers', () => {
	it('a signed-in page: a CSP with a script nonce and no unsafe script source, and no-store', async () => {
		const res = await get(`/seasons/${seasonId}/plantings`, { cookie });
		expect(res.status).toBe(200);
		expectBase(res.headers);
		const csp = String(res.headers['content-security-policy']);
		expect(csp).toMatch(/default-src 'self'/);
		expect(csp).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]+'/);
		expect(csp).not.toMatch(/script-src[^;]*unsafe/);
		expect(csp).toMatch(/object-src 'none'/);
		// SvelteKit's inline start-up script carries the same nonce as the header.
		const nonce = /'nonce-([^']+)'/.exec(csp)![1];
		expect(res.body.toString('utf8')).toContain(`nonce="${nonce}"`);
		expect(res.headers['cache-control']).toBe('no-store');
	});

	it('the sign-in page (no session) has them too', async () => {
		const res = await get('/signin');
		expect(res.status).toBe(200);
		expectBase(res.headers);
		expect(String(res.headers['content-security-policy'])).toMatch(/script-src 'self' 'nonce-/);
	});

	it('a JSON route: nosniff, frame-ancestors, no-store', async () => {
		const res = await get(`/api/seasons/${seasonId}/plantings`, { cookie });
		expect(res.status).toBe(200);
		expect(res.headers['content-type']).toMatch(/application\/json/);
		expectBase(res.headers);
		expect(String(res.headers['content-security-policy'])).toMatch(/default-src 'none'/);
		expect(res.headers['cache-control']).toBe('no-store');
	});

	it('a JSON error (no session) carries them too', async () => {
		const res = await get(`/api/seasons/${seasonId}/plantings`);
		expect(res.status).toBe(401);
		expectBase(res.headers);
		expect(res.headers['cache-control']).toBe('no-store');
	});

	it('a static file served from disk: nosniff, frame-ancestors, referrer policy', async () => {
		const res = await get(staticPath);
		expect(res.status).toBe(200);
		expect(res.headers['content-type']).toMatch(/javascript/);
		expectBase(res.headers);
		// Built files have hashed names and may be cached for good; they hold no farm data.
		expect(res.headers['cache-control']).toMatch(/immutable/);
		const icon = await get('/favicon.svg');
		expect(icon.status).toBe(200);
		expectBase(icon.headers);
	});

	it('a download (the season workbook): headers, no-store, not compressed, streamed whole', async () => {
		const res = await get(`/api/seasons/${seasonId}/export`, { cookie, 'accept-encoding': 'br, gzip' });
		expect(res.status).toBe(200);
		expect(res.headers['content-disposition']).toMatch(/attachment/);
		expectBase(res.headers);
		expect(res.headers['cache-control']).toMatch(/no-store/);
		// An .xlsx is a zip archive already: sent as it is, starting with "PK\x03\x04".
		expect(res.headers['content-encoding']).toBeUndefined();
		expect(res.body.subarray(0, 4).toString('latin1')).toBe('PK\x03\x04');
	});

	it('the demand CSV download: no-store and nosniff', async () => {
		const res = await get(`/api/seasons/${seasonId}/demand/file?format=csv`, { cookie });
		expect(res.status).toBe(200);
		expect(res.headers['content-type']).toMatch(/text\/csv/);
		expectBase(res.headers);
		expect(res.headers['cache-control']).toBe('no-store');
	});
});

describe('compression by Accept-Encoding', () => {
	it('JSON: brotli when asked, gzip when only gzip is accepted, plain when nothing is', async () => {
		const path = `/api/seasons/${seasonId}/plantings`;
		const plain = await get(path, { cookie });
		expect(plain.headers['content-encoding']).toBeUndefined();
		const data = JSON.parse(plain.body.toString('utf8'));
		expect(data.plantings.length).toBeGreaterThan(50);

		const br = await get(path, { cookie, 'accept-encoding': 'gzip, deflate, br' });
		expect(br.headers['content-encoding']).toBe('br');
		expect(String(br.headers.vary)).toMatch(/Accept-Encoding/i);
		expect(JSON.parse(brotliDecompressSync(br.body).toString('utf8')).plantings).toEqual(data.plantings);
		// The plantings list is repetitive JSON: it shrinks to well under a fifth.
		expect(br.body.length).toBeLessThan(plain.body.length / 5);

		const gz = await get(path, { cookie, 'accept-encoding': 'gzip' });
		expect(gz.headers['content-encoding']).toBe('gzip');
		expect(JSON.parse(gunzipSync(gz.body).toString('utf8')).plantings).toEqual(data.plantings);
	});

	it('HTML pages are compressed too', async () => {
		const plain = await get(`/seasons/${seasonId}/beds`, { cookie });
		const gz = await get(`/seasons/${seasonId}/beds`, { cookie, 'accept-encoding': 'gzip' });
		expect(gz.status).toBe(200);
		expect(gz.headers['content-encoding']).toBe('gzip');
		expect(gunzipSync(gz.body).toString('utf8')).toMatch(/<html/);
		expect(gz.body.length).toBeLessThan(plain.body.length);
	});
});
