// Reads the messages that the test mail fake keeps in FC_MAIL_DIR.
import { readdir, readFile } from 'node:fs/promises';
import { join } from 'node:path';

export interface KeptMail {
	to: string[];
	subject: string;
	text: string;
	html: string;
	attachments: { filename: string; contentType: string; contentBase64: string }[];
}

async function all(): Promise<KeptMail[]> {
	const dir = process.env.FC_MAIL_DIR;
	if (!dir) throw new Error('FC_MAIL_DIR is not set: run the tests with npm test');
	const names = (await readdir(dir).catch(() => [] as string[])).filter((n) => n.endsWith('.json')).sort();
	// A message the fake is still writing is not whole JSON yet: leave it for the next look.
	const read = await Promise.all(
		names.map(async (n) => {
			try {
				return JSON.parse(await readFile(join(dir, n), 'utf8')) as KeptMail;
			} catch {
				return null;
			}
		})
	);
	return read.filter((m): m is KeptMail => m !== null);
}

/** Waits for the newest message to an address (the fake writes it a moment after SMTP ends). */
export async function waitForMail(to: string, timeoutMs = 10_000): Promise<KeptMail> {
	const until = Date.now() + timeoutMs;
	while (Date.now() < until) {
		const found = (await all()).filter((m) => m.to.includes(to.toLowerCase()));
		if (found.length) return found[found.length - 1];
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error(`no mail to ${to} within ${timeoutMs} ms`);
}

/** Waits for the newest message to an address whose text contains `needle` (reset mail leaves after the answer). */
export async function waitForMailWith(to: string, needle: string, timeoutMs = 10_000): Promise<KeptMail> {
	const until = Date.now() + timeoutMs;
	while (Date.now() < until) {
		const found = (await all()).filter((m) => m.to.includes(to.toLowerCase()) && m.text.includes(needle));
		if (found.length) return found[found.length - 1];
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error(`no mail to ${to} containing ${needle} within ${timeoutMs} ms`);
}

export function firstLink(mail: KeptMail, pathPrefix: string): string {
	const m = mail.text.match(new RegExp(`https?://[^\\s]+${pathPrefix.replace(/\//g, '\\/')}[^\\s]+`));
	if (!m) throw new Error(`no ${pathPrefix} link in mail "${mail.subject}"`);
	return m[0];
}
