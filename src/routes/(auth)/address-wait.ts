// Requests that mail someone (sign-up, password reset) are counted per network address: past the limit the
// form answers 429 with how long to wait, said openly since it tells nothing about any account.
import type { RequestEvent } from '@sveltejs/kit';
import { tooManyTries, waitInWords } from '$lib/server/rate-limit';
import { clientAddress } from '$lib/server/client-address';

/** The 429 answer when this address must wait (`spend` counts the request), else null. */
export async function addressMustWait<V>(
	event: RequestEvent,
	spend: (address: string) => Promise<number>,
	field: string,
	what: string,
	values: V
) {
	const wait = await spend(clientAddress(event));
	if (wait === 0) return null;
	const message = `Too many ${what} from your network address. Wait ${waitInWords(wait)}, then try again.`;
	return tooManyTries(event, wait, field, message, values);
}
