// A second app server from the same build, for checks that need other settings than the test
// app's (no demo mode, an unreachable database). It listens on a port the system hands out, so
// parallel test runs on one machine never meet.
import { spawn, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';

/** A loopback port that was free a moment ago. */
export function freePort(): Promise<number> {
	return new Promise((resolve, reject) => {
		const s = createServer();
		s.once('error', reject);
		s.listen(0, '127.0.0.1', () => {
			const { port } = s.address() as { port: number };
			s.close(() => resolve(port));
		});
	});
}

export interface SecondApp {
	base: string;
	stop(): void;
}

/** Starts scripts/serve.js with the test app's environment changed by `change` (undefined deletes). */
export async function startSecondApp(change: Record<string, string | undefined>): Promise<SecondApp> {
	const host = process.env.FC_HOST ?? '127.0.0.1';
	const port = await freePort();
	const env: NodeJS.ProcessEnv = {
		...process.env,
		PORT: String(port),
		HOST: host,
		ORIGIN: `http://${host}:${port}`,
		SHUTDOWN_TIMEOUT: '1'
	};
	for (const [k, v] of Object.entries(change)) {
		if (v === undefined) delete env[k];
		else env[k] = v;
	}
	const app: ChildProcess = spawn('node', ['scripts/serve.js', process.env.FC_BUILD_DIR ?? 'build'], {
		env,
		stdio: 'ignore'
	});
	const base = `http://${host}:${port}`;
	for (let i = 0; i < 80; i++) {
		if (app.exitCode !== null) break;
		if (
			await fetch(`${base}/signin`).then(
				() => true,
				() => false
			)
		)
			return { base, stop: () => app.kill('SIGTERM') };
		await new Promise((r) => setTimeout(r, 250));
	}
	app.kill('SIGTERM');
	throw new Error(`the second app server did not start on ${base}`);
}
