// The owner invites people by e-mail with a role; the link signs them up in that role, once,
// and expires.
import { afterAll, describe, expect, it } from 'vitest';
import { Client, signedIn, html } from '../helpers/http';
import { closeTestDb, count, testDb, uniqueEmail } from '../helpers/db';
import { firstLink, waitForMail } from '../helpers/mail';
import { demo } from '../helpers/env';

afterAll(closeTestDb);

describe('invites', () => {
	it('mails an invite whose link signs the person up with the invited role', async () => {
		const owner = await signedIn(demo.owner, demo.password);
		const email = uniqueEmail('invitee');
		const sent = await owner.postForm('/team?/invite', { email, role: 'share_manager' });
		expect(sent.status).toBe(303);
		const mail = await waitForMail(email);
		expect(mail.subject).toMatch(/invites you to .* on Furrowcast/);
		const link = new URL(firstLink(mail, '/invite/'));

		const invitee = new Client();
		const page = await invitee.get(link.pathname);
		expect(await html(page)).toContain('Share manager');
		const joined = await invitee.postForm(link.pathname, { name: 'New Share Manager', password: 'invited-pass-1' });
		expect(joined.status).toBe(303);
		const me = await (await invitee.get('/api/me')).json();
		expect(me.user.email).toBe(email);
		expect(me.farm.role).toBe('share_manager');

		// Used once: the same link is refused now.
		const again = await new Client().get(link.pathname);
		expect(await html(again)).toContain('This invite has already been used.');
	});

	it('refuses a weak password when accepting, saying why, and creates no account', async () => {
		const owner = await signedIn(demo.owner, demo.password);
		const email = uniqueEmail('weakinvitee');
		await owner.postForm('/team?/invite', { email, role: 'crew_lead' });
		const link = new URL(firstLink(await waitForMail(email), '/invite/'));
		const res = await new Client().postForm(link.pathname, { name: 'Weak Pass', password: 'aaaaaaaaaa' });
		expect(res.status).toBe(400);
		expect(await html(res)).toContain('Repeated characters like "aaa" are easy to guess.');
		expect(await count('users', { email })).toBe(0);
	});

	it('refuses an expired link', async () => {
		const owner = await signedIn(demo.owner, demo.password);
		const email = uniqueEmail('late');
		await owner.postForm('/team?/invite', { email, role: 'crew_lead' });
		const link = new URL(firstLink(await waitForMail(email), '/invite/'));
		await testDb()('invites')
			.where({ email })
			.update({ expires_at: new Date(Date.now() - 60_000) });
		const res = await new Client().postForm(link.pathname, { name: 'Too Late', password: 'invited-pass-1' });
		expect(res.status).toBe(400);
		expect(await html(res)).toContain('This invite link has expired.');
		expect(await count('users', { email })).toBe(0);
	});

	it('names the field for a bad e-mail or role, and sends nothing', async () => {
		const owner = await signedIn(demo.owner, demo.password);
		const before = await count('invites');
		const badEmail = await owner.postForm('/team?/invite', { email: 'nope', role: 'crew_lead' });
		expect(badEmail.status).toBe(400);
		expect(await html(badEmail)).toContain('Enter a valid e-mail address');
		const badRole = await owner.postForm('/team?/invite', { email: uniqueEmail('role'), role: 'admin' });
		expect(badRole.status).toBe(400);
		expect(await html(badRole)).toContain('Choose a role: owner, crew lead or share manager.');
		const member = await owner.postForm('/team?/invite', { email: demo.crew, role: 'crew_lead' });
		expect(await html(member)).toContain("is already on this farm's team.");
		expect(await count('invites')).toBe(before);
	});

	it('only the owner may invite', async () => {
		const crew = await signedIn(demo.crew, demo.password);
		const before = await count('invites');
		const res = await crew.postForm('/team?/invite', { email: uniqueEmail('sneaky'), role: 'owner' });
		expect(res.status).toBe(403);
		expect(await count('invites')).toBe(before);
	});
});
