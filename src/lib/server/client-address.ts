import type { RequestEvent } from '@sveltejs/kit';

/** The caller's network address; behind a proxy adapter-node reads it from ADDRESS_HEADER. */
export function clientAddress(event: RequestEvent): string {
	try {
		return event.getClientAddress();
	} catch {
		return 'unknown';
	}
}
