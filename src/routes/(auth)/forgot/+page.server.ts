import { fail } from '@sveltejs/kit';
import type { Actions } from './$types';
import { forgotSchema } from '$lib/schemas/auth';
import { fieldErrors } from '$lib/schemas/common';
import { afterResponse, mailPasswordReset } from '$lib/server/password-resets';
import { forgotAccountAllowed, forgotAddressWait, tooManyTries, waitInWords } from '$lib/server/rate-limit';
import { clientAddress } from '$lib/server/client-address';

export const actions = {
	default: async (event) => {
		const form = Object.fromEntries(await event.request.formData());
		const values = { email: String(form.email ?? '') };
		const parsed = forgotSchema.safeParse(form);
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error), values });
		// Per address: said openly, since it tells nothing about any account.
		const wait = await forgotAddressWait(clientAddress(event));
		if (wait > 0)
			return tooManyTries(
				event,
				wait,
				'email',
				`Too many reset requests from your network address. Wait ${waitInWords(wait)}, then try again.`,
				values
			);
		// Per account: counted for every address alike, and a spent count only means no more mail for now.
		// The look-up and the mail happen after the answer, so the answer and its timing are the same
		// whether or not an account uses the address, and whether or not the mail server is up.
		if (await forgotAccountAllowed(parsed.data.email))
			afterResponse('password reset mail', () => mailPasswordReset(parsed.data.email, event.url.origin));
		return { sent: true, values };
	}
} satisfies Actions;
