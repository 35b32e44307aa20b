import { fail, redirect } from '@sveltejs/kit';
import type { Actions, PageServerLoad, RequestEvent } from './$types';
import { requireCan } from '$lib/server/guards';
import { changeMember, LastOwnerError, listMembers } from '$lib/server/members';
import { createInvite, listOpenInvites, renewInvite, revokeInvite, sendInvite } from '$lib/server/invites';
import { endSessionsOf } from '$lib/server/auth';
import { inviteIdSchema, inviteSchema, memberRoleSchema, memberSchema } from '$lib/schemas/auth';
import { fieldErrors, type FieldErrors } from '$lib/schemas/common';
import type { Role } from '$lib/roles';

export const load = (async (event) => {
	const { farm, user } = requireCan(event, 'team.manage');
	const [members, invites] = await Promise.all([listMembers(farm.id), listOpenInvites(farm.id)]);
	const q = event.url.searchParams;
	return {
		members,
		invites,
		me: user.id,
		sent: q.get('sent'),
		unsent: q.get('unsent'),
		changed: q.get('changed'),
		removed: q.get('removed')
	};
}) satisfies PageServerLoad;

/** Changes a role or removes a member; the member's sessions on this farm end at once. */
async function memberAction(event: RequestEvent, remove: boolean) {
	const { farm, user } = requireCan(event, 'team.manage');
	const form = Object.fromEntries(await event.request.formData());
	const parsed = remove ? memberSchema.safeParse(form) : memberRoleSchema.safeParse(form);
	const userId = String(form.userId ?? '').slice(0, 40);
	if (!parsed.success) return fail(400, { member: { userId, errors: fieldErrors(parsed.error) } });
	const role: Role | null = 'role' in parsed.data ? (parsed.data.role as Role) : null;
	const who = (await listMembers(farm.id)).find((m) => m.userId === parsed.data.userId);
	try {
		if (!who || !(await changeMember(farm.id, parsed.data.userId, role))) {
			return fail(404, {
				member: { userId, errors: <FieldErrors>{ userId: "This person is not on the farm's team (any more)." } }
			});
		}
	} catch (error) {
		if (error instanceof LastOwnerError)
			return fail(409, { member: { userId, errors: <FieldErrors>{ role: error.message } } });
		throw error;
	}
	await endSessionsOf(parsed.data.userId, farm.id);
	if (parsed.data.userId === user.id) redirect(303, '/signin');
	redirect(
		303,
		remove ? `/team?removed=${encodeURIComponent(who.name)}` : `/team?changed=${encodeURIComponent(who.name)}`
	);
}

export const actions = {
	invite: async (event) => {
		const { farm, user } = requireCan(event, 'team.manage');
		const form = Object.fromEntries(await event.request.formData());
		const values = { email: String(form.email ?? ''), role: String(form.role ?? '') };
		const parsed = inviteSchema.safeParse(form);
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error), values });
		const members = await listMembers(farm.id);
		if (members.some((m) => m.email === parsed.data.email)) {
			return fail(400, {
				errors: <FieldErrors>{ email: `${parsed.data.email} is already on this farm's team.` },
				values
			});
		}
		// Committed first, mailed after: a failed mail leaves the invite listed as not sent, with Resend.
		const invite = await createInvite(farm.id, user.id, parsed.data.email, parsed.data.role);
		const sent = await sendInvite(farm.id, invite, {
			inviter: user.name,
			farmName: farm.name,
			origin: event.url.origin
		});
		redirect(303, `/team?${sent ? 'sent' : 'unsent'}=${encodeURIComponent(parsed.data.email)}`);
	},
	resend: async (event) => {
		const { farm, user } = requireCan(event, 'team.manage');
		const parsed = inviteIdSchema.safeParse(Object.fromEntries(await event.request.formData()));
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error), values: { email: '', role: '' } });
		const invite = await renewInvite(farm.id, parsed.data.id);
		if (!invite)
			return fail(404, {
				errors: <FieldErrors>{ _form: 'That invite is no longer open.' },
				values: { email: '', role: '' }
			});
		const sent = await sendInvite(farm.id, invite, {
			inviter: user.name,
			farmName: farm.name,
			origin: event.url.origin
		});
		redirect(303, `/team?${sent ? 'sent' : 'unsent'}=${encodeURIComponent(invite.email)}`);
	},
	revoke: async (event) => {
		const { farm } = requireCan(event, 'team.manage');
		const parsed = inviteIdSchema.safeParse(Object.fromEntries(await event.request.formData()));
		if (!parsed.success) return fail(400, { errors: fieldErrors(parsed.error), values: { email: '', role: '' } });
		await revokeInvite(farm.id, parsed.data.id);
		redirect(303, '/team');
	},
	role: (event) => memberAction(event, false),
	remove: (event) => memberAction(event, true)
} satisfies Actions;
