// Password guessing is slowed, never turned into a lockout of the real owner: failures per account and
// per client address each ask for a wait that doubles (1 s, 2 s, 4 s, ...) once a few free tries are
// spent, up to a cap; a successful sign-in or a password reset clears the account's count; the message
// says which count and how long; behind a proxy the address comes from ADDRESS_HEADER.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, html, signedIn } from '../helpers/http';
import { closeTestDb, uniqueEmail } from '../helpers/db';
import { firstLink, waitForMailWith } from '../helpers/mail';
import { demo } from '../helpers/env';
import { confirmedSignUp } from '../helpers/signup';
import { startSecondApp, type SecondApp } from '../helpers/second-app';

afterAll(closeTestDb);

const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));
const password = 'long-enough-pass';

async function newAccount(tag: string): Promise<string> {
	const email = uniqueEmail(tag);
	const res = await confirmedSignUp(new Client(), {
		name: 'Limit Tester',
		email,
		password,
		farmName: 'Limit Plot (invented)',
		latitude: '44',
		lastSpringFrost: '2027-05-15',
		firstFallFrost: '2027-10-01'
	});
	expect(res.status).toBe(303);
	return email;
}

const signIn = (email: string, pass: string) => new Client().postForm('/signin', { email, password: pass });

describe('per account (default limits: 5 free failures, then 1 s doubling to 1 minute)', () => {
	it('asks for a short, growing wait and says so; after the wait the right password works', async () => {
		const email = await newAccount('slowdown');
		for (let i = 0; i < 6; i++) expect((await signIn(email, 'wrong-password')).status).toBe(400);
		// The 6th failure asked for 1 second: even the right password waits, and is told exactly that.
		const early = await signIn(email, password);
		expect(early.status).toBe(429);
		expect(early.headers.get('retry-after')).toBe('1');
		expect(await html(early)).toContain(
			'Too many wrong passwords for this account in a row. Wait 1 second, then try again'
		);
		await pause(1100);
		expect((await signIn(email, 'wrong-password')).status).toBe(400);
		const twice = await signIn(email, password);
		expect(twice.status).toBe(429);
		expect(await html(twice)).toContain('Wait 2 seconds');
		await pause(2100);
		expect((await signIn(email, password)).status).toBe(303);
		// A success clears the count: five more failures are free again.
		for (let i = 0; i < 5; i++) expect((await signIn(email, 'wrong-password')).status).toBe(400);
		expect((await signIn(email, password)).status).toBe(303);
	});

	it('a password reset lifts the wait at once, as the message says', async () => {
		const email = await newAccount('resetlifts');
		for (let i = 0; i < 7; i++) await signIn(email, 'wrong-password');
		expect((await signIn(email, password)).status).toBe(429);
		expect((await new Client().postForm('/forgot', { email })).status).toBe(200);
		const link = new URL(firstLink(await waitForMailWith(email, '/reset/'), '/reset/'));
		expect(
			(await new Client().postForm(link.pathname, { password: 'fresh-reset-pass', confirm: 'fresh-reset-pass' })).status
		).toBe(303);
		expect((await signIn(email, 'fresh-reset-pass')).status).toBe(303);
	});

	it("one account's failures do not slow another account", async () => {
		const email = await newAccount('noisy');
		for (let i = 0; i < 7; i++) await signIn(email, 'wrong-password');
		expect((await signIn(email, password)).status).toBe(429);
		await expect(signedIn(demo.share, demo.password)).resolves.toBeInstanceOf(Client);
	});
});

describe('behind a proxy: per client address from ADDRESS_HEADER, and the account cap', () => {
	let second: SecondApp;
	let app: {
		postForm(path: string, fields: Record<string, string>, headers: Record<string, string>): Promise<Response>;
	};
	beforeAll(async () => {
		second = await startSecondApp({
			ADDRESS_HEADER: 'x-real-ip',
			FC_SIGNIN_ADDRESS_FREE: '3',
			FC_SIGNIN_ACCOUNT_MAX_WAIT: '2',
			FC_FORGOT_ADDRESS_LIMIT: '2',
			FC_SIGNUP_ADDRESS_LIMIT: '1'
		});
		// A browser's form post as the proxy passes it on, with the client's address in the header.
		app = {
			postForm: (path, fields, headers) =>
				fetch(second.base + path, {
					method: 'POST',
					body: new URLSearchParams(fields),
					redirect: 'manual',
					headers: {
						origin: second.base,
						accept: 'text/html',
						'content-type': 'application/x-www-form-urlencoded',
						...headers
					}
				})
		};
	});
	afterAll(() => second?.stop());

	// Addresses from the documentation ranges (RFC 5737), random per run.
	const address = () => `203.0.113.${Math.floor(Math.random() * 250) + 1}`;
	const from = (ip: string) => ({ 'x-real-ip': ip });

	it('slows the guessing address only; the owner signs in from another address meanwhile', async () => {
		const guesser = address();
		let owner = address();
		while (owner === guesser) owner = address();
		for (let i = 0; i < 4; i++) {
			const res = await app.postForm(
				'/signin',
				{ email: uniqueEmail(`guess${i}`), password: 'wrong-password' },
				from(guesser)
			);
			expect(res.status).toBe(400);
		}
		const blocked = await app.postForm('/signin', { email: demo.owner, password: demo.password }, from(guesser));
		expect(blocked.status).toBe(429);
		expect(await html(blocked)).toContain('Too many failed sign-ins from your network address. Wait 1 second');
		const fine = await app.postForm('/signin', { email: demo.owner, password: demo.password }, from(owner));
		expect(fine.status).toBe(303);
	});

	it('the account wait never grows past its cap (2 s here, 1 minute by default)', async () => {
		const email = await newAccount('capped');
		const ip = () => from(address());
		for (let i = 0; i < 6; i++) await app.postForm('/signin', { email, password: 'wrong-password' }, ip());
		await pause(1100);
		await app.postForm('/signin', { email, password: 'wrong-password' }, ip());
		await pause(2100);
		await app.postForm('/signin', { email, password: 'wrong-password' }, ip());
		// The 8th failure would ask 4 s uncapped.
		const res = await app.postForm('/signin', { email, password }, ip());
		expect(res.status).toBe(429);
		expect(res.headers.get('retry-after')).toBe('2');
		await pause(2100);
		expect((await app.postForm('/signin', { email, password }, ip())).status).toBe(303);
	});

	it('throttles reset requests and sign-ups per address, saying so', async () => {
		const ip = from(address());
		for (let i = 0; i < 2; i++)
			expect((await app.postForm('/forgot', { email: uniqueEmail('f') }, ip)).status).toBe(200);
		const third = await app.postForm('/forgot', { email: uniqueEmail('f') }, ip);
		expect(third.status).toBe(429);
		expect(await html(third)).toContain('Too many reset requests from your network address.');
		const fields = {
			name: 'Throttle',
			password,
			farmName: 'T (invented)',
			latitude: '44',
			lastSpringFrost: '2027-05-15',
			firstFallFrost: '2027-10-01'
		};
		expect((await app.postForm('/signup', { ...fields, email: uniqueEmail('su') }, ip)).status).toBe(200);
		const again = await app.postForm('/signup', { ...fields, email: uniqueEmail('su') }, ip);
		expect(again.status).toBe(429);
		expect(await html(again)).toContain('Too many new farms from your network address.');
	});
});
