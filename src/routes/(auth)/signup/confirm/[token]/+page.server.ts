import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { startSession } from '$lib/server/auth';
import { confirmSignUp, findSignUp } from '$lib/server/signups';

// Opening the mailed link only shows what it will create: a mail program or scanner that fetches the
// link makes nothing. The button (POST) creates the farm and signs in.
export const load = (async ({ params }) => {
	const pending = await findSignUp(params.token);
	return { pending: pending ? { email: pending.email, farmName: pending.farmName } : null };
}) satisfies PageServerLoad;

export const actions = {
	default: async ({ params, cookies, url }) => {
		const out = await confirmSignUp(params.token);
		if (!out.ok && out.reason === 'taken')
			return fail(409, {
				error: `${out.email} has an account by now, so no new farm was made. Sign in, or choose a new password.`
			});
		if (!out.ok)
			return fail(400, {
				error: 'This link has expired (after 24 hours) or was already used. Sign up again for a new one.'
			});
		await startSession(cookies, url, out.userId, out.farmId);
		redirect(303, '/setup');
	}
} satisfies Actions;
