import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { signUpSchema } from '$lib/schemas/auth';
import { fieldErrors } from '$lib/schemas/common';
import { cookieIsSecure } from '$lib/server/auth';
import { devMailEnabled } from '$lib/server/mail';
import { afterResponse } from '$lib/server/password-resets';
import { requestSignUp, viewerKey } from '$lib/server/signups';
import { signUpAddressWait, signUpMailAllowed, tooManyTries, waitInWords } from '$lib/server/rate-limit';
import { clientAddress } from '$lib/server/client-address';

export const load = (async ({ locals }) => {
	if (locals.user) redirect(303, '/');
	return { devMail: devMailEnabled() };
}) satisfies PageServerLoad;

export const actions = {
	default: async (event) => {
		const { request, cookies, url } = event;
		const form = Object.fromEntries(await request.formData());
		const { password: _password, ...values } = Object.fromEntries(Object.entries(form).map(([k, v]) => [k, String(v)]));
		const parsed = signUpSchema.safeParse(form);
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error), values });
		const wait = await signUpAddressWait(clientAddress(event));
		if (wait > 0)
			return tooManyTries(
				event,
				wait,
				'_form',
				`Too many new farms from your network address. Wait ${waitInWords(wait)}, then try again.`,
				values
			);
		// The same answer, and the same work before it, for an address with an account and one without:
		// whether the address is taken is looked up after the answer, and only the mail differs (a link that
		// creates the farm, or a note that an account exists). Mail to one address is throttled silently.
		const viewer = viewerKey(cookies, cookieIsSecure(url));
		if (await signUpMailAllowed(parsed.data.email))
			afterResponse('sign-up mail', () => requestSignUp(parsed.data, url.origin, viewer));
		return { checkMail: parsed.data.email };
	}
} satisfies Actions;
