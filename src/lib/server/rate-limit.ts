// Sign-in rate limits, counted in MariaDB so every app server shares one count.
// Per account: 5 failed attempts per 15 minutes; per network address: 30 per 15 minutes.
import { RateLimiterMySQL, RateLimiterRes } from 'rate-limiter-flexible';
import { env } from '$env/dynamic/private';
import { db } from './db';

const windowSeconds = 15 * 60;

function limiter(keyPrefix: string, points: number): RateLimiterMySQL {
	return new RateLimiterMySQL({
		storeClient: db(),
		storeType: 'knex',
		dbName: env.FC_DB_NAME,
		tableName: 'rate_limits',
		tableCreated: true, // the migration made it; the app account may not create tables
		keyPrefix,
		points,
		duration: windowSeconds
	});
}

let limiters: { account: RateLimiterMySQL; address: RateLimiterMySQL } | undefined;
function get(): { account: RateLimiterMySQL; address: RateLimiterMySQL } {
	limiters ??= {
		account: limiter('signin_account', Number(env.FC_SIGNIN_ACCOUNT_LIMIT ?? 5)),
		address: limiter('signin_address', Number(env.FC_SIGNIN_ADDRESS_LIMIT ?? 30))
	};
	return limiters;
}

/** Minutes until the caller may try again, or null when sign-in may proceed. */
export async function signInBlockedFor(email: string, address: string): Promise<number | null> {
	const [account, byAddress] = await Promise.all([get().account.get(email.toLowerCase()), get().address.get(address)]);
	const spent = [
		account && account.consumedPoints >= get().account.points ? account : null,
		byAddress && byAddress.consumedPoints >= get().address.points ? byAddress : null
	].filter((r): r is RateLimiterRes => r !== null);
	if (spent.length === 0) return null;
	return Math.max(1, Math.ceil(Math.max(...spent.map((r) => r.msBeforeNext)) / 60_000));
}

export async function recordFailedSignIn(email: string, address: string): Promise<void> {
	// consume() rejects once the points are spent; the count is what matters here.
	await Promise.allSettled([get().account.consume(email.toLowerCase()), get().address.consume(address)]);
}

export async function clearFailedSignIns(email: string): Promise<void> {
	await get().account.delete(email.toLowerCase());
}
