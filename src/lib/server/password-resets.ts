// Password resets by e-mail: a one-time link that lives one hour.
import { db } from './db';
import { lucia } from './auth';
import { hashToken, newToken } from './tokens';
import { setPassword } from './users';

export async function createPasswordReset(userId: string): Promise<string> {
	const { token, hash } = newToken();
	await db()('password_resets').insert({ token_hash: hash, user_id: userId, expires_at: new Date(Date.now() + 3_600_000) });
	return token;
}

export async function findPasswordReset(token: string): Promise<{ userId: string } | null> {
	const row = await db()('password_resets').where({ token_hash: hashToken(token) }).whereNull('used_at').where('expires_at', '>', new Date()).first('user_id');
	return row ? { userId: row.user_id } : null;
}

export async function completePasswordReset(token: string, password: string): Promise<string | null> {
	const userId = await db().transaction(async (trx) => {
		const row = await trx('password_resets').where({ token_hash: hashToken(token) }).whereNull('used_at').where('expires_at', '>', new Date()).forUpdate().first('user_id');
		if (!row) return null;
		await setPassword(trx, row.user_id, password);
		await trx('password_resets').where({ token_hash: hashToken(token) }).update({ used_at: new Date() });
		return row.user_id as string;
	});
	// A new password ends every old session.
	if (userId) await lucia().invalidateUserSessions(userId);
	return userId;
}
