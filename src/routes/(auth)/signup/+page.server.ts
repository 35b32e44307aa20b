import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { signUpSchema } from '$lib/schemas/auth';
import { readForm } from '$lib/server/form';
import { cookieIsSecure } from '$lib/server/auth';
import { devMailEnabled } from '$lib/server/mail';
import { afterResponse } from '$lib/server/password-resets';
import { requestSignUp, viewerKey } from '$lib/server/signups';
import { signUpAddressWait, signUpMailAllowed } from '$lib/server/rate-limit';
import { addressMustWait } from '../address-wait';

export const load = (async ({ locals }) => {
	if (locals.user) redirect(303, '/');
	return { devMail: devMailEnabled() };
}) satisfies PageServerLoad;

export const actions = {
	default: async (event) => {
		const { request, cookies, url } = event;
		const { data, values, refused } = await readForm(request, signUpSchema, { secret: ['password'] });
		if (refused) return fail(400, refused);
		const busy = await addressMustWait(event, signUpAddressWait, '_form', 'new farms', values);
		if (busy) return busy;
		// The same answer, and the same work before it, for an address with an account and one without:
		// whether the address is taken is looked up after the answer, and only the mail differs (a link that
		// creates the farm, or a note that an account exists). Mail to one address is throttled silently.
		const viewer = viewerKey(cookies, cookieIsSecure(url));
		if (await signUpMailAllowed(data.email))
			afterResponse('sign-up mail', () => requestSignUp(data, url.origin, viewer));
		return { checkMail: data.email };
	}
} satisfies Actions;
