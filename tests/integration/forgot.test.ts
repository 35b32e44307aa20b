// "Forgot your password" and sign-up tell no one which addresses have accounts: the same status and
// page for every address, mail sent after the answer (so neither a slow nor a failing mail server shows
// in the answer), one live reset link per account, and a per-account cap on reset mail.
import { afterAll, describe, expect, it } from 'vitest';
import { readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { Client, html } from '../helpers/http';
import { closeTestDb, count, testDb, uniqueEmail } from '../helpers/db';
import { firstLink, waitForMail } from '../helpers/mail';
import { demo } from '../helpers/env';
import { confirmedSignUp } from '../helpers/signup';

afterAll(closeTestDb);

async function newAccount(tag: string): Promise<string> {
	// Made through the sign-up's mailed link at an ordinary address, then moved to the test's own address
	// (the mail fake refuses or holds mail to some, which the tests below rely on).
	const made = uniqueEmail('account');
	const res = await confirmedSignUp(new Client(), {
		name: 'Reset Tester',
		email: made,
		password: 'long-enough-pass',
		farmName: 'Reset Plot (invented)',
		latitude: '44',
		lastSpringFrost: '2027-05-15',
		firstFallFrost: '2027-10-01'
	});
	expect(res.status).toBe(303);
	const email = uniqueEmail(tag);
	await testDb()('users').where({ email: made }).update({ email });
	return email;
}

/** The messages the mail fake has kept for an address so far. */
async function mailsTo(email: string): Promise<{ subject: string; text: string }[]> {
	const dir = process.env.FC_MAIL_DIR!;
	const names = (await readdir(dir).catch(() => [] as string[])).filter((n) => n.endsWith('.json')).sort();
	const all = await Promise.all(
		names.map(
			async (n) => JSON.parse(await readFile(join(dir, n), 'utf8')) as { to: string[]; subject: string; text: string }
		)
	);
	return all.filter((m) => m.to.includes(email));
}

/** A page's text with the one address it echoes (and the per-response CSP nonce) taken out, to compare two answers. */
async function answer(res: Response, email: string): Promise<string> {
	return (await html(res))
		.split(email)
		.join('ADDRESS')
		.replace(/nonce="[^"]*"/g, 'nonce=""');
}

const ask = (email: string) => new Client().postForm('/forgot', { email });

describe('/forgot answers alike for every address', () => {
	it('the same status and page for an account and for no account', async () => {
		const known = await newAccount('known');
		const unknown = uniqueEmail('unknown');
		const [a, b] = [await ask(known), await ask(unknown)];
		expect(a.status).toBe(200);
		expect(b.status).toBe(200);
		const [pa, pb] = [await answer(a, known), await answer(b, unknown)];
		expect(pa).toBe(pb);
		expect(pa).toContain('If an account uses ADDRESS, a reset link is on its way.');
		expect((await waitForMail(known)).subject).toContain('Reset your Furrowcast password');
		await expect(waitForMail(unknown, 800)).rejects.toThrow(/no mail/);
	});

	it('answers before the mail server has taken the message (a slow server does not show)', async () => {
		// The mail fake holds messages to "slow-" addresses for 4 s before accepting them.
		const known = await newAccount('slow');
		const res = await ask(known);
		expect(res.status).toBe(200);
		const nobody = uniqueEmail('nobody');
		expect(await answer(res, known)).toBe(await answer(await ask(nobody), nobody));
		// The answer is here, and the message is not yet: the request did not wait for the send.
		expect(await mailsTo(known)).toHaveLength(0);
		expect((await waitForMail(known, 15_000)).subject).toContain('Reset your Furrowcast password');
	});

	it('answers 200 and the same page when the mail server refuses the message', async () => {
		const known = await newAccount('undeliverable');
		const res = await ask(known);
		expect(res.status).toBe(200);
		expect(await answer(res, known)).toContain('If an account uses ADDRESS, a reset link is on its way.');
		const other = await ask(uniqueEmail('nobody'));
		expect(await html(other)).toContain('a reset link is on its way');
	});
});

describe('reset links', () => {
	it('a new request replaces the earlier link: one live link per account', async () => {
		const email = await newAccount('onelink');
		await ask(email);
		const first = new URL(firstLink(await waitForMail(email), '/reset/'));
		await ask(email);
		const until = Date.now() + 10_000;
		let second = first;
		while (second.pathname === first.pathname && Date.now() < until) {
			await new Promise((r) => setTimeout(r, 100));
			second = new URL(firstLink(await waitForMail(email), '/reset/'));
		}
		expect(second.pathname).not.toBe(first.pathname);
		const user = await testDb()('users').where({ email }).first('id');
		expect(await count('password_resets', { user_id: user.id, used_at: null })).toBe(1);
		expect(
			(await new Client().postForm(first.pathname, { password: 'fresh-reset-pass', confirm: 'fresh-reset-pass' }))
				.status
		).toBe(400);
		expect(
			(await new Client().postForm(second.pathname, { password: 'fresh-reset-pass', confirm: 'fresh-reset-pass' }))
				.status
		).toBe(303);
	});

	it('at most 3 reset mails an hour per account, while the answer stays the same', async () => {
		const email = await newAccount('capmail');
		const pages = new Set<string>();
		for (let i = 0; i < 6; i++) {
			const res = await ask(email);
			expect(res.status).toBe(200);
			pages.add(await answer(res, email));
		}
		expect(pages.size).toBe(1);
		await new Promise((r) => setTimeout(r, 1500));
		expect((await mailsTo(email)).filter((m) => m.subject.includes('Reset'))).toHaveLength(3);
	});
});

describe('sign-up with an address that has an account', () => {
	it('says "check your e-mail" as the reset page does, writes nothing, and mails the holder a note', async () => {
		const before = await count('farms');
		const res = await new Client().postForm('/signup', {
			name: 'Someone',
			email: demo.crew,
			password: 'long-enough-pass',
			farmName: 'Copycat (invented)',
			latitude: '44',
			lastSpringFrost: '2027-05-15',
			firstFallFrost: '2027-10-01'
		});
		expect(res.status).toBe(200);
		const page = await html(res);
		expect(page).toContain('Check your e-mail');
		expect(page).not.toContain('already exists');
		expect(page).not.toContain('An account with this e-mail');
		expect(await count('farms')).toBe(before);
		const until = Date.now() + 10_000;
		let notes: { subject: string }[] = [];
		while (Date.now() < until && notes.length === 0) {
			notes = (await mailsTo(demo.crew)).filter(
				(m) => m.subject === 'Someone tried to create a Furrowcast farm with your address'
			);
			if (notes.length === 0) await new Promise((r) => setTimeout(r, 100));
		}
		expect(notes).toHaveLength(1);
	});
});
