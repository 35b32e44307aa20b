// Runs Debian's LibreOffice Calc headless (python3-uno, see lo_batch.py) over a batch of jobs:
// one soffice start per batch, each batch with its own user profile so parallel runs never
// share one. The test script installs libreoffice-calc-nogui and python3-uno when missing.
import { execFile } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { promisify } from 'node:util';

const run = promisify(execFile);

export type LoOp =
	| { deleteRow: { sheet: string; row: number } }
	| { copyRow: { sheet: string; from: number; to: number } }
	| { set: { sheet: string; cell: string; value: string | number } };

export interface LoJob {
	open: string;
	ops?: LoOp[];
	save: { path: string; as: 'xlsx' | 'csv' | 'pdf'; sheet?: string }[];
}

/** A fresh scratch directory for one test file's files. */
export function scratchDir(tag: string): string {
	return mkdtempSync(join(tmpdir(), `fc-${tag}-`));
}

export async function libreOffice(dir: string, jobs: LoJob[]): Promise<void> {
	const jobsPath = join(dir, `jobs-${Date.now()}.json`);
	writeFileSync(jobsPath, JSON.stringify(jobs));
	const profile = mkdtempSync(join(tmpdir(), 'fc-lo-profile-'));
	await run('/usr/bin/python3', [resolve('tests/helpers/lo_batch.py'), profile, jobsPath], { timeout: 150_000 });
}
