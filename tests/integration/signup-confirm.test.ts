// Sign-up tells nobody whether an address has an account: a new and a taken address get the same
// page, and only the mail differs (a link that creates the farm, or a note that an account exists).
// The link works once, for 24 hours; a later sign-up replaces it; it makes nothing when opened, only
// when its button is pressed. In demo mode the browser that asked reads its sign-up mail at /signup/mail.
import { afterAll, describe, expect, it } from 'vitest';
import { Client, html } from '../helpers/http';
import { closeTestDb, count, testDb, uniqueEmail } from '../helpers/db';
import { demo } from '../helpers/env';
import { waitForMailWith } from '../helpers/mail';
import { confirmationLink } from '../helpers/signup';

afterAll(closeTestDb);

const fields = (email: string, farmName = 'Confirm Plot (invented)'): Record<string, string> => ({
	name: 'Confirm Tester',
	email,
	password: 'long-enough-pass',
	farmName,
	latitude: '44',
	lastSpringFrost: '2027-05-15',
	firstFallFrost: '2027-10-01'
});

/** The page as a reader compares it: the address and per-response values (CSP nonces) taken out. */
async function shape(res: Response, email: string): Promise<string> {
	return (await html(res))
		.split(email)
		.join('ADDRESS')
		.replace(/nonce="[^"]*"/g, 'nonce=""')
		.replace(/'nonce-[^']*'/g, "'nonce-'");
}

describe('the sign-up answer', () => {
	it('is the same page for a new and a taken address, and writes no account before the link is followed', async () => {
		const fresh = uniqueEmail('fresh');
		const farmsBefore = await count('farms');
		const a = await new Client().postForm('/signup', fields(fresh));
		const b = await new Client().postForm('/signup', fields(demo.owner));
		expect([a.status, b.status]).toEqual([200, 200]);
		const [pa, pb] = [await shape(a, fresh), await shape(b, demo.owner)];
		expect(pa).toBe(pb);
		expect(pa).toContain('Check your e-mail to finish');
		expect(pa).not.toMatch(/already exists|An account with this e-mail/);
		expect(await count('users', { email: fresh })).toBe(0);
		expect(await count('farms')).toBe(farmsBefore);

		// The new address gets the link; the taken one a note with sign-in and reset links and no link to confirm.
		expect(await confirmationLink(fresh)).toMatch(/^\/signup\/confirm\/[A-Za-z0-9_-]+$/);
		const note = await waitForMailWith(demo.owner, 'already has an account');
		expect(note.text).toContain('/signin');
		expect(note.text).toContain('/forgot');
		expect(note.text).not.toContain('/signup/confirm/');
		expect(await count('farms')).toBe(farmsBefore);
	});
});

