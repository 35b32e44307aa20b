// Sessions with Lucia 3 on MariaDB. Sessions live in the database, so any number of
// app servers behind a load balancer share them.
import { Lucia } from 'lucia';
import { Mysql2Adapter } from '@lucia-auth/adapter-mysql';
import mysql from 'mysql2/promise';
import type { Cookies } from '@sveltejs/kit';
import { env } from '$env/dynamic/private';

function setting(name: string): string {
	const value = env[name];
	if (!value) throw new Error(`${name} is not set: start the app with npm start (see README, Configuration)`);
	return value;
}

let pool: mysql.Pool | undefined;
function sessionPool(): mysql.Pool {
	pool ??= mysql.createPool({
		host: setting('FC_DB_HOST'),
		port: Number(setting('FC_DB_PORT')),
		user: setting('FC_DB_USER'),
		password: setting('FC_DB_PASSWORD'),
		database: setting('FC_DB_NAME'),
		// Lucia reads expires_at as a UTC DATETIME.
		timezone: 'Z',
		connectionLimit: 5
	});
	return pool;
}

/** Closes the session pool (on shutdown). */
export async function closeSessions(): Promise<void> {
	const current = pool;
	pool = undefined;
	instance = undefined;
	await current?.end();
}

function createLucia() {
	return new Lucia(new Mysql2Adapter(sessionPool(), { user: 'users', session: 'user_sessions' }), {
		sessionCookie: { name: 'fc_session', attributes: { sameSite: 'lax', secure: false } },
		getUserAttributes: (attributes) => ({ email: attributes.email, name: attributes.name }),
		getSessionAttributes: (attributes) => ({ farmId: attributes.farm_id })
	});
}

let instance: ReturnType<typeof createLucia> | undefined;
export function lucia(): ReturnType<typeof createLucia> {
	instance ??= createLucia();
	return instance;
}

declare module 'lucia' {
	interface Register {
		Lucia: ReturnType<typeof createLucia>;
		DatabaseUserAttributes: { email: string; name: string };
		DatabaseSessionAttributes: { farm_id: number | null };
	}
}

/** Secure cookies everywhere but plain-http loopback, where browsers would drop them. */
export function cookieIsSecure(url: URL): boolean {
	const loopback = ['localhost', '127.0.0.1', '[::1]'].includes(url.hostname);
	return url.protocol === 'https:' || !loopback;
}

export async function startSession(cookies: Cookies, url: URL, userId: string, farmId: number | null): Promise<void> {
	const session = await lucia().createSession(userId, { farm_id: farmId });
	const cookie = lucia().createSessionCookie(session.id);
	cookies.set(cookie.name, cookie.value, { ...cookie.attributes, path: '/', httpOnly: true, secure: cookieIsSecure(url) });
}

export function clearSessionCookie(cookies: Cookies, url: URL): void {
	const cookie = lucia().createBlankSessionCookie();
	cookies.set(cookie.name, cookie.value, { ...cookie.attributes, path: '/', httpOnly: true, secure: cookieIsSecure(url) });
}
