import { redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { lucia, clearSessionCookie } from '$lib/server/auth';

export const load = (() => redirect(303, '/')) satisfies PageServerLoad;

export const actions = {
	default: async ({ locals, cookies, url }) => {
		if (locals.sessionId) await lucia().invalidateSession(locals.sessionId);
		clearSessionCookie(cookies, url);
		redirect(303, '/signin');
	}
} satisfies Actions;
