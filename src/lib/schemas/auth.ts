import { z } from 'zod';
import { email, isoDate, numberField, plainText } from './common';
import { newPassword as password } from './password';
import { roles } from '$lib/roles';

export const signInSchema = z.object({
	email,
	password: z.string().min(1, 'Password is required.').max(200, 'Password must be at most 200 characters.')
});

export const signUpSchema = z.object({
	name: plainText('Your name', 120),
	email,
	password,
	farmName: plainText('Farm name', 120),
	latitude: numberField('Latitude', -66, 66),
	lastSpringFrost: isoDate('Last spring frost'),
	firstFallFrost: isoDate('First fall frost')
});

export const inviteSchema = z.object({
	email,
	role: z.enum(roles, { error: 'Choose a role: owner, crew lead or share manager.' })
});

export const acceptInviteSchema = z.object({ name: plainText('Your name', 120), password });
/** Accepting with an existing account: its current password proves it, whatever rules held when it was set. */
export const acceptInviteExistingSchema = z.object({
	name: plainText('Your name', 120),
	password: signInSchema.shape.password
});

export const forgotSchema = z.object({ email });

export const resetSchema = z
	.object({ password, confirm: z.string().max(200, 'Password must be at most 200 characters.') })
	.refine((v) => v.password === v.confirm, { message: 'The two passwords differ.', path: ['confirm'] });

/** The Team page's member forms: whose membership, and the new role (role change only). */
export const memberSchema = z.object({
	userId: z.string({ error: 'Choose a member.' }).trim().min(1, 'Choose a member.').max(40, 'Choose a member.')
});
export const memberRoleSchema = memberSchema.extend({
	role: z.enum(roles, { error: 'Choose a role: owner, crew lead or share manager.' })
});

/** An open invite on the Team page (withdraw, resend). */
export const inviteIdSchema = z.object({ id: numberField('Invite', 1, 2_147_483_647, { int: true }) });
