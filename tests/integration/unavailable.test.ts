// When MariaDB cannot be reached, the app answers 503 with Retry-After and says the farm's
// data is briefly unavailable (a page for the browser, JSON for the API), never a bare 500.
// A second server from the same build is started here with a database port nothing listens on.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demo } from '../helpers/env';
import { freePort, startSecondApp, type SecondApp } from '../helpers/second-app';

let app: SecondApp | undefined;
let base = '';

beforeAll(async () => {
	app = await startSecondApp({ FC_DB_PORT: String(await freePort()) });
	base = app.base;
});
afterAll(() => app?.stop());

const cookie = { cookie: 'fc_session=some-session-id-the-database-would-check' };

describe('with the database down', () => {
	it('a page answers 503 with Retry-After and says the data is briefly unavailable', async () => {
		const res = await fetch(`${base}/seasons`, { headers: { ...cookie, accept: 'text/html' }, redirect: 'manual' });
		expect(res.status).toBe(503);
		expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(0);
		const text = await res.text();
		expect(text).toContain("farm's data is briefly unavailable");
		expect(text).not.toContain('Internal Error');
	});

	it('the JSON API answers 503 with Retry-After and a JSON message', async () => {
		const res = await fetch(`${base}/api/me`, { headers: { ...cookie, accept: 'application/json' } });
		expect(res.status).toBe(503);
		expect(res.headers.get('retry-after')).toBeTruthy();
		expect(res.headers.get('content-type')).toMatch(/application\/json/);
		expect((await res.json()).message).toMatch(/briefly unavailable/);
	});

	it('signing in answers 503 too, not 500', async () => {
		const body = new URLSearchParams({ email: demo.owner, password: demo.password });
		const res = await fetch(`${base}/signin`, {
			method: 'POST',
			body,
			redirect: 'manual',
			headers: { origin: base, accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded' }
		});
		expect(res.status).toBe(503);
		expect(await res.text()).toContain('briefly unavailable');
	});

	it('a page that needs no database still opens', async () => {
		expect((await fetch(`${base}/signin`, { headers: { accept: 'text/html' } })).status).toBe(200);
	});
});
