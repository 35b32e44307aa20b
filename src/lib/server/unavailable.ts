// When MariaDB cannot be reached (down, restarting, out of connections), every request that
// needs it answers 503 with Retry-After and says the farm's data is briefly unavailable, as an
// HTML page or, for the JSON API, as JSON; never a bare "Internal Error" 500.
import { json, type Handle, type HandleServerError, type RequestEvent } from '@sveltejs/kit';

export const UNAVAILABLE_MESSAGE =
	"The farm's data is briefly unavailable (the database is not answering). Nothing was lost; try again in a minute.";
const RETRY_AFTER_SECONDS = '30';

// Connection-level failures of mysql2 / knex: the database is not there, not what the request asked.
const codes = new Set([
	'ECONNREFUSED',
	'ECONNRESET',
	'EPIPE',
	'ETIMEDOUT',
	'EHOSTUNREACH',
	'ENOTFOUND',
	'PROTOCOL_CONNECTION_LOST',
	'ER_CON_COUNT_ERROR',
	'ER_SERVER_SHUTDOWN'
]);
// 1040 too many connections, 1053 server shutdown, 2002/2003 cannot connect, 2006 gone away, 2013 lost.
const errnos = new Set([1040, 1053, 2002, 2003, 2006, 2013]);

/** True when `err` (or what caused it) says the database could not be reached. */
export function isDatabaseUnavailable(err: unknown): boolean {
	for (
		let e = err as { code?: unknown; errno?: unknown; message?: unknown; cause?: unknown; name?: unknown } | null,
			depth = 0;
		e && depth < 5;
		e = e.cause as typeof e, depth++
	) {
		if (typeof e.code === 'string' && codes.has(e.code)) return true;
		if (typeof e.errno === 'number' && errnos.has(e.errno)) return true;
		if (e.name === 'KnexTimeoutError') return true;
		if (
			typeof e.message === 'string' &&
			/Timeout acquiring a connection|connect ECONNREFUSED|Connection lost: The server closed/.test(e.message)
		)
			return true;
	}
	return false;
}

// Keyed by the request's locals: SvelteKit may hand handleError a copy of the event, never of its locals.
const seen = new WeakSet<object>();

function wantsJson(event: RequestEvent): boolean {
	return (
		event.url.pathname.startsWith('/api/') || (event.request.headers.get('accept') ?? '').includes('application/json')
	);
}

function page(): Response {
	const html = `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>Briefly unavailable · Furrowcast</title></head><body style="font-family: system-ui, sans-serif; max-width: 36rem; margin: 4rem auto; padding: 0 1rem">
<p>Error 503</p><h1>The farm's data is briefly unavailable</h1><p data-testid="error-message">${UNAVAILABLE_MESSAGE}</p>
<p><a href="">Try again</a></p></body></html>`;
	return new Response(html, {
		status: 503,
		headers: {
			'content-type': 'text/html; charset=utf-8',
			'retry-after': RETRY_AFTER_SECONDS,
			'cache-control': 'no-store',
			'x-content-type-options': 'nosniff'
		}
	});
}

function unavailable(event: RequestEvent): Response {
	if (wantsJson(event))
		return json(
			{ message: UNAVAILABLE_MESSAGE },
			{ status: 503, headers: { 'retry-after': RETRY_AFTER_SECONDS, 'cache-control': 'no-store' } }
		);
	return page();
}

/** Marks the request when a load or handler failed for want of the database. */
export const handleDatabaseError: HandleServerError = ({ error, event, status }) => {
	if (isDatabaseUnavailable(error)) {
		seen.add(event.locals);
		console.error('[furrowcast] database unavailable:', (error as Error)?.message ?? error);
		return { message: UNAVAILABLE_MESSAGE };
	}
	// An address with no page behind it (or a method a route does not take) is the visitor's slip,
	// not a fault of ours: say what it is instead of "Internal Error".
	if (status === 404) return { message: 'There is no page at this address.' };
	if (status < 500) return { message: 'This address does not take that request.' };
	console.error(error);
	return { message: 'Internal Error' };
};

/** First in the hook sequence: turns those failures (even in later hooks) into a 503. */
export const databaseUnavailable: Handle = async ({ event, resolve }) => {
	let response: Response;
	try {
		response = await resolve(event);
	} catch (err) {
		if (isDatabaseUnavailable(err)) return unavailable(event);
		throw err;
	}
	if (response.status === 500 && seen.has(event.locals)) {
		if (wantsJson(event)) return unavailable(event);
		const headers = new Headers(response.headers);
		headers.set('retry-after', RETRY_AFTER_SECONDS);
		headers.set('cache-control', 'no-store');
		return new Response(response.body, { status: 503, headers });
	}
	return response;
};
