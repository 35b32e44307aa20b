// Sign-up as a person does it: the form answers "check your e-mail" whatever the address, and the farm
// is made when the link mailed to a new address is followed (its page's button posts the confirmation).
import type { Client } from './http';
import { firstLink, waitForMailWith } from './mail';

/** The link in the confirmation mail to `email` (the newest one). */
export async function confirmationLink(email: string): Promise<string> {
	const mail = await waitForMailWith(email, '/signup/confirm/');
	return new URL(firstLink(mail, '/signup/confirm/')).pathname;
}

/**
 * Posts the sign-up form and, when it is accepted (200, "check your e-mail"), follows the mailed link:
 * answers the confirmation's response (303 to /setup, signed in). A refused form's answer comes back as it is.
 */
export async function confirmedSignUp(client: Client, fields: Record<string, string | number>): Promise<Response> {
	const asked = await client.postForm('/signup', fields);
	if (asked.status !== 200) return asked;
	return client.postForm(await confirmationLink(String(fields.email)), {});
}
