// Sign-up, sign-in, sign-out, rate limits, password reset and cookies, against the running
// test server and the real MariaDB.
import { afterAll, describe, expect, it } from 'vitest';
import { Client, signedIn, html } from '../helpers/http';
import { closeTestDb, count, testDb, uniqueEmail } from '../helpers/db';
import { firstLink, waitForMail, waitForMailWith } from '../helpers/mail';
import { confirmationLink, confirmedSignUp } from '../helpers/signup';
import { demo } from '../helpers/env';

afterAll(closeTestDb);

function signUpFields(email: string): Record<string, string> {
	return {
		name: 'Test Grower',
		email,
		password: 'long-enough-pass',
		farmName: 'Test Plot (invented)',
		latitude: '44.5',
		lastSpringFrost: '2027-05-15',
		firstFallFrost: '2027-10-01'
	};
}

describe('sign-up', () => {
	it('creates a farm and its owner once the mailed link is followed, signs them in, and lands on the set-up path', async () => {
		const email = uniqueEmail('signup');
		const client = new Client();
		const asked = await client.postForm('/signup', signUpFields(email));
		expect(asked.status).toBe(200);
		expect(await html(asked)).toContain('Check your e-mail to finish');
		const link = await confirmationLink(email);
		// Opening the link only shows what it will make.
		const shown = await client.get(link);
		expect(shown.status).toBe(200);
		expect(await html(shown)).toContain('Test Plot (invented)');
		expect(await count('users', { email })).toBe(0);
		const res = await client.postForm(link, {});
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe('/setup');
		const user = await testDb()('users').where({ email }).first();
		expect(user).toBeTruthy();
		expect(user.password_hash).toMatch(/^\$argon2id\$/);
		const membership = await testDb()('farm_members').where({ user_id: user.id }).first();
		expect(membership.role).toBe('owner');
		const me = await client.get('/api/me');
		expect(me.status).toBe(200);
		expect((await me.json()).farm.role).toBe('owner');
	});

	it('sets the session cookie HttpOnly and SameSite=Lax', async () => {
		const client = new Client();
		await confirmedSignUp(client, signUpFields(uniqueEmail('cookie')));
		const cookie = client.lastSetCookie.find((c) => c.startsWith('fc_session='));
		expect(cookie).toBeDefined();
		expect(cookie).toMatch(/HttpOnly/i);
		expect(cookie).toMatch(/SameSite=Lax/i);
		// Loopback over plain http: Secure would make the browser drop it.
		expect(cookie).not.toMatch(/;\s*Secure/i);
	});

	const bad: [string, Record<string, string>, string, string][] = [
		['empty name', { name: '' }, 'name', 'Your name is required.'],
		['too long farm name', { farmName: 'x'.repeat(121) }, 'farmName', 'Farm name must be at most 120 characters.'],
		['latitude not a number', { latitude: 'north' }, 'latitude', 'Latitude must be a number.'],
		['script tag in the name', { name: '<script>alert(1)</script>' }, 'name', 'Your name may not contain < or >.'],
		['bad e-mail', { email: 'not-an-email' }, 'email', 'Enter a valid e-mail address'],
		['short password', { password: 'short' }, 'password', 'Password must be at least 10 characters.'],
		// Source: @zxcvbn-ts/core with its common-password dictionary (reference library from npm).
		['common password', { password: 'password12' }, 'password', 'This is a commonly used password.'],
		['ten spaces', { password: '          ' }, 'password', 'A password of only spaces is too easy to guess.'],
		['repeated letters', { password: 'aaaaaaaaaa' }, 'password', 'Repeated characters like "aaa" are easy to guess.'],
		[
			'impossible date',
			{ lastSpringFrost: '2027-02-30' },
			'lastSpringFrost',
			'Last spring frost is not a real calendar date.'
		]
	];
	for (const [what, change, field, message] of bad) {
		it(`refuses ${what} with a message at the ${field} field, writing nothing`, async () => {
			const email = uniqueEmail('bad');
			const before = await count('farms');
			const res = await new Client().postForm('/signup', { ...signUpFields(email), ...change });
			expect(res.status).toBe(400);
			const page = await html(res);
			expect(page).toContain(`id="field-${field}-error"`);
			expect(page).toContain(message);
			expect(await count('farms')).toBe(before);
			expect(await count('users', { email: (change.email ?? email).toLowerCase() })).toBe(0);
		});
	}

	it('answers a taken e-mail with "check your e-mail" (not "already exists") and writes no second farm', async () => {
		const before = await count('farms');
		const res = await new Client().postForm('/signup', signUpFields(demo.owner));
		expect(res.status).toBe(200);
		const page = await html(res);
		expect(page).toContain('Check your e-mail');
		expect(page).not.toContain('already exists');
		expect(await count('farms')).toBe(before);
	});
});

