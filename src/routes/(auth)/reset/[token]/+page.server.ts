import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { resetSchema } from '$lib/schemas/auth';
import { fieldErrors } from '$lib/schemas/common';
import { completePasswordReset, findPasswordReset } from '$lib/server/password-resets';

export const load = (async ({ params }) => {
	return { valid: (await findPasswordReset(params.token)) !== null };
}) satisfies PageServerLoad;

export const actions = {
	default: async ({ request, params }) => {
		const parsed = resetSchema.safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error) });
		const userId = await completePasswordReset(params.token, parsed.data.password);
		if (!userId)
			return fail(400, {
				errors: { _form: 'This reset link has expired or was already used. Ask for a new one.' } as Record<
					string,
					string
				>
			});
		redirect(303, '/signin?reset=1');
	}
} satisfies Actions;
