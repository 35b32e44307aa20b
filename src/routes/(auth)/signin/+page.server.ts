import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { signInSchema } from '$lib/schemas/auth';
import type { FieldErrors } from '$lib/schemas/common';
import { readForm } from '$lib/server/form';
import { findByEmail } from '$lib/server/users';
import { verifyDummy, verifyPassword } from '$lib/server/password';
import { startSession } from '$lib/server/auth';
import { resolveMembership } from '$lib/server/members';
import {
	clearFailedSignIns,
	recordFailedSignIn,
	signInWait,
	signInWaitMessage,
	tooManyTries
} from '$lib/server/rate-limit';
import { clientAddress } from '$lib/server/client-address';

function safeNext(next: string | null): string {
	// Only same-site paths: never an open redirect.
	return next && next.startsWith('/') && !next.startsWith('//') ? next : '/';
}

export const load = (async ({ locals, url }) => {
	if (locals.user) redirect(303, safeNext(url.searchParams.get('next')));
	return { reset: url.searchParams.has('reset') };
}) satisfies PageServerLoad;

export const actions = {
	default: async (event) => {
		const { data, values, refused } = await readForm(event.request, signInSchema, { secret: ['password'] });
		if (refused) return fail(400, refused);

		const { email, password } = data;
		const address = clientAddress(event);
		const wait = await signInWait(email, address);
		if (wait) return tooManyTries(event, wait.ms, '_form', signInWaitMessage(wait), values);
		const user = await findByEmail(email);
		// The same answer and the same work whether or not the account exists.
		const ok = user ? await verifyPassword(user.password_hash, password) : await verifyDummy(password);
		if (!user || !ok) {
			await recordFailedSignIn(email, address);
			return fail(400, { errors: <FieldErrors>{ _form: 'That e-mail and password do not match an account.' }, values });
		}
		await clearFailedSignIns(email);
		const membership = await resolveMembership(user.id, null);
		await startSession(event.cookies, event.url, user.id, membership?.farmId ?? null);
		redirect(303, safeNext(event.url.searchParams.get('next')));
	}
} satisfies Actions;
