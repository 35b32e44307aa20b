// Outgoing mail through nodemailer over SMTP. In development and tests the SMTP server is the
// project's local fake (scripts/mail-fake.ts), which keeps every message in FC_MAIL_DIR.
import nodemailer, { type Transporter } from 'nodemailer';
import { readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { env } from '$env/dynamic/private';

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

export async function sendMail(message: { to: string; subject: string; text: string; html?: string; attachments?: Attachment[] }): Promise<void> {
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

/** True when the local mail fake's folder is configured (development and demo mode only). */
export function devMailEnabled(): boolean {
	return Boolean(env.FC_MAIL_DIR) && env.FC_DEV_MAIL !== 'off';
}

/** Messages kept by the local mail fake, newest first. */
export async function listStoredMail(limit = 100): Promise<StoredMail[]> {
	const dir = env.FC_MAIL_DIR;
	if (!dir) return [];
	const names = (await readdir(dir).catch(() => [] as string[])).filter((n) => n.endsWith('.json')).sort().reverse().slice(0, limit);
	const mails = await Promise.all(
		names.map(async (name) => {
			const raw = JSON.parse(await readFile(join(dir, name), 'utf8')) as StoredMail & { attachments: { contentBase64?: string }[] };
			return { ...raw, attachments: raw.attachments.map(({ filename, contentType, size }) => ({ filename, contentType, size })) } as StoredMail;
		})
	);
	return mails;
}
