import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { devMailEnabled, listStoredMail } from '$lib/server/mail';
import { VIEWER_COOKIE, viewerMailboxes } from '$lib/server/signups';

// Demo mode only, like Mail (dev): no mail leaves the machine, so the browser that asked for a sign-up
// reads the mail about it here (its own sign-ups' addresses, tied to it by a cookie; nobody else's).
export const load = (async ({ cookies }) => {
	if (!devMailEnabled()) error(404, 'Not found');
	const mailboxes = await viewerMailboxes(cookies.get(VIEWER_COOKIE));
	return { mails: mailboxes.size ? await listStoredMail(mailboxes, 10) : [] };
}) satisfies PageServerLoad;
