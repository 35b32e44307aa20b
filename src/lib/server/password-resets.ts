// Password resets by e-mail: a one-time link that lives one hour.
import { db } from './db';
import { lucia } from './auth';
import { hashToken, newToken } from './tokens';
import { findByEmail, setPassword } from './users';
import { sendMail } from './mail';
import { clearFailedSignIns } from './rate-limit';

/** A new reset link for the account; it replaces any earlier one, so one link at most is live. */
export async function createPasswordReset(userId: string): Promise<string> {
	const { token, hash } = newToken();
	await db().transaction(async (trx) => {
		await trx('password_resets').where({ user_id: userId }).whereNull('used_at').delete();
		await trx('password_resets').insert({
			token_hash: hash,
			user_id: userId,
			expires_at: new Date(Date.now() + 3_600_000)
		});
	});
	return token;
}

export async function findPasswordReset(token: string): Promise<{ userId: string } | null> {
	const row = await db()('password_resets')
		.where({ token_hash: hashToken(token) })
		.whereNull('used_at')
		.where('expires_at', '>', new Date())
		.first('user_id');
	return row ? { userId: row.user_id } : null;
}

export async function completePasswordReset(token: string, password: string): Promise<string | null> {
	const done = await db().transaction(async (trx) => {
		const row: { user_id: string; email: string } | undefined = await trx('password_resets as r')
			.join('users as u', 'u.id', 'r.user_id')
			.where({ 'r.token_hash': hashToken(token) })
			.whereNull('r.used_at')
			.where('r.expires_at', '>', new Date())
			.forUpdate()
			.first('r.user_id', 'u.email');
		if (!row) return null;
		await setPassword(trx, row.user_id, password);
		await trx('password_resets')
			.where({ token_hash: hashToken(token) })
			.update({ used_at: new Date() });
		return row;
	});
	if (!done) return null;
	// A new password ends every old session, and lifts any sign-in wait on the account.
	await Promise.all([lucia().invalidateUserSessions(done.user_id), clearFailedSignIns(done.email)]);
	return done.user_id;
}

/**
 * Mails a reset link to the account behind an address, if there is one. Called without awaiting from
 * the request, so the answer (and its timing) is the same for every address; failures are logged.
 */
export async function mailPasswordReset(email: string, origin: string): Promise<void> {
	const user = await findByEmail(email);
	if (!user) return;
	const token = await createPasswordReset(user.id);
	const link = `${origin}/reset/${token}`;
	await sendMail({
		to: user.email,
		subject: 'Reset your Furrowcast password',
		text: `Someone asked to reset the password of your Furrowcast account.\n\nChoose a new password here (the link works once, for one hour; an earlier link no longer works):\n${link}\n\nIf it was not you, ignore this message; your password stays as it is.`,
		html: `<p>Someone asked to reset the password of your Furrowcast account.</p><p><a href="${link}">Choose a new password</a> (the link works once, for one hour; an earlier link no longer works).</p><p>If it was not you, ignore this message; your password stays as it is.</p>`
	});
}

/** Tells an account holder that someone tried to sign up with their address (sign-up answers alike for all). */
export async function mailSignUpAttempt(email: string, origin: string): Promise<void> {
	const user = await findByEmail(email);
	if (!user) return;
	await sendMail({
		to: user.email,
		subject: 'Someone tried to create a Furrowcast farm with your address',
		text: `Someone tried to create a new Furrowcast farm with this e-mail address, which already has an account.\n\nIf it was you: sign in at ${origin}/signin, or choose a new password at ${origin}/forgot.\nIf it was not you, ignore this message; nothing was changed.`,
		html: `<p>Someone tried to create a new Furrowcast farm with this e-mail address, which already has an account.</p><p>If it was you: <a href="${origin}/signin">sign in</a>, or <a href="${origin}/forgot">choose a new password</a>.</p><p>If it was not you, ignore this message; nothing was changed.</p>`
	});
}

/** Runs mail work after the answer has gone; logs instead of failing the request. */
export function afterResponse(what: string, work: () => Promise<void>): void {
	setImmediate(() => {
		work().catch((error: Error) => console.error(`[mail] ${what} failed:`, error.message));
	});
}
