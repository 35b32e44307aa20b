import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { requireCan } from '$lib/server/guards';
import { devMailEnabled, listStoredMail } from '$lib/server/mail';

export const load = (async (event) => {
	requireCan(event, 'mail.read');
	// Only in development and demo mode, where the local mail fake stands in for real SMTP.
	if (!devMailEnabled()) error(404, 'No local mail fake is configured here.');
	return { mails: await listStoredMail(50) };
}) satisfies PageServerLoad;
