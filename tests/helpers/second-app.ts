// A second app server on the test database, started by a test with settings of its own (for example
// ADDRESS_HEADER, as behind a proxy, with small limits). Its port is FC_TEST_PORT + 100 unless
// FC_TEST_SECOND_PORT says otherwise.
import { spawn, type ChildProcess } from 'node:child_process';
import { resolve } from 'node:path';

export interface SecondApp {
	url: string;
	/** POSTs a form as a browser behind the proxy would, with the given client address header. */
	postForm(path: string, fields: Record<string, string>, headers?: Record<string, string>): Promise<Response>;
	stop(): Promise<void>;
}

export async function startSecondApp(env: Record<string, string>): Promise<SecondApp> {
	const port = Number(process.env.FC_TEST_SECOND_PORT ?? Number(process.env.FC_PORT ?? 3100) + 100);
	const host = process.env.FC_HOST ?? '127.0.0.1';
	const url = `http://${host}:${port}`;
	const child: ChildProcess = spawn(process.execPath, [resolve(process.env.FC_BUILD_DIR ?? 'build')], {
		env: { ...process.env, HOST: host, PORT: String(port), ORIGIN: url, SHUTDOWN_TIMEOUT: '1', ...env },
		stdio: ['ignore', 'ignore', 'pipe']
	});
	let stderr = '';
	child.stderr?.on('data', (d: Buffer) => (stderr += d.toString()));
	const until = Date.now() + 20_000;
	for (;;) {
		try {
			if ((await fetch(`${url}/signin`)).ok) break;
		} catch {
			// not listening yet
		}
		if (child.exitCode !== null || Date.now() > until) throw new Error(`second app did not start on ${url}: ${stderr.slice(-500)}`);
		await new Promise((r) => setTimeout(r, 150));
	}
	return {
		url,
		postForm(path, fields, headers = {}) {
			return fetch(url + path, {
				method: 'POST',
				body: new URLSearchParams(fields),
				redirect: 'manual',
				headers: { origin: url, accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded', ...headers }
			});
		},
		async stop() {
			if (child.exitCode !== null) return;
			const exited = new Promise((r) => child.once('exit', r));
			child.kill('SIGTERM');
			await Promise.race([exited, new Promise((r) => setTimeout(r, 5000))]);
			if (child.exitCode === null) child.kill('SIGKILL');
		}
	};
}
