import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { acceptInviteExistingSchema, acceptInviteSchema } from '$lib/schemas/auth';
import { fieldErrors } from '$lib/schemas/common';
import { acceptInvite, findInvite } from '$lib/server/invites';
import { startSession } from '$lib/server/auth';
import { roleLabels } from '$lib/roles';

export const load = (async ({ params }) => {
	const found = await findInvite(params.token);
	if (!found.ok) return { problem: found.reason, invite: null };
	const { farmName, email, role, expiresAt, accountExists } = found.invite;
	return {
		problem: null,
		invite: { farmName, email, role, roleLabel: roleLabels[role], expiresAt: expiresAt.toISOString(), accountExists }
	};
}) satisfies PageServerLoad;

export const actions = {
	default: async ({ request, params, cookies, url }) => {
		const found = await findInvite(params.token);
		if (!found.ok)
			return fail(400, {
				errors: { _form: found.reason } as Record<string, string>,
				values: {} as Record<string, string>
			});
		const form = Object.fromEntries(await request.formData());
		const values = { name: String(form.name ?? '') };
		const parsed = (found.invite.accountExists ? acceptInviteExistingSchema : acceptInviteSchema).safeParse(form);
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error), values });
		let userId: string;
		try {
			userId = await acceptInvite(found.invite, parsed.data.name, parsed.data.password);
		} catch (error) {
			return fail(400, { errors: { _form: (error as Error).message } as Record<string, string>, values });
		}
		await startSession(cookies, url, userId, found.invite.farmId);
		redirect(303, '/');
	}
} satisfies Actions;
