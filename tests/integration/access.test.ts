// Every page, form action and API method under src/routes, found on the file system, has a row
// in the access table (tests/integration/access-table.ts), and every row holds against the
// running app for each kind of visitor: no session, the owner, the crew lead, the share manager,
// and another farm's owner using this farm's ids.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, signedIn } from '../helpers/http';
import { closeTestDb } from '../helpers/db';
import { demo } from '../helpers/env';
import { baseUrl } from '../helpers/env';
import { listRoutes } from '../helpers/routes';
import { accessTable, type AccessRow, type Who } from './access-table';
import { makeAccessFixture, signInAll, type AccessFixture } from './access-fixture';

const routes = listRoutes();
const rowKeys = new Set(accessTable.map((r) => r.key));

describe('the access table', () => {
	it('finds the routes on the file system', () => {
		// A sanity floor, so a broken scan cannot pass by finding nothing.
		expect(routes.length).toBeGreaterThan(80);
		expect(routes.map((r) => r.key)).toContain('api/plantings/[id] PATCH');
		expect(routes.map((r) => r.key)).toContain('(app)/settings action:saveBed');
	});

	it('has a row for every page, form action and API method', () => {
		const missing = routes.filter((r) => !rowKeys.has(r.key)).map((r) => `  '${r.key}' (${r.file})`);
		expect(missing, `No row in tests/integration/access-table.ts for:\n${missing.join('\n')}\n`).toEqual([]);
	});

	it('has no row for a route that is gone, nor two rows for one route', () => {
		const known = new Set(routes.map((r) => r.key));
		expect(accessTable.filter((r) => !known.has(r.key)).map((r) => r.key)).toEqual([]);
		expect(accessTable.length).toBe(rowKeys.size);
	});
});

const order: Who[] = ['anon', 'other', 'crew', 'share', 'owner'];

async function probe(client: Client, row: AccessRow, url: string): Promise<Response> {
	const what = row.key.split(' ').pop() ?? '';
	if (what === 'page') return client.get(url);
	if (what.startsWith('action:'))
		return client.postForm(url, Object.fromEntries(Object.entries(row.body ?? {}).map(([k, v]) => [k, String(v)])));
	if (what === 'GET') return client.get(url);
	return client.json(url, what, row.body ?? {});
}

describe('every row holds against the running app', () => {
	let f: AccessFixture;
	let clients: Record<Who, Client>;
	beforeAll(async () => {
		f = await makeAccessFixture();
		clients = { anon: new Client(), ...(await signInAll()) };
	});
	afterAll(async () => {
		await f?.cleanup();
		await closeTestDb();
	});

	for (const row of accessTable) {
		it(row.key, async () => {
			const seen: Record<string, number> = {};
			const wanted: Record<string, number | number[]> = {};
			for (const who of order) {
				let client = clients[who];
				if (row.freshSession && who !== 'anon') {
					client = who === 'other' ? (await signInAll()).other : await signedIn(demo[who], demo.password);
				}
				const url = await row.url(f, who);
				const res = await probe(client, row, url);
				await res.arrayBuffer();
				seen[who] = res.status;
				wanted[who] = row.expect[who];
				// A page that sends a visitor to sign in must name sign-in, not anywhere else.
				if (who === 'anon' && res.status === 303 && row.expect.anon === 303 && !row.key.startsWith('signout')) {
					expect(
						res.headers.get('location') ?? '',
						`${row.key}: where no session is sent (${baseUrl()}${url})`
					).toMatch(/^\/signin/);
				}
			}
			const ok = (who: Who) => {
				const w = row.expect[who];
				return Array.isArray(w) ? w.includes(seen[who]) : w === seen[who];
			};
			expect(
				order.filter((w) => !ok(w)).map((w) => `${w}: got ${seen[w]}, want ${JSON.stringify(wanted[w])}`),
				row.key
			).toEqual([]);
		});
	}
});