describe('the confirmation link', () => {
	it('shows what it makes, makes it once when confirmed, and signs the owner in', async () => {
		const email = uniqueEmail('confirm');
		await new Client().postForm('/signup', fields(email, 'Once Only Farm (invented)'));
		const link = await confirmationLink(email);
		// Opened (as a mail program's link check would): nothing is made.
		const shown = await new Client().get(link);
		expect(shown.status).toBe(200);
		const page = await html(shown);
		expect(page).toContain('Once Only Farm (invented)');
		expect(page).toContain(email);
		expect(await count('users', { email })).toBe(0);

		const client = new Client();
		const done = await client.postForm(link, {});
		expect(done.status).toBe(303);
		expect(done.headers.get('location')).toBe('/setup');
		const me = await client.get('/api/me');
		expect(me.status).toBe(200);
		expect((await me.json()).farm.role).toBe('owner');
		const user = await testDb()('users').where({ email }).first('id', 'password_hash');
		expect(user.password_hash).toMatch(/^\$argon2id\$/);
		const farm = await testDb()('farms as f')
			.join('farm_members as m', 'm.farm_id', 'f.id')
			.where({ 'm.user_id': user.id })
			.first('f.name', 'f.latitude', 'f.last_spring_frost', 'f.first_fall_frost', 'm.role');
		expect(farm).toEqual({
			name: 'Once Only Farm (invented)',
			latitude: '44.00000',
			last_spring_frost: '2027-05-15',
			first_fall_frost: '2027-10-01',
			role: 'owner'
		});

		// A second use makes nothing more.
		const again = await new Client().postForm(link, {});
		expect(again.status).toBe(400);
		expect(await html(again)).toContain('expired (after 24 hours) or was already used');
		expect(await count('users', { email })).toBe(1);
		expect(await count('farm_members', { user_id: user.id })).toBe(1);
	});

	it('has expired after 24 hours: nothing is made', async () => {
		const email = uniqueEmail('expired');
		await new Client().postForm('/signup', fields(email));
		const link = await confirmationLink(email);
		// A day has passed.
		await testDb()('signup_requests')
			.where({ email })
			.update({ expires_at: new Date(Date.now() - 1000) });
		expect(await html(await new Client().get(link))).toContain('This link has expired');
		const res = await new Client().postForm(link, {});
		expect(res.status).toBe(400);
		expect(await count('users', { email })).toBe(0);
	});

	it('is replaced by a later sign-up for the same address: the first link no longer works', async () => {
		const email = uniqueEmail('twice');
		await new Client().postForm('/signup', fields(email, 'First Try Farm (invented)'));
		const first = await confirmationLink(email);
		await new Client().postForm('/signup', fields(email, 'Second Try Farm (invented)'));
		let second = first;
		for (let i = 0; i < 100 && second === first; i++) {
			await new Promise((r) => setTimeout(r, 100));
			second = await confirmationLink(email);
		}
		expect(second).not.toBe(first);
		expect((await new Client().postForm(first, {})).status).toBe(400);
		expect((await new Client().postForm(second, {})).status).toBe(303);
		const user = await testDb()('users').where({ email }).first('id');
		const farm = await testDb()('farms as f')
			.join('farm_members as m', 'm.farm_id', 'f.id')
			.where({ 'm.user_id': user.id })
			.first('f.name');
		expect(farm.name).toBe('Second Try Farm (invented)');
	});

	it('makes nothing when the address got an account meanwhile (409)', async () => {
		const email = uniqueEmail('meanwhile');
		await new Client().postForm('/signup', fields(email));
		const link = await confirmationLink(email);
		// Meanwhile the address got an account (as accepting an invite would make it).
		await testDb()('users').insert({ id: `meanwhile-${Date.now()}`, email, name: 'Early', password_hash: 'x' });
		const farms = await count('farms');
		const res = await new Client().postForm(link, {});
		expect(res.status).toBe(409);
		expect(await html(res)).toContain('has an account by now');
		expect(await count('farms')).toBe(farms);
		expect(await count('users', { email })).toBe(1);
	});

	it('a made-up or malformed token makes nothing', async () => {
		const farms = await count('farms');
		for (const token of ['not-a-real-token-but-long-enough', 'x', '%00%27', 'a'.repeat(300)]) {
			const res = await new Client().postForm(`/signup/confirm/${token}`, {});
			expect([400, 404]).toContain(res.status);
		}
		expect(await count('farms')).toBe(farms);
	});
});

describe('sign-up mail in demo mode', () => {
	it('shows a browser the mail about its own sign-ups, and no one else the link', async () => {
		const email = uniqueEmail('viewer');
		const asker = new Client();
		const page = await asker.postForm('/signup', fields(email));
		expect(await html(page)).toContain('Read the sign-up mail here');
		const link = await confirmationLink(email);
		const own = await html(await asker.get('/signup/mail'));
		expect(own).toContain(link);
		const stranger = await html(await new Client().get('/signup/mail'));
		expect(stranger).not.toContain(link);
		expect(stranger).not.toContain(email);
		// The link as the mail page shows it creates the farm.
		expect((await asker.postForm(link, {})).status).toBe(303);
	});
});
