// Password hashing with argon2id. Parameters follow the OWASP password-storage guidance
// for argon2id (19 MiB memory, 2 iterations, 1 lane).
import { hash, verify } from '@node-rs/argon2';

const options = { memoryCost: 19456, timeCost: 2, outputLen: 32, parallelism: 1 } as const;

export function hashPassword(password: string): Promise<string> {
	// @node-rs/argon2 defaults to argon2id; the encoded hash records the parameters used.
	return hash(password, options);
}

export function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
	return verify(passwordHash, password, options).catch(() => false);
}

let dummy: Promise<string> | undefined;
/** Spends the same work as a real check, so a missing account is not told apart by timing. */
export async function verifyDummy(password: string): Promise<false> {
	dummy ??= hashPassword('furrowcast-no-such-account');
	await verifyPassword(await dummy, password);
	return false;
}
