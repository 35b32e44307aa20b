import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { requireCan } from '$lib/server/guards';
import { devMailEnabled, farmMailboxes, listStoredMail } from '$lib/server/mail';

export const load = (async (event) => {
	// Only in demo mode, where the local mail fake stands in for real SMTP; elsewhere the page
	// does not exist, for any role.
	if (!devMailEnabled()) error(404, 'Not found');
	const { farm } = requireCan(event, 'mail.read');
	return { mails: await listStoredMail(await farmMailboxes(farm.id), 50) };
}) satisfies PageServerLoad;
