import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { signUpSchema } from '$lib/schemas/auth';
import { fieldErrors, type FieldErrors } from '$lib/schemas/common';
import { DuplicateEmailError, signUp } from '$lib/server/users';
import { startSession } from '$lib/server/auth';
import { afterResponse, mailSignUpAttempt } from '$lib/server/password-resets';
import { signUpAddressWait, waitInWords } from '$lib/server/rate-limit';
import { clientAddress } from '$lib/server/client-address';

export const load = (async ({ locals }) => {
	if (locals.user) redirect(303, '/');
	return {};
}) satisfies PageServerLoad;

export const actions = {
	default: async (event) => {
		const { request, cookies, url } = event;
		const form = Object.fromEntries(await request.formData());
		const { password: _password, ...values } = Object.fromEntries(Object.entries(form).map(([k, v]) => [k, String(v)]));
		const parsed = signUpSchema.safeParse(form);
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error), values });
		const wait = await signUpAddressWait(clientAddress(event));
		if (wait > 0) {
			event.setHeaders({ 'retry-after': String(Math.ceil(wait / 1000)) });
			return fail(429, {
				errors: <FieldErrors>{
					_form: `Too many new farms from your network address. Wait ${waitInWords(wait)}, then try again.`
				},
				values
			});
		}
		try {
			const { userId, farmId } = await signUp(parsed.data);
			await startSession(cookies, url, userId, farmId);
		} catch (error) {
			if (!(error instanceof DuplicateEmailError)) throw error;
			// Not "this address has an account": the holder gets a note by mail, and the page says what
			// the reset page says.
			afterResponse('sign-up note', () => mailSignUpAttempt(parsed.data.email, url.origin));
			return { checkMail: parsed.data.email };
		}
		redirect(303, '/setup');
	}
} satisfies Actions;
