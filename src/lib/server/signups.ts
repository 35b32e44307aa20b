// Sign-up by confirmed address. The form answers the same for every address ("check your e-mail"),
// and everything that depends on whether the address has an account happens after the answer:
// a new address gets a link that creates the farm and signs in (valid 24 hours, once; a later
// sign-up replaces it), a taken one gets a note that an account exists, with links to sign in or
// reset. Nothing database-heavy (no password hashing, no look-up) runs before the answer.
import type { Cookies } from '@sveltejs/kit';
import { randomBytes } from 'node:crypto';
import { db } from './db';
import { hashToken, newToken } from './tokens';
import { hashPassword } from './password';
import { sendMail } from './mail';
import { mailSignUpAttempt } from './password-resets';
import { DuplicateEmailError, createOwnerAndFarm, findByEmail } from './users';

export const SIGNUP_TTL_MS = 24 * 3_600_000;
/** Ties sign-ups to the browser that asked, so Mail (dev) in demo mode can show it its own mail. */
export const VIEWER_COOKIE = 'fc_signup_viewer';

export interface SignUpInput {
	name: string;
	email: string;
	password: string;
	farmName: string;
	latitude: number;
	lastSpringFrost: string;
	firstFallFrost: string;
}

/** The browser's sign-up viewer key, set (httpOnly, a day) when it has none. */
export function viewerKey(cookies: Cookies, secure: boolean): string {
	let key = cookies.get(VIEWER_COOKIE);
	if (!key || !/^[A-Za-z0-9_-]{20,64}$/.test(key)) {
		key = randomBytes(24).toString('base64url');
		cookies.set(VIEWER_COOKIE, key, {
			path: '/',
			httpOnly: true,
			sameSite: 'lax',
			secure,
			maxAge: SIGNUP_TTL_MS / 1000
		});
	}
	return key;
}

/**
 * After the answer: mails a confirmation link to a new address, or a note to a taken one. Expired
 * sign-ups are cleared on the way. Called without awaiting; failures are logged by the caller.
 */
export async function requestSignUp(input: SignUpInput, origin: string, viewer: string | null): Promise<void> {
	const email = input.email.trim().toLowerCase();
	const viewerHash = viewer ? hashToken(viewer) : null;
	const expires = new Date(Date.now() + SIGNUP_TTL_MS);
	await db()('signup_requests').where('expires_at', '<', new Date()).delete();
	if (await findByEmail(email)) {
		await db()('signup_requests').insert({ email, token_hash: null, viewer_hash: viewerHash, expires_at: expires });
		await mailSignUpAttempt(email, origin);
		return;
	}
	const passwordHash = await hashPassword(input.password);
	const { token, hash } = newToken();
	await db().transaction(async (trx) => {
		// One live link per address: an earlier one stops working.
		await trx('signup_requests').where({ email }).whereNotNull('token_hash').delete();
		await trx('signup_requests').insert({
			email,
			token_hash: hash,
			viewer_hash: viewerHash,
			name: input.name,
			password_hash: passwordHash,
			farm_name: input.farmName,
			latitude: input.latitude,
			last_spring_frost: input.lastSpringFrost,
			first_fall_frost: input.firstFallFrost,
			expires_at: expires
		});
	});
	const link = `${origin}/signup/confirm/${token}`;
	const farm = escapeHtml(input.farmName);
	await sendMail({
		to: email,
		subject: 'Confirm your new Furrowcast farm',
		text: `Someone (we hope you) asked to create the Furrowcast farm "${input.farmName}" with this e-mail address.\n\nTo create it and sign in, open this link (it works once, for 24 hours):\n${link}\n\nIf it was not you, ignore this message; no farm is made without the link.`,
		html: `<p>Someone (we hope you) asked to create the Furrowcast farm “${farm}” with this e-mail address.</p><p><a href="${link}">Create the farm and sign in</a> (the link works once, for 24 hours).</p><p>If it was not you, ignore this message; no farm is made without the link.</p>`
	});
}

function escapeHtml(s: string): string {
	return s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

/** What a live link would create, or null when it is unknown, used or expired. */
export async function findSignUp(token: string): Promise<{ email: string; farmName: string; name: string } | null> {
	if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return null;
	const row = await db()('signup_requests')
		.where({ token_hash: hashToken(token) })
		.where('expires_at', '>', new Date())
		.first('email', 'farm_name', 'name');
	return row ? { email: row.email, farmName: row.farm_name, name: row.name } : null;
}

export type ConfirmResult =
	{ ok: true; userId: string; farmId: number } | { ok: false; reason: 'gone' | 'taken'; email?: string };

/** Creates the farm and its owner from a live link, once; the address's sign-ups are spent. */
export async function confirmSignUp(token: string): Promise<ConfirmResult> {
	if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return { ok: false, reason: 'gone' };
	return db().transaction(async (trx): Promise<ConfirmResult> => {
		const row = await trx('signup_requests')
			.where({ token_hash: hashToken(token) })
			.where('expires_at', '>', new Date())
			.forUpdate()
			.first();
		if (!row) return { ok: false, reason: 'gone' };
		await trx('signup_requests').where({ email: row.email }).delete();
		try {
			const made = await createOwnerAndFarm(trx, {
				name: row.name,
				email: row.email,
				passwordHash: row.password_hash,
				farmName: row.farm_name,
				latitude: Number(row.latitude),
				lastSpringFrost: row.last_spring_frost,
				firstFallFrost: row.first_fall_frost
			});
			return { ok: true, ...made };
		} catch (error) {
			// The address got an account meanwhile (an invite accepted): the link is spent, nothing is made.
			if (error instanceof DuplicateEmailError) return { ok: false, reason: 'taken', email: row.email };
			throw error;
		}
	});
}

/** The addresses this browser asked sign-ups for (live ones): Mail (dev) shows it their mail. */
export async function viewerMailboxes(viewer: string | undefined): Promise<Set<string>> {
	if (!viewer) return new Set();
	const rows: { email: string }[] = await db()('signup_requests')
		.where({ viewer_hash: hashToken(viewer) })
		.where('expires_at', '>', new Date())
		.select('email');
	return new Set(rows.map((r) => r.email.toLowerCase()));
}
