// An uploaded workbook or CSV, from bytes to rows written: size and type checked, every row
// validated, and nothing written unless the whole file is good.
import { IMPORT_MAX_BYTES, describeIssue, type ImportIssue, type ImportOptions } from '$lib/schemas/import';
import { listVarieties } from '../crops';
import * as beds from '../beds';
import { readCsv, readXlsx, type ReadResult } from './read';
import { checkImport, type FarmLibrary } from './validate';
import { ImportRefused, writeImport, type ImportSummary } from './write';
import { db } from '../db';
import * as seasons from '../seasons';
import { datesOutside, deriveNewPlantings, previewSeasonUpdate, type PreviewSummary } from './season-update';

export type { PreviewSummary };

async function seasonOfYear(farmId: number, year: number): Promise<seasons.Season | null> {
	const r = await db()('seasons').where({ farm_id: farmId, year }).orderBy('id').first('id');
	return r ? seasons.get(farmId, Number(r.id)) : null;
}

async function plantingCount(farmId: number, seasonId: number): Promise<number> {
	return Number(
		(await db()('plantings').where({ farm_id: farmId, season_id: seasonId }).count({ n: '*' }).first())?.n ?? 0
	);
}

export type { ImportSummary };

export type ImportOutcome =
	| { ok: true; summary: ImportSummary }
	/** The season holds plantings: nothing is written until the owner confirms this preview. */
	| { ok: true; preview: PreviewSummary }
	| { ok: false; status: 400 | 404 | 409 | 413 | 415; message: string; issues: ImportIssue[] };

const fileIssue = (message: string): ImportIssue[] => [
	{ sheet: 'file', row: null, column: null, header: null, message }
];

function refuse(status: 400 | 404 | 409 | 413 | 415, issues: ImportIssue[]): ImportOutcome {
	const shown = issues.slice(0, 3).map(describeIssue).join('; ');
	const more = issues.length > 3 ? ` (and ${issues.length - 3} more)` : '';
	return { ok: false, status, message: `Nothing was imported: ${shown}${more}`, issues };
}

/** What kind of file this is, from its first bytes and its name: both must agree. */
function kindOf(name: string, bytes: Uint8Array): 'xlsx' | 'csv' | null {
	const ext = name.toLowerCase().split('.').pop();
	// An .xlsx is a zip archive: it starts "PK\x03\x04".
	const zip = bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 0x03 && bytes[3] === 0x04;
	if (ext === 'xlsx') return zip ? 'xlsx' : null;
	if (ext === 'csv') return !zip && !bytes.subarray(0, 8192).includes(0) ? 'csv' : null;
	return null;
}

async function farmLibrary(farmId: number): Promise<FarmLibrary> {
	const [varieties, bedList] = await Promise.all([listVarieties(farmId), beds.list(farmId)]);
	return {
		varieties: new Set(varieties.map((v) => `${v.crop.trim().toLowerCase()}\u0000${v.name.trim().toLowerCase()}`)),
		beds: new Set(bedList.map((b) => b.name.trim().toLowerCase()))
	};
}

/** MariaDB's deadlock (1213) or lock wait timeout (1205): the transaction was rolled back whole. */
export function isDeadlock(err: unknown): boolean {
	const e = err as { errno?: number; code?: string } | null;
	return (
		!!e && (e.errno === 1213 || e.errno === 1205 || e.code === 'ER_LOCK_DEADLOCK' || e.code === 'ER_LOCK_WAIT_TIMEOUT')
	);
}

export async function importUpload(
	farmId: number,
	userId: string,
	file: File,
	options: ImportOptions
): Promise<ImportOutcome> {
	if (file.size > IMPORT_MAX_BYTES)
		return refuse(
			413,
			fileIssue(
				`The file is ${(file.size / 1024 / 1024).toFixed(1)} MB; the limit is ${IMPORT_MAX_BYTES / 1024 / 1024} MB.`
			)
		);
	if (file.size === 0) return refuse(400, fileIssue('The file is empty.'));
	const buffer = await file.arrayBuffer();
	const kind = kindOf(file.name, new Uint8Array(buffer));
	if (!kind) return refuse(415, fileIssue(`"${file.name}" is not an .xlsx workbook or a .csv file.`));
	let read: ReadResult;
	if (kind === 'xlsx') read = await readXlsx(buffer);
	else {
		const text = new TextDecoder('utf-8', { fatal: false }).decode(buffer);
		read = readCsv(text, options.sheet);
	}
	if (!read.ok) return refuse(read.status ?? 400, read.issues);
	const checked = checkImport(read.sheets, await farmLibrary(farmId), options.seasonId === undefined);
	if (!checked.ok) return refuse(400, checked.issues);
	let plan = checked.plan;
	if (plan.plantings.length) {
		const letters = read.sheets.plantings?.letters ?? {};
		const season =
			options.seasonId !== undefined
				? await seasons.get(farmId, options.seasonId)
				: await seasonOfYear(farmId, plan.season!.year);
		if (options.seasonId !== undefined && !season)
			return refuse(404, [
				{ sheet: 'upload', row: null, column: null, header: 'seasonId', message: 'No such season on this farm.' }
			]);
		const bounds = season ?? { name: plan.season!.name, startsOn: plan.season!.startsOn, endsOn: plan.season!.endsOn };
		const outside = datesOutside(plan, bounds, letters);
		if (outside.length) return refuse(400, outside);
		if (season && (await plantingCount(farmId, season.id)) > 0) {
			const preview = await previewSeasonUpdate(farmId, userId, season, plan, letters);
			return preview.ok ? { ok: true, preview: preview.preview } : refuse(400, preview.issues);
		}
		// Into a season without plantings: every row worked out again, as a grid edit would be.
		const derived = await deriveNewPlantings(farmId, plan, letters);
		if (!derived.ok) return refuse(400, derived.issues);
		plan = derived.plan;
	}
	// Two imports into one farm at once (or an import and another writer) can deadlock on its library
	// rows, or wait on them past the lock wait timeout: MariaDB rolls the import back whole, and it is
	// retried once; a second clash answers 409 naming it (nothing of it was written).
	for (let attempt = 1; ; attempt++) {
		try {
			return { ok: true, summary: await writeImport(farmId, userId, plan, options.seasonId) };
		} catch (caught) {
			const err = caught as { errno?: number; code?: string };
			if (caught instanceof ImportRefused) return refuse(caught.status, caught.issues);
			if (isDeadlock(err) && attempt === 1) {
				console.warn('[furrowcast] import deadlocked with another; retrying once');
				continue;
			}
			if (isDeadlock(err))
				return refuse(
					409,
					fileIssue(
						err.errno === 1205 || err.code === 'ER_LOCK_WAIT_TIMEOUT'
							? 'Another change to this farm (an import, a plan apply, an edit) held the rows this import needs for too long, twice; nothing of this import was written. Try again.'
							: 'This import clashed twice with another change saved to this farm at the same moment (an import, a plan apply, an edit); nothing of this import was written. Try again.'
					)
				);
			throw caught;
		}
	}
}
