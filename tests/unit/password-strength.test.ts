// New passwords are judged by zxcvbn-ts (an offline strength estimator with common-password and English
// dictionaries); under score 3 of 4 they are refused with its reason.
// Source: @zxcvbn-ts/core and @zxcvbn-ts/language-common / language-en (reference library from npm).
import { describe, expect, it } from 'vitest';
import { newPassword, weakPasswordReason } from '../../src/lib/schemas/password';

describe('new password strength', () => {
	const weak: [string, RegExp][] = [
		['          ', /only spaces/],
		['aaaaaaaaaa', /Repeated characters/],
		['password12', /commonly used password/],
		['qwertyuiop', /frequently used password/],
		['furrowcast1', /personal or page related/]
	];
	for (const [pw, reason] of weak) {
		it(`refuses ${JSON.stringify(pw)} and says why`, () => {
			const parsed = newPassword.safeParse(pw);
			expect(parsed.success).toBe(false);
			expect(parsed.error?.issues[0].message).toMatch(reason);
		});
	}

	it('keeps the length rules, with their own messages', () => {
		expect(newPassword.safeParse('short').error?.issues[0].message).toBe('Password must be at least 10 characters.');
		expect(newPassword.safeParse('x'.repeat(201)).error?.issues[0].message).toBe(
			'Password must be at most 200 characters.'
		);
	});

	it('accepts the demo password and a few unrelated words', () => {
		for (const pw of ['demo-harvest-2027', 'long-enough-pass', 'tractor violet ledger']) {
			expect(weakPasswordReason(pw)).toBeNull();
			expect(newPassword.safeParse(pw).success).toBe(true);
		}
	});
});
