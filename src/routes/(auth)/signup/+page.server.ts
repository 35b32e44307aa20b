import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { signUpSchema } from '$lib/schemas/auth';
import { fieldErrors, type FieldErrors } from '$lib/schemas/common';
import { DuplicateEmailError, signUp } from '$lib/server/users';
import { startSession } from '$lib/server/auth';

export const load = (async ({ locals }) => {
	if (locals.user) redirect(303, '/');
	return {};
}) satisfies PageServerLoad;

export const actions = {
	default: async ({ request, cookies, url }) => {
		const form = Object.fromEntries(await request.formData());
		const { password: _password, ...values } = Object.fromEntries(Object.entries(form).map(([k, v]) => [k, String(v)]));
		const parsed = signUpSchema.safeParse(form);
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error), values });
		try {
			const { userId, farmId } = await signUp(parsed.data);
			await startSession(cookies, url, userId, farmId);
		} catch (error) {
			if (error instanceof DuplicateEmailError) return fail(400, { errors: { email: error.message } as FieldErrors, values });
			throw error;
		}
		redirect(303, '/setup');
	}
} satisfies Actions;
