// The local fake SMTP server: accepts every message on loopback and keeps it as a JSON file in
// FC_MAIL_DIR, where tests and the owner's developer page read it. Development and tests only.
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';

const dir = process.env.FC_MAIL_DIR ?? '.data/mail';
const host = process.env.FC_SMTP_HOST ?? '127.0.0.1';
const port = Number(process.env.FC_SMTP_PORT ?? 2525);
mkdirSync(dir, { recursive: true });

// Two kinds of test address make the fake behave like a poor mail server, so tests can show the app
// does not wait on mail or fail with it: a local part starting "undeliverable" is refused (550), and
// one starting "slow-" is accepted only after FC_MAIL_FAKE_SLOW_MS (default 4 s).
const slowMs = Number(process.env.FC_MAIL_FAKE_SLOW_MS ?? 4000);
const localPart = (address: string): string => address.split('@')[0].toLowerCase();

let sequence = 0;
const server = new SMTPServer({
	authOptional: true,
	disabledCommands: ['STARTTLS'],
	logger: false,
	onRcptTo(address, _session, callback) {
		if (localPart(address.address).startsWith('undeliverable')) {
			const refused = new Error('Mailbox unavailable (test address)') as Error & { responseCode: number };
			refused.responseCode = 550;
			return callback(refused);
		}
		callback();
	},
	onData(stream, session, callback) {
		const slow = session.envelope.rcptTo.some((r) => localPart(r.address).startsWith('slow-'));
		simpleParser(stream)
			.then(async (mail) => {
				if (slow) await new Promise((resolve) => setTimeout(resolve, slowMs));
				return mail;
			})
			.then((mail) => {
				const id = `${Date.now()}-${process.pid}-${(sequence++).toString().padStart(6, '0')}`;
				const to = session.envelope.rcptTo.map((r) => r.address);
				const record = {
					id,
					receivedAt: new Date().toISOString(),
					from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
					to,
					subject: mail.subject ?? '',
					text: mail.text ?? '',
					html: typeof mail.html === 'string' ? mail.html : '',
					attachments: mail.attachments.map((a) => ({
						filename: a.filename ?? '',
						contentType: a.contentType,
						size: a.size,
						contentBase64: a.content.toString('base64')
					}))
				};
				// Write then rename would be safer for huge mail; these are small and written once.
				writeFileSync(join(dir, `${id}.json`), JSON.stringify(record));
				callback();
			})
			.catch((error: Error) => callback(error));
	}
});
server.on('error', (error) => console.error('[mail-fake]', error.message));
server.listen(port, host, () => console.log(`[mail-fake] listening on ${host}:${port}, keeping mail in ${dir}`));