describe('sign-in and sign-out', () => {
	it('signs the demo owner in and out; the old session no longer works', async () => {
		const client = await signedIn(demo.owner, demo.password);
		expect((await client.get('/api/me')).status).toBe(200);
		const out = await client.postForm('/signout', {});
		expect(out.status).toBe(303);
		expect((await client.get('/api/me')).status).toBe(401);
	});

	it('says plainly when e-mail and password do not match', async () => {
		const res = await new Client().postForm('/signin', { email: demo.crew, password: 'wrong-password' });
		expect(res.status).toBe(400);
		expect(await html(res)).toContain('That e-mail and password do not match an account.');
	});

	it('slows failed attempts per account with a clear, short wait (see sign-in-limits.test.ts)', async () => {
		const email = uniqueEmail('limited');
		await confirmedSignUp(new Client(), signUpFields(email));
		for (let i = 0; i < 6; i++) await new Client().postForm('/signin', { email, password: 'wrong-password' });
		const res = await new Client().postForm('/signin', { email, password: 'long-enough-pass' });
		expect(res.status).toBe(429);
		expect(await html(res)).toMatch(
			/Too many wrong passwords for this account in a row\. Wait \d+ seconds?, then try again/
		);
	});
});

describe('password reset by e-mail', () => {
	it('refuses a weak new password at the reset form, saying why', async () => {
		const email = uniqueEmail('weakreset');
		await confirmedSignUp(new Client(), signUpFields(email));
		await new Client().postForm('/forgot', { email });
		const link = new URL(firstLink(await waitForMailWith(email, '/reset/'), '/reset/'));
		const res = await new Client().postForm(link.pathname, { password: 'password12', confirm: 'password12' });
		expect(res.status).toBe(400);
		expect(await html(res)).toContain('This is a commonly used password.');
		await expect(signedIn(email, 'long-enough-pass')).resolves.toBeInstanceOf(Client);
	});

	it('mails a one-time link that sets a new password', async () => {
		const email = uniqueEmail('reset');
		await confirmedSignUp(new Client(), signUpFields(email));
		const asked = await new Client().postForm('/forgot', { email });
		expect(asked.status).toBe(200);
		const mail = await waitForMailWith(email, '/reset/');
		expect(mail.subject).toContain('Reset your Furrowcast password');
		const link = new URL(firstLink(mail, '/reset/'));
		const done = await new Client().postForm(link.pathname, {
			password: 'a-brand-new-pass',
			confirm: 'a-brand-new-pass'
		});
		expect(done.status).toBe(303);
		expect(done.headers.get('location')).toBe('/signin?reset=1');
		await expect(signedIn(email, 'a-brand-new-pass')).resolves.toBeInstanceOf(Client);
		// The link works once.
		const again = await new Client().postForm(link.pathname, {
			password: 'another-new-pass',
			confirm: 'another-new-pass'
		});
		expect(again.status).toBe(400);
	});

	it('answers the same for an unknown e-mail and sends nothing', async () => {
		const email = uniqueEmail('nobody');
		const res = await new Client().postForm('/forgot', { email });
		expect(res.status).toBe(200);
		await expect(waitForMail(email, 800)).rejects.toThrow(/no mail/);
	});
});
