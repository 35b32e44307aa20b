import { fail } from '@sveltejs/kit';
import type { Actions } from './$types';
import { forgotSchema } from '$lib/schemas/auth';
import { fieldErrors } from '$lib/schemas/common';
import { findByEmail } from '$lib/server/users';
import { createPasswordReset } from '$lib/server/password-resets';
import { sendMail } from '$lib/server/mail';

export const actions = {
	default: async ({ request, url }) => {
		const form = Object.fromEntries(await request.formData());
		const values = { email: String(form.email ?? '') };
		const parsed = forgotSchema.safeParse(form);
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error), values });
		const user = await findByEmail(parsed.data.email);
		if (user) {
			const token = await createPasswordReset(user.id);
			const link = `${url.origin}/reset/${token}`;
			await sendMail({
				to: user.email,
				subject: 'Reset your Furrowcast password',
				text: `Someone asked to reset the password of your Furrowcast account.\n\nChoose a new password here (the link works once, for one hour):\n${link}\n\nIf it was not you, ignore this message; your password stays as it is.`,
				html: `<p>Someone asked to reset the password of your Furrowcast account.</p><p><a href="${link}">Choose a new password</a> (the link works once, for one hour).</p><p>If it was not you, ignore this message; your password stays as it is.</p>`
			});
		}
		// The same answer either way: this page does not tell who has an account.
		return { sent: true, values };
	}
} satisfies Actions;
