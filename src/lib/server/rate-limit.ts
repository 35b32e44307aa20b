// Slowing down password guessing without locking anyone out, counted in MariaDB (rate-limiter-flexible)
// so every app server shares one count.
//
// Sign-in: failures are counted per account and per client address. The first few are free; after that
// each failure asks for a wait before the next try, doubling from 1 second up to a cap: 1 minute per
// account (so the real owner, signing in from anywhere, waits at most a minute however hard someone
// else guesses) and 15 minutes per address (the guesser's own). A successful sign-in or password reset
// clears the account's count. Counts are forgotten an hour after they began.
// Password-reset mail and sign-up are throttled per address (and reset mail per account, silently,
// so its answer stays the same for every address).
// The client address is the socket's, or behind a proxy the one adapter-node reads from ADDRESS_HEADER.
import { RateLimiterMySQL, type RateLimiterRes } from 'rate-limiter-flexible';
import { env } from '$env/dynamic/private';
import { fail } from '@sveltejs/kit';
import type { FieldErrors } from '$lib/schemas/common';
import { db } from './db';

const hour = 3600;

function setting(name: string, fallback: number): number {
	const value = Number(env[name] ?? fallback);
	return Number.isFinite(value) && value >= 0 ? value : fallback;
}

function limiter(keyPrefix: string, points: number, duration: number): RateLimiterMySQL {
	return new RateLimiterMySQL({
		storeClient: db(),
		storeType: 'knex',
		dbName: env.FC_DB_NAME,
		tableName: 'rate_limits',
		tableCreated: true, // the migration made it; the app account may not create tables
		keyPrefix,
		points,
		duration
	});
}

/** Failures counted under one key, with a doubling wait once the free ones are spent. */
class GrowingDelay {
	private readonly count: RateLimiterMySQL;
	private readonly wait: RateLimiterMySQL;
	constructor(
		prefix: string,
		readonly free: number,
		private readonly maxWaitSeconds: number
	) {
		this.count = limiter(`${prefix}_count`, 1_000_000, hour);
		this.wait = limiter(`${prefix}_wait`, 1, hour);
	}

	/** Milliseconds until this key may try again, or 0. */
	async waitMs(key: string): Promise<number> {
		const res = await this.wait.get(key);
		return res && res.consumedPoints > 1 ? res.msBeforeNext : 0;
	}

	/** Counts one failure and sets the wait before the next try. */
	async fail(key: string): Promise<void> {
		const res: RateLimiterRes = await this.count.consume(key);
		const beyond = res.consumedPoints - this.free;
		if (beyond > 0) await this.wait.block(key, Math.min(this.maxWaitSeconds, 2 ** Math.min(beyond - 1, 20)));
	}

	async clear(key: string): Promise<void> {
		await Promise.all([this.count.delete(key), this.wait.delete(key)]);
	}
}

interface Limits {
	signInAccount: GrowingDelay;
	signInAddress: GrowingDelay;
	forgotAccount: RateLimiterMySQL;
	forgotAddress: RateLimiterMySQL;
	signUpAddress: RateLimiterMySQL;
	signUpMail: RateLimiterMySQL;
}

let limits: Limits | undefined;
function get(): Limits {
	limits ??= {
		signInAccount: new GrowingDelay(
			'signin_account',
			setting('FC_SIGNIN_ACCOUNT_FREE', 5),
			setting('FC_SIGNIN_ACCOUNT_MAX_WAIT', 60)
		),
		signInAddress: new GrowingDelay(
			'signin_address',
			setting('FC_SIGNIN_ADDRESS_FREE', 20),
			setting('FC_SIGNIN_ADDRESS_MAX_WAIT', 900)
		),
		forgotAccount: limiter('forgot_account', setting('FC_FORGOT_ACCOUNT_LIMIT', 3), hour),
		forgotAddress: limiter('forgot_address', setting('FC_FORGOT_ADDRESS_LIMIT', 10), hour),
		signUpAddress: limiter('signup_address', setting('FC_SIGNUP_ADDRESS_LIMIT', 10), hour),
		signUpMail: limiter('signup_mail', setting('FC_SIGNUP_MAIL_LIMIT', 5), hour)
	};
	return limits;
}

const accountKey = (email: string): string => email.trim().toLowerCase();

/** A wait in words: "4 seconds", "2 minutes". */
export function waitInWords(ms: number): string {
	const seconds = Math.max(1, Math.ceil(ms / 1000));
	if (seconds < 90) return `${seconds} second${seconds === 1 ? '' : 's'}`;
	const minutes = Math.ceil(seconds / 60);
	return `${minutes} minute${minutes === 1 ? '' : 's'}`;
}

export type SignInWait = { by: 'account' | 'address'; ms: number } | null;

/** Whether this sign-in must wait, and because of which count (the longer wait when both). */
export async function signInWait(email: string, address: string): Promise<SignInWait> {
	const [account, byAddress] = await Promise.all([
		get().signInAccount.waitMs(accountKey(email)),
		get().signInAddress.waitMs(address)
	]);
	if (account === 0 && byAddress === 0) return null;
	return byAddress >= account ? { by: 'address', ms: byAddress } : { by: 'account', ms: account };
}

/** The message for a sign-in asked to wait; it says which count and for how long, and nothing else. */
export function signInWaitMessage(wait: NonNullable<SignInWait>): string {
	const howLong = waitInWords(wait.ms);
	return wait.by === 'account'
		? `Too many wrong passwords for this account in a row. Wait ${howLong}, then try again — or reset your password, which lifts the wait.`
		: `Too many failed sign-ins from your network address. Wait ${howLong}, then try again.`;
}

export async function recordFailedSignIn(email: string, address: string): Promise<void> {
	await Promise.all([get().signInAccount.fail(accountKey(email)), get().signInAddress.fail(address)]);
}

/** After a successful sign-in or password reset: the account starts again with its free tries. */
export async function clearFailedSignIns(email: string): Promise<void> {
	await get().signInAccount.clear(accountKey(email));
}

async function spend(limiter: RateLimiterMySQL, key: string): Promise<number> {
	try {
		await limiter.consume(key);
		return 0;
	} catch (rejection) {
		if (rejection instanceof Error) throw rejection;
		return (rejection as RateLimiterRes).msBeforeNext;
	}
}

/** Milliseconds this address must wait before asking for more reset mail, or 0 (and counts it). */
export function forgotAddressWait(address: string): Promise<number> {
	return spend(get().forgotAddress, address);
}

/** Whether another reset mail may go to this account now (counts it). Refusals are silent. */
export async function forgotAccountAllowed(email: string): Promise<boolean> {
	return (await spend(get().forgotAccount, accountKey(email))) === 0;
}

/** Milliseconds this address must wait before another sign-up, or 0 (and counts it). */
export function signUpAddressWait(address: string): Promise<number> {
	return spend(get().signUpAddress, address);
}

/** Whether another sign-up mail may go to this address now (counts it). Refusals are silent, as for reset mail. */
export async function signUpMailAllowed(email: string): Promise<boolean> {
	return (await spend(get().signUpMail, accountKey(email))) === 0;
}

/** A form's 429: tells the browser when to come back (retry-after) and the user why, at `field`. */
export function tooManyTries<V>(
	event: { setHeaders(h: Record<string, string>): void },
	waitMs: number,
	field: string,
	message: string,
	values: V
) {
	event.setHeaders({ 'retry-after': String(Math.ceil(waitMs / 1000)) });
	return fail(429, { errors: { [field]: message } as FieldErrors, values });
}
