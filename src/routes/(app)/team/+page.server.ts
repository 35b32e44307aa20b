import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';
import { requireCan } from '$lib/server/guards';
import { listMembers } from '$lib/server/members';
import { createInvite, listOpenInvites, revokeInvite } from '$lib/server/invites';
import { inviteSchema } from '$lib/schemas/auth';
import { fieldErrors, type FieldErrors } from '$lib/schemas/common';
import { sendMail } from '$lib/server/mail';
import { roleLabels } from '$lib/roles';

export const load = (async (event) => {
	const { farm } = requireCan(event, 'team.manage');
	const [members, invites] = await Promise.all([listMembers(farm.id), listOpenInvites(farm.id)]);
	return { members, invites, sent: event.url.searchParams.get('sent') };
}) satisfies PageServerLoad;

export const actions = {
	invite: async (event) => {
		const { farm, user } = requireCan(event, 'team.manage');
		const form = Object.fromEntries(await event.request.formData());
		const values = { email: String(form.email ?? ''), role: String(form.role ?? '') };
		const parsed = inviteSchema.safeParse(form);
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error), values });
		const members = await listMembers(farm.id);
		if (members.some((m) => m.email === parsed.data.email)) {
			return fail(400, { errors: <FieldErrors>{ email: `${parsed.data.email} is already on this farm's team.` }, values });
		}
		const { token, expiresAt } = await createInvite(farm.id, user.id, parsed.data.email, parsed.data.role);
		const link = `${event.url.origin}/invite/${token}`;
		const role = roleLabels[parsed.data.role].toLowerCase();
		const until = expiresAt.toISOString().slice(0, 10);
		await sendMail({
			to: parsed.data.email,
			subject: `${user.name} invites you to ${farm.name} on Furrowcast`,
			text: `${user.name} invites you to join ${farm.name} on Furrowcast as ${role}.\n\nAccept the invite here (the link works once, until ${until}):\n${link}\n`,
			html: `<p>${escapeHtml(user.name)} invites you to join <strong>${escapeHtml(farm.name)}</strong> on Furrowcast as ${role}.</p><p><a href="${link}">Accept the invite</a> (the link works once, until ${until}).</p>`
		});
		redirect(303, `/team?sent=${encodeURIComponent(parsed.data.email)}`);
	},
	revoke: async (event) => {
		const { farm } = requireCan(event, 'team.manage');
		await revokeInvite(farm.id, Number((await event.request.formData()).get('id')));
		redirect(303, '/team');
	}
} satisfies Actions;

function escapeHtml(s: string): string {
	return s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}
