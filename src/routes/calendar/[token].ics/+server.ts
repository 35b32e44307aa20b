// A user's task calendar at its secret URL. Calendar apps poll it without a session: the token
// is the credential, so an unknown or revoked one is a plain 404 that reveals nothing.
import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { feedCalendar, findFeed } from '$lib/server/calendar';

export const GET: RequestHandler = async (event) => {
	const feed = await findFeed(event.params.token);
	if (!feed) error(404, 'No such calendar feed.');
	const body = await feedCalendar(feed, event.url.origin + event.url.pathname);
	return new Response(body, {
		headers: {
			'content-type': 'text/calendar; charset=utf-8',
			'content-disposition': 'inline; filename="furrowcast-tasks.ics"',
			// Private to whoever holds the link; revalidated so a revoke takes effect at once.
			'cache-control': 'private, no-cache'
		}
	});
};
