// Mail (dev) shows only mail to the signed-in farm's own members and invitees, and exists only
// in demo mode. The path it closed: sign up a farm of your own, ask /forgot for another farm's
// member, read the reset link in your Mail (dev), and set that member's password.
import { afterAll, describe, expect, it } from 'vitest';
import { Client, html, signedIn } from '../helpers/http';
import { closeTestDb, uniqueEmail } from '../helpers/db';
import { demo } from '../helpers/env';
import { firstLink, waitForMail, waitForMailWith } from '../helpers/mail';
import { startSecondApp, type SecondApp } from '../helpers/second-app';
import { confirmedSignUp } from '../helpers/signup';

afterAll(closeTestDb);

async function signUpFarm(tag: string): Promise<{ client: Client; email: string }> {
	const email = uniqueEmail(tag);
	const client = new Client();
	const res = await confirmedSignUp(client, {
		name: 'Curious Grower',
		email,
		password: 'copper-kettle-orchard-41',
		farmName: 'Stray Field (invented)',
		latitude: '42',
		lastSpringFrost: '2027-04-28',
		firstFallFrost: '2027-10-12'
	});
	expect(res.status).toBe(303);
	return { client, email };
}

describe('Mail (dev) in demo mode', () => {
	it("a new farm does not see the reset link sent to another farm's member", async () => {
		const { client } = await signUpFarm('mail-attacker');
		expect((await new Client().postForm('/forgot', { email: demo.share })).status).toBe(200);
		const reset = firstLink(await waitForMailWith(demo.share, '/reset/'), '/reset/');
		const token = reset.split('/reset/')[1];

		const page = await client.get('/dev/mail');
		expect(page.status).toBe(200);
		const text = await html(page);
		expect(text).not.toContain(token);
		expect(text).not.toContain(demo.share);

		// The demo farm's owner, whose member it is, does see it.
		const owner = await signedIn(demo.owner, demo.password);
		expect(await html(await owner.get('/dev/mail'))).toContain(token);
	});

	it("inviting another farm's member does not open their mail to the inviting farm", async () => {
		const { client } = await signUpFarm('mail-inviter');
		const invited = await client.postForm('/team?/invite', { email: demo.crew, role: 'crew_lead' });
		expect(invited.status).toBe(303);
		await new Client().postForm('/forgot', { email: demo.crew });
		const token = firstLink(await waitForMailWith(demo.crew, '/reset/'), '/reset/').split('/reset/')[1];
		// The newest mail to crew@ is the reset; the inviter's page shows neither it nor the invite.
		const text = await html(await client.get('/dev/mail'));
		expect(text).not.toContain(token);
		expect(text).not.toContain(demo.crew);
	});

	it("an address two farms invited is shown to neither, so one farm cannot take the other's invite", async () => {
		const shared = uniqueEmail('invited-twice');
		const owner = await signedIn(demo.owner, demo.password);
		expect((await owner.postForm('/team?/invite', { email: shared, role: 'crew_lead' })).status).toBe(303);
		const demoInvite = firstLink(await waitForMail(shared), '/invite/');
		// Before the second farm invites it, the demo owner sees the invite to its own invitee.
		expect(await html(await owner.get('/dev/mail'))).toContain(demoInvite);

		const { client } = await signUpFarm('mail-second-inviter');
		expect((await client.postForm('/team?/invite', { email: shared, role: 'owner' })).status).toBe(303);
		expect(await html(await client.get('/dev/mail'))).not.toContain(demoInvite);
	});
});

describe('Mail (dev) outside demo mode', () => {
	let app: SecondApp | undefined;
	afterAll(() => app?.stop());

	it('answers 404 for the owner and has no link, when the app runs without FC_DEMO_MODE', async () => {
		app = await startSecondApp({ FC_DEMO_MODE: undefined });
		const base = app.base;
		const body = new URLSearchParams({ email: demo.owner, password: demo.password });
		const signin = await fetch(`${base}/signin`, {
			method: 'POST',
			body,
			redirect: 'manual',
			headers: { origin: base, accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded' }
		});
		expect(signin.status).toBe(303);
		const cookie = signin.headers
			.getSetCookie()
			.map((c) => c.split(';')[0])
			.join('; ');
		const mail = await fetch(`${base}/dev/mail`, { headers: { cookie, accept: 'text/html' }, redirect: 'manual' });
		expect(mail.status).toBe(404);
		const home = await (
			await fetch(`${base}/`, { headers: { cookie, accept: 'text/html' }, redirect: 'manual' })
		).text();
		expect(home).toContain('Team');
		expect(home).not.toContain('Mail (dev)');
		expect(home).not.toContain('href="/dev/mail"');
	});
});
