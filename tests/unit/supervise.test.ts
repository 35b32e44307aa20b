// scripts/supervise.sh, which npm start runs the app server under: a server that dies is started
// again (after a pause that grows), a stop asked for through the stop file (what npm stop's
// app-stop.sh writes) or a signal to the supervisor ends it for good, and nothing else it did
// not start is touched. A fake server (a node process) stands in for the app.
import { afterEach, describe, expect, it } from 'vitest';
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, readFileSync, existsSync, writeFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

const script = resolve('scripts/supervise.sh');
let dir = '';
let sup: ChildProcess | undefined;
let sibling: ChildProcess | undefined;

afterEach(() => {
	for (const p of [sup, sibling]) if (p?.pid && p.exitCode === null) p.kill('SIGKILL');
	try {
		const pid = Number(readFileSync(join(dir, 'app.pid'), 'utf8'));
		if (pid) process.kill(pid, 'SIGKILL');
	} catch {
		// already gone
	}
	rmSync(dir, { recursive: true, force: true });
});

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const alive = (pid: number) => {
	try {
		process.kill(pid, 0);
		return true;
	} catch {
		return false;
	}
};
async function until<T>(what: string, f: () => T | undefined, ms = 8000): Promise<T> {
	const end = Date.now() + ms;
	for (;;) {
		const v = f();
		if (v !== undefined && v !== false) return v;
		if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
		await sleep(50);
	}
}
const readPid = () => {
	try {
		const n = Number(readFileSync(join(dir, 'app.pid'), 'utf8'));
		return n > 0 ? n : undefined;
	} catch {
		return undefined;
	}
};

/** Starts the supervisor over a fake server that logs each start and then idles. */
function start(): { starts: () => number[]; output: () => string } {
	dir = mkdtempSync(join(tmpdir(), 'fc-supervise-'));
	const log = join(dir, 'starts.log');
	writeFileSync(log, '');
	const server = `require('fs').appendFileSync(${JSON.stringify(log)}, process.pid + '\\n'); setInterval(() => {}, 1000);`;
	let out = '';
	sup = spawn('bash', [script, join(dir, 'app.pid'), '--', process.execPath, '-e', server], {
		env: { ...process.env, FC_DATA_DIR: dir, FC_RESTART_MAX_DELAY: '2' },
		stdio: ['ignore', 'pipe', 'pipe']
	});
	sup.stdout!.on('data', (d) => (out += d));
	sup.stderr!.on('data', (d) => (out += d));
	return {
		starts: () => readFileSync(log, 'utf8').split('\n').filter(Boolean).map(Number),
		output: () => out
	};
}

describe('scripts/supervise.sh', () => {
	it('starts the server again each time it dies, waiting longer after each quick failure', async () => {
		// A process the supervisor did not start (as MariaDB and the mail fake are not): it must live on.
		sibling = spawn('sleep', ['60'], { stdio: 'ignore' });
		const s = start();
		const first = await until('first start', () => (s.starts().length === 1 ? readPid() : undefined));
		const t0 = Date.now();
		process.kill(first, 'SIGKILL'); // as the kernel's out-of-memory killer would
		const second = await until('restart', () => (s.starts().length === 2 ? readPid() : undefined));
		const firstPause = Date.now() - t0;
		expect(second).not.toBe(first);
		expect(alive(second)).toBe(true);
		expect(alive(first)).toBe(false);
		const t1 = Date.now();
		process.kill(second, 'SIGKILL');
		await until('second restart', () => (s.starts().length === 3 ? readPid() : undefined));
		const secondPause = Date.now() - t1;
		// 1 s, then 2 s (doubling, capped at FC_RESTART_MAX_DELAY = 2 here).
		expect(firstPause).toBeGreaterThanOrEqual(900);
		expect(secondPause).toBeGreaterThanOrEqual(1900);
		expect(s.output()).toMatch(/exited \(status 137\).*starting it again in 1s/);
		expect(sibling.exitCode).toBeNull();
		expect(alive(sibling.pid!)).toBe(true);
	}, 20_000);

	it('a stop asked for through the stop file (npm stop) ends it without a restart', async () => {
		const s = start();
		const pid = await until('first start', () => (s.starts().length === 1 ? readPid() : undefined));
		const exited = new Promise<number | null>((r) => sup!.on('exit', (code) => r(code)));
		// What scripts/app-stop.sh does: write the stop file, then signal the server.
		writeFileSync(join(dir, 'app.pid.stop'), '');
		process.kill(pid, 'SIGTERM');
		await expect(exited).resolves.toBe(0);
		await sleep(300);
		expect(s.starts()).toHaveLength(1);
		expect(alive(pid)).toBe(false);
		expect(existsSync(join(dir, 'app.pid'))).toBe(false);
	}, 15_000);

	it('SIGTERM or Ctrl-C to the supervisor stops the server and the supervisor', async () => {
		const s = start();
		const pid = await until('first start', () => (s.starts().length === 1 ? readPid() : undefined));
		const exited = new Promise<number | null>((r) => sup!.on('exit', (code) => r(code)));
		sup!.kill('SIGINT');
		await exited;
		await until('server gone', () => !alive(pid) || undefined);
		await sleep(1500);
		expect(s.starts()).toHaveLength(1);
	}, 15_000);
});
