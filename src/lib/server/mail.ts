// Outgoing mail through nodemailer over SMTP. In development and tests the SMTP server is the
// project's local fake (scripts/mail-fake.ts), which keeps every message in FC_MAIL_DIR.
import nodemailer, { type Transporter } from 'nodemailer';
import { readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { env } from '$env/dynamic/private';
import { db } from './db';

let transporter: Transporter | undefined;
function transport(): Transporter {
	transporter ??= nodemailer.createTransport({
		host: env.FC_SMTP_HOST ?? '127.0.0.1',
		port: Number(env.FC_SMTP_PORT ?? 2525),
		secure: env.FC_SMTP_SECURE === 'true',
		auth: env.FC_SMTP_USER ? { user: env.FC_SMTP_USER, pass: env.FC_SMTP_PASSWORD ?? '' } : undefined,
		// The local fake speaks plain SMTP on loopback.
		ignoreTLS: env.FC_SMTP_SECURE !== 'true'
	});
	return transporter;
}

export interface Attachment {
	filename: string;
	content: Buffer;
	contentType?: string;
}

export async function sendMail(message: {
	to: string;
	subject: string;
	text: string;
	html?: string;
	attachments?: Attachment[];
}): Promise<void> {
	await transport().sendMail({ from: env.FC_MAIL_FROM ?? 'Furrowcast <no-reply@furrowcast.test>', ...message });
}

export interface StoredMail {
	id: string;
	receivedAt: string;
	from: string;
	to: string[];
	subject: string;
	text: string;
	html: string;
	attachments: { filename: string; contentType: string; size: number }[];
}

/**
 * True only in demo mode (FC_DEMO_MODE=1, which npm start and the test scripts set) with the
 * local mail fake's folder configured. Anywhere else Mail (dev) does not exist.
 */
export function devMailEnabled(): boolean {
	return env.FC_DEMO_MODE === '1' && Boolean(env.FC_MAIL_DIR);
}

/**
 * The addresses whose mail a farm may read in Mail (dev): its members who belong to no other
 * farm, and the addresses it has open invites for that have no account and no open invite from
 * another farm. A reset link or invite for anyone else (another farm's member, an address two
 * farms invited) never shows, so Mail (dev) cannot be used to take over an account or a seat.
 */
export async function farmMailboxes(farmId: number): Promise<Set<string>> {
	const d = db();
	const members: { email: string }[] = await d('farm_members as m')
		.join('users as u', 'u.id', 'm.user_id')
		.where('m.farm_id', farmId)
		.whereNotExists(
			d('farm_members as o').whereRaw('o.user_id = m.user_id').whereNot('o.farm_id', farmId).select(d.raw('1'))
		)
		.select('u.email');
	const invitees: { email: string }[] = await d('invites as i')
		.where('i.farm_id', farmId)
		.whereNull('i.accepted_at')
		.where('i.expires_at', '>', new Date())
		.whereNotExists(d('users as u').whereRaw('u.email = i.email').select(d.raw('1')))
		.select('i.email');
	const others: { email: string }[] = await d('invites')
		.whereNot('farm_id', farmId)
		.whereNull('accepted_at')
		.where('expires_at', '>', new Date())
		.whereIn(
			'email',
			[...members, ...invitees].map((r) => r.email)
		)
		.select('email');
	const shared = new Set(others.map((r) => r.email.toLowerCase()));
	return new Set([...members, ...invitees].map((r) => r.email.toLowerCase()).filter((e) => !shared.has(e)));
}

/** Messages kept by the local mail fake, newest first, addressed only to `mailboxes`. */
export async function listStoredMail(mailboxes: Set<string>, limit = 100): Promise<StoredMail[]> {
	const dir = env.FC_MAIL_DIR;
	if (!dir) return [];
	const names = (await readdir(dir).catch(() => [] as string[]))
		.filter((n) => n.endsWith('.json'))
		.sort()
		.reverse();
	const out: StoredMail[] = [];
	// Read newest first until `limit` messages for this farm are found (the folder is small in demo use).
	for (const name of names) {
		if (out.length >= limit) break;
		const raw = JSON.parse(await readFile(join(dir, name), 'utf8')) as StoredMail & {
			attachments: { contentBase64?: string }[];
		};
		if (raw.to.length === 0 || !raw.to.every((t) => mailboxes.has(t.toLowerCase()))) continue;
		out.push({
			...raw,
			attachments: raw.attachments.map(({ filename, contentType, size }) => ({ filename, contentType, size }))
		} as StoredMail);
	}
	return out;
}
