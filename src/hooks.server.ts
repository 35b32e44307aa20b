// Resolves the session and the farm once per request; routes read them from locals.
import type { Handle } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { closeSessions, validateSessionCookie } from '$lib/server/auth';
import { closeDb } from '$lib/server/db';
import { resolveMembership } from '$lib/server/members';

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

const securityHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	response.headers.set('X-Content-Type-Options', 'nosniff');
	response.headers.set('Referrer-Policy', 'same-origin');
	response.headers.set('X-Frame-Options', 'DENY');
	return response;
};

export const handle = sequence(session, securityHeaders);

// adapter-node emits this once the HTTP server has closed: end the database pools so the
// process exits instead of idling on open connections.
process.on('sveltekit:shutdown', () => {
	void Promise.allSettled([closeDb(), closeSessions()]);
});
