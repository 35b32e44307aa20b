// Resolves the session and the farm once per request; routes read them from locals.
import { json, type Handle } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { closeSessions, validateSessionCookie } from '$lib/server/auth';
import { closeDb } from '$lib/server/db';
import { resolveMembership } from '$lib/server/members';
import { databaseUnavailable, handleDatabaseError } from '$lib/server/unavailable';

const session: Handle = async ({ event, resolve }) => {
	event.locals.user = null;
	event.locals.sessionId = null;
	event.locals.farm = null;
	const found = await validateSessionCookie(event.cookies, event.url);
	if (!found) return resolve(event);
	const { session, user } = found;
	event.locals.user = { id: user.id, email: user.email, name: user.name };
	event.locals.sessionId = session.id;
	const membership = await resolveMembership(user.id, session.farmId);
	if (membership) event.locals.farm = { id: membership.farmId, name: membership.farmName, role: membership.role };
	return resolve(event);
};

// scripts/serve.js sets these on every response (static files too); they are repeated here for
// `vite dev` and `vite preview`. Pages get their Content-Security-Policy from kit.csp.
// Everything the app itself answers (pages, JSON, downloads) may hold a farm's data: no cache,
// shared or private, may keep it, unless the route chose its own Cache-Control.
const securityHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	response.headers.set('X-Content-Type-Options', 'nosniff');
	response.headers.set('Referrer-Policy', 'same-origin');
	response.headers.set('X-Frame-Options', 'DENY');
	if (!response.headers.has('Content-Security-Policy'))
		response.headers.set('Content-Security-Policy', "default-src 'none'; frame-ancestors 'none'");
	if (!response.headers.has('Cache-Control')) response.headers.set('Cache-Control', 'no-store');
	return response;
};

// An API address no route serves answers in JSON like every other API answer, not with the HTML error page.
const apiNotFound: Handle = async ({ event, resolve }) => {
	if (event.route.id === null && event.url.pathname.startsWith('/api/'))
		return json({ message: 'There is no API route at this address.' }, { status: 404 });
	return resolve(event);
};

export const handle = sequence(databaseUnavailable, apiNotFound, session, securityHeaders);

// A database that cannot be reached is a 503 with Retry-After, not a 500 (src/lib/server/unavailable.ts).
export const handleError = handleDatabaseError;

// adapter-node emits this once the HTTP server has closed: end the database pools so the
// process exits instead of idling on open connections.
process.on('sveltekit:shutdown', () => {
	void Promise.allSettled([closeDb(), closeSessions()]);
});
