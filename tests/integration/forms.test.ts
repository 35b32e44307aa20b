// Bad input on the remaining forms (sign-in, forgotten password, reset, invite acceptance, new
// block) gives a message at the field and writes nothing.
import { afterAll, describe, expect, it } from 'vitest';
import { Client, html, signedIn } from '../helpers/http';
import { closeTestDb, count, testDb, uniqueEmail } from '../helpers/db';
import { firstLink, waitForMail, waitForMailWith } from '../helpers/mail';
import { demo } from '../helpers/env';
import { confirmedSignUp } from '../helpers/signup';

afterAll(closeTestDb);

async function expectFieldError(res: Response, field: string, message: string): Promise<void> {
	expect(res.status).toBe(400);
	const page = await html(res);
	expect(page).toContain(`id="field-${field}-error"`);
	expect(page).toContain(message);
}

describe('sign-in form', () => {
	it('names an empty e-mail and an empty password', async () => {
		const res = await new Client().postForm('/signin', { email: '', password: '' });
		const page = await html(res);
		expect(res.status).toBe(400);
		expect(page).toContain('E-mail is required.');
		expect(page).toContain('Password is required.');
	});
	it('names an over-long password', async () => {
		await expectFieldError(
			await new Client().postForm('/signin', { email: demo.owner, password: 'x'.repeat(201) }),
			'password',
			'Password must be at most 200 characters.'
		);
	});
});

describe('forgotten password form', () => {
	it('names a malformed e-mail and sends nothing', async () => {
		await expectFieldError(
			await new Client().postForm('/forgot', { email: 'owner at farm' }),
			'email',
			'Enter a valid e-mail address'
		);
	});
});

describe('reset form', () => {
	it('names a short password and a mismatch, and the link still works afterwards', async () => {
		const email = uniqueEmail('resetform');
		await confirmedSignUp(new Client(), {
			name: 'Reset Form',
			email,
			password: 'long-enough-pass',
			farmName: 'Reset Farm (invented)',
			latitude: '44',
			lastSpringFrost: '2027-05-10',
			firstFallFrost: '2027-10-01'
		});
		await new Client().postForm('/forgot', { email });
		const path = new URL(firstLink(await waitForMailWith(email, '/reset/'), '/reset/')).pathname;
		await expectFieldError(
			await new Client().postForm(path, { password: 'short', confirm: 'short' }),
			'password',
			'Password must be at least 10 characters.'
		);
		await expectFieldError(
			await new Client().postForm(path, { password: 'long-enough-1', confirm: 'long-enough-2' }),
			'confirm',
			'The two passwords differ.'
		);
		expect((await new Client().postForm(path, { password: 'long-enough-3', confirm: 'long-enough-3' })).status).toBe(
			303
		);
	});
});

describe('invite acceptance form', () => {
	it('names an empty name and a script tag, and creates no account', async () => {
		const owner = await signedIn(demo.owner, demo.password);
		const email = uniqueEmail('acceptform');
		await owner.postForm('/team?/invite', { email, role: 'crew_lead' });
		const path = new URL(firstLink(await waitForMail(email), '/invite/')).pathname;
		await expectFieldError(
			await new Client().postForm(path, { name: '', password: 'long-enough-pass' }),
			'name',
			'Your name is required.'
		);
		await expectFieldError(
			await new Client().postForm(path, { name: '<img src=x onerror=alert(1)>', password: 'long-enough-pass' }),
			'name',
			'Your name may not contain < or >.'
		);
		await expectFieldError(
			await new Client().postForm(path, { name: 'N'.repeat(121), password: 'long-enough-pass' }),
			'name',
			'Your name must be at most 120 characters.'
		);
		expect(await count('users', { email })).toBe(0);
		expect((await testDb()('invites').where({ email }).first('accepted_at')).accepted_at).toBeNull();
	});
});

describe('new block form', () => {
	it('names an empty, a duplicate and an over-long block name', async () => {
		const owner = new Client();
		const email = uniqueEmail('blockform');
		await confirmedSignUp(owner, {
			name: 'Block Form',
			email,
			password: 'long-enough-pass',
			farmName: 'Block Farm (invented)',
			latitude: '44',
			lastSpringFrost: '2027-05-10',
			firstFallFrost: '2027-10-01'
		});
		await expectFieldError(
			await owner.postForm('/settings?/addBlock', { name: '' }),
			'name',
			'Block name is required.'
		);
		expect((await owner.postForm('/settings?/addBlock', { name: 'West' })).status).toBe(303);
		await expectFieldError(
			await owner.postForm('/settings?/addBlock', { name: 'West' }),
			'name',
			'A block named "West" already exists.'
		);
		await expectFieldError(
			await owner.postForm('/settings?/addBlock', { name: 'W'.repeat(61) }),
			'name',
			'Block name must be at most 60 characters.'
		);
		const u = await testDb()('users').where({ email }).first('id');
		const farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
		expect(await count('blocks', { farm_id: farmId })).toBe(1);
	});
});
