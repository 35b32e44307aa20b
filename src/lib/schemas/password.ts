// A new password (sign-up, reset, accepting an invite): one schema, so every form refuses the same
// passwords for the same reason. Strength is judged offline by zxcvbn-ts with its common-password and
// English dictionaries; a password that scores under 3 of 4 ("safely unguessable: moderate protection
// from offline slow-hash scenario", zxcvbn's own scale) is refused with zxcvbn's warning as the reason.
// Server side only: the dictionaries are large and must not reach the browser bundle.
import { z } from 'zod';
import { ZxcvbnFactory } from '@zxcvbn-ts/core';
import * as common from '@zxcvbn-ts/language-common';
import * as en from '@zxcvbn-ts/language-en';

/** The lowest zxcvbn score (0–4) accepted. */
export const minPasswordScore = 3;

let checker: ZxcvbnFactory | undefined;
function strength(): ZxcvbnFactory {
	checker ??= new ZxcvbnFactory({
		dictionary: { ...common.dictionary, ...en.dictionary, userInputs: ['furrowcast'] },
		graphs: common.adjacencyGraphs,
		translations: en.translations
	});
	return checker;
}

/** Why a password is too easy to guess, or null when it is strong enough. */
export function weakPasswordReason(password: string): string | null {
	if (password.trim() === '') return 'A password of only spaces is too easy to guess.';
	const result = strength().check(password.slice(0, 100));
	if (result.score >= minPasswordScore) return null;
	const warning = result.feedback.warning ?? 'This password is too easy to guess.';
	const hint = result.feedback.suggestions[0] ?? 'Add more words that are less common.';
	return `${warning} ${hint}`;
}

export const newPassword = z
	.string({ error: 'Password is required.' })
	.min(10, 'Password must be at least 10 characters.')
	.max(200, 'Password must be at most 200 characters.')
	.superRefine((value, ctx) => {
		const reason = weakPasswordReason(value);
		if (reason) ctx.addIssue({ code: 'custom', message: reason });
	});
