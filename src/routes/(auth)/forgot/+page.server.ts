import { fail } from '@sveltejs/kit';
import type { Actions } from './$types';
import { forgotSchema } from '$lib/schemas/auth';
import { readForm } from '$lib/server/form';
import { afterResponse, mailPasswordReset } from '$lib/server/password-resets';
import { forgotAccountAllowed, forgotAddressWait } from '$lib/server/rate-limit';
import { addressMustWait } from '../address-wait';

export const actions = {
	default: async (event) => {
		const { data, values, refused } = await readForm(event.request, forgotSchema);
		if (refused) return fail(400, refused);
		// Per address: said openly, since it tells nothing about any account.
		const busy = await addressMustWait(event, forgotAddressWait, 'email', 'reset requests', values);
		if (busy) return busy;
		// Per account: counted for every address alike, and a spent count only means no more mail for now.
		// The look-up and the mail happen after the answer, so the answer and its timing are the same
		// whether or not an account uses the address, and whether or not the mail server is up.
		if (await forgotAccountAllowed(data.email))
			afterResponse('password reset mail', () => mailPasswordReset(data.email, event.url.origin));
		return { sent: true, values };
	}
} satisfies Actions;
