// Sessions with Lucia 3 on MariaDB. Sessions live in the database, so any number of
// app servers behind a load balancer share them.
// Two limits (app settings, see README): an idle timeout, FC_SESSION_IDLE_HOURS (default 12): Lucia
// renews a session used in the second half of that span, so an unused one ends 6 to 12 hours after its
// last use; and an absolute lifetime, FC_SESSION_MAX_DAYS (default 7), counted from sign-in, past which no
// renewal reaches.
import { Lucia, TimeSpan, type Session, type User } from 'lucia';
import { Mysql2Adapter } from '@lucia-auth/adapter-mysql';
import mysql from 'mysql2/promise';
import type { Cookies } from '@sveltejs/kit';
import { env } from '$env/dynamic/private';
import { dbAccount } from './db';

let pool: mysql.Pool | undefined;
function sessionPool(): mysql.Pool {
	pool ??= mysql.createPool({
		...dbAccount(),
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

function positiveSetting(name: string, fallback: number): number {
	const value = Number(env[name] ?? fallback);
	return Number.isFinite(value) && value > 0 ? value : fallback;
}

/** The idle timeout in hours and the absolute lifetime in milliseconds. */
export function sessionLimits(): { idleHours: number; maxMs: number } {
	return {
		idleHours: positiveSetting('FC_SESSION_IDLE_HOURS', 12),
		maxMs: positiveSetting('FC_SESSION_MAX_DAYS', 7) * 86_400_000
	};
}

function createLucia() {
	return new Lucia(new Mysql2Adapter(sessionPool(), { user: 'users', session: 'user_sessions' }), {
		sessionExpiresIn: new TimeSpan(Math.round(sessionLimits().idleHours * 60), 'm'),
		sessionCookie: { name: 'fc_session', attributes: { sameSite: 'lax', secure: false } },
		getUserAttributes: (attributes) => ({ email: attributes.email, name: attributes.name }),
		getSessionAttributes: (attributes) => ({ farmId: attributes.farm_id, createdAt: attributes.created_at })
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
		DatabaseSessionAttributes: { farm_id: number | null; created_at: Date };
	}
}

/** Secure cookies everywhere but plain-http loopback, where browsers would drop them. */
export function cookieIsSecure(url: URL): boolean {
	const loopback = ['localhost', '127.0.0.1', '[::1]'].includes(url.hostname);
	return url.protocol === 'https:' || !loopback;
}

export async function startSession(cookies: Cookies, url: URL, userId: string, farmId: number | null): Promise<void> {
	const session = await lucia().createSession(userId, { farm_id: farmId, created_at: new Date() });
	setSessionCookie(cookies, url, session);
}

function setSessionCookie(cookies: Cookies, url: URL, session: Session): void {
	const cookie = lucia().createSessionCookie(session.id);
	// The cookie lives as long as the session may: never past the absolute lifetime.
	const expires = session.expiresAt;
	cookies.set(cookie.name, cookie.value, {
		...cookie.attributes,
		expires,
		maxAge: undefined,
		path: '/',
		httpOnly: true,
		secure: cookieIsSecure(url)
	});
}

/**
 * Checks the session cookie's session. Lucia ends idle sessions and renews used ones; past the
 * absolute lifetime the session ends whatever its use, and a renewal never reaches beyond it.
 */
export async function validateSessionCookie(
	cookies: Cookies,
	url: URL
): Promise<{ session: Session; user: User } | null> {
	const sessionId = cookies.get(lucia().sessionCookieName);
	if (!sessionId) return null;
	const { session, user } = await lucia().validateSession(sessionId);
	if (!session || !user) {
		clearSessionCookie(cookies, url);
		return null;
	}
	const endsAt = new Date(new Date(session.createdAt).getTime() + sessionLimits().maxMs);
	if (endsAt.getTime() <= Date.now()) {
		await lucia().invalidateSession(session.id);
		clearSessionCookie(cookies, url);
		return null;
	}
	if (session.fresh) {
		if (session.expiresAt > endsAt) {
			// Lucia has just renewed it past the lifetime: pull the end back to the lifetime.
			await sessionPool().execute('UPDATE user_sessions SET expires_at = ? WHERE id = ?', [endsAt, session.id]);
			session.expiresAt = endsAt;
		}
		setSessionCookie(cookies, url, session);
	}
	return { session, user };
}

/** Ends a user's sessions at once: on the farm given (and those with no farm), or all of them. */
export async function endSessionsOf(userId: string, farmId?: number): Promise<void> {
	if (farmId === undefined) await lucia().invalidateUserSessions(userId);
	else
		await sessionPool().execute('DELETE FROM user_sessions WHERE user_id = ? AND (farm_id = ? OR farm_id IS NULL)', [
			userId,
			farmId
		]);
}

export function clearSessionCookie(cookies: Cookies, url: URL): void {
	const cookie = lucia().createBlankSessionCookie();
	cookies.set(cookie.name, cookie.value, {
		...cookie.attributes,
		path: '/',
		httpOnly: true,
		secure: cookieIsSecure(url)
	});
}
