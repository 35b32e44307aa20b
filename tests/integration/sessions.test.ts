// Session limits: an idle timeout (Lucia's expiry, renewed while in use) and an absolute lifetime from
// sign-in that no renewal passes. Defaults: FC_SESSION_IDLE_HOURS 12, FC_SESSION_MAX_DAYS 7.
import { afterAll, describe, expect, it } from 'vitest';
import { signedIn } from '../helpers/http';
import { closeTestDb, count, testDb } from '../helpers/db';
import { demo } from '../helpers/env';

afterAll(closeTestDb);

const hour = 3_600_000;
const day = 24 * hour;

async function newSession(): Promise<{ client: Awaited<ReturnType<typeof signedIn>>; id: string }> {
	const client = await signedIn(demo.share, demo.password);
	const id = client.cookies.get('fc_session')!;
	expect(id).toBeTruthy();
	return { client, id };
}

describe('session limits', () => {
	it('a new session records when it began and expires after the idle timeout, not 30 days', async () => {
		const { id } = await newSession();
		const row = await testDb()('user_sessions').where({ id }).first('created_at', 'expires_at');
		expect(Math.abs(new Date(row.created_at).getTime() - Date.now())).toBeLessThan(5 * 60_000);
		const left = new Date(row.expires_at).getTime() - Date.now();
		expect(left).toBeGreaterThan(11 * hour);
		expect(left).toBeLessThanOrEqual(12 * hour + 60_000);
	});

	it('ends a session left idle past its expiry', async () => {
		const { client, id } = await newSession();
		await testDb()('user_sessions')
			.where({ id })
			.update({ expires_at: new Date(Date.now() - 1000) });
		expect((await client.get('/api/me')).status).toBe(401);
	});

	it('renews a session in use, but never past the absolute lifetime', async () => {
		const { client, id } = await newSession();
		// Began 6 days 23 hours ago; 5 hours left of its idle span, so this request renews it.
		const began = new Date(Date.now() - 7 * day + hour);
		await testDb()('user_sessions')
			.where({ id })
			.update({ created_at: began, expires_at: new Date(Date.now() + 5 * hour) });
		expect((await client.get('/api/me')).status).toBe(200);
		const row = await testDb()('user_sessions').where({ id }).first('expires_at');
		// Lucia alone would set now + 12 h; the lifetime ends at began + 7 days, an hour from now.
		expect(new Date(row.expires_at).getTime()).toBeLessThanOrEqual(began.getTime() + 7 * day + 1000);
		expect(new Date(row.expires_at).getTime()).toBeGreaterThan(Date.now() + 30 * 60_000);
		const cookie = client.lastSetCookie.find((c) => c.startsWith('fc_session='));
		expect(cookie).toBeDefined();
		const expires = Date.parse(/Expires=([^;]+)/i.exec(cookie!)![1]);
		expect(expires).toBeLessThanOrEqual(began.getTime() + 7 * day + 1000);
	});

	it('ends a session past its absolute lifetime however recently it was used', async () => {
		const { client, id } = await newSession();
		await testDb()('user_sessions')
			.where({ id })
			.update({ created_at: new Date(Date.now() - 7 * day - 60_000), expires_at: new Date(Date.now() + 11 * hour) });
		expect((await client.get('/api/me')).status).toBe(401);
		expect(await count('user_sessions', { id })).toBe(0);
	});

	it('keeps a session within both limits', async () => {
		const { client, id } = await newSession();
		await testDb()('user_sessions')
			.where({ id })
			.update({ created_at: new Date(Date.now() - 6 * day) });
		expect((await client.get('/api/me')).status).toBe(200);
		expect(await count('user_sessions', { id })).toBe(1);
	});
});
