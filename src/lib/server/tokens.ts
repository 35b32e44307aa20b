// One-time tokens (invites, password resets): the link carries the random token, the database
// keeps only its SHA-256, so a leaked table opens nothing.
import { createHash, randomBytes } from 'node:crypto';

export function newToken(): { token: string; hash: string } {
	const token = randomBytes(32).toString('base64url');
	return { token, hash: hashToken(token) };
}

export function hashToken(token: string): string {
	return createHash('sha256').update(token).digest('hex');
}
