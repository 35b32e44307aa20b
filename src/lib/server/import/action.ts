// The import as a page form action: the same checks as the JSON route; refused files come
// back to the form with every issue, a good one redirects (303) to a summary.
import { fail, redirect, type ActionFailure, type RequestEvent } from '@sveltejs/kit';
import type { ImportIssue } from '$lib/schemas/import';
import { requireCan } from '../guards';
import { importUpload, type ImportSummary, type PreviewSummary } from './index';
import { applySeasonUpdate } from './season-update';
import { drainUpload, readUpload } from './request';
import * as seasons from '../seasons';

export interface ImportFailure {
	importMessage: string;
	importIssues: ImportIssue[];
}

/** requireCan(event, 'season.import') for an upload: a refused body is read off first (see drainUpload). */
export async function requireOwnerForUpload(event: RequestEvent): Promise<ReturnType<typeof requireCan>> {
	try {
		return requireCan(event, 'season.import');
	} catch (refusal) {
		await drainUpload(event);
		throw refusal;
	}
}

/** Query string that carries the summary to the page the action redirects to. */
export function summaryQuery(s: ImportSummary): string {
	return new URLSearchParams({
		imported: '1',
		crops: String(s.crops),
		varieties: String(s.varieties),
		beds: String(s.beds),
		plantings: String(s.plantings),
		...(s.seasonCreated ? { seasonCreated: '1' } : {})
	}).toString();
}

/**
 * Runs the import for the owner. With a season id the plantings go into that season; without
 * one they go into the season named in the file, and the redirect leads to it.
 */
export async function importAction(
	event: RequestEvent,
	seasonId?: number
): Promise<ActionFailure<ImportFailure> | { preview: PreviewSummary }> {
	const { farm, user } = await requireOwnerForUpload(event);
	const upload = await readUpload(event, seasonId);
	if (!upload.ok) return fail(upload.status, { importMessage: upload.message, importIssues: upload.issues });
	// The form's seasonId is the visitor's to choose: it must be a season of their own farm.
	if (upload.options.seasonId !== undefined && !(await seasons.get(farm.id, upload.options.seasonId))) {
		const issue = {
			sheet: 'upload',
			row: null,
			column: null,
			header: 'seasonId',
			message: 'No such season on this farm.'
		};
		return fail(404, {
			importMessage: 'Nothing was imported: no such season on this farm (seasonId).',
			importIssues: [issue]
		});
	}
	const outcome = await importUpload(farm.id, user.id, upload.file, upload.options);
	if (!outcome.ok) return fail(outcome.status, { importMessage: outcome.message, importIssues: outcome.issues });
	if ('preview' in outcome) return { preview: outcome.preview };
	const target = outcome.summary.seasonId ?? seasonId;
	redirect(
		303,
		target ? `/seasons/${target}/transfer?${summaryQuery(outcome.summary)}` : `/import?${summaryQuery(outcome.summary)}`
	);
}

/** The owner confirms a preview: it is written in one transaction, or refused when stale (409). */
export async function applyAction(event: RequestEvent): Promise<ActionFailure<ImportFailure>> {
	const { farm, user } = requireCan(event, 'season.import');
	const form = await event.request.formData().catch(() => null);
	const token = form?.get('token');
	if (typeof token !== 'string' || token === '')
		return fail(400, { importMessage: 'The confirmation names no preview; upload the file again.', importIssues: [] });
	const out = await applySeasonUpdate(farm.id, user.id, token);
	if (!out.ok) return fail(out.status, { importMessage: out.message, importIssues: [] });
	const q = new URLSearchParams({
		updated: '1',
		added: String(out.added),
		changed: String(out.changed),
		removed: String(out.removed)
	});
	redirect(303, `/seasons/${out.seasonId}/transfer?${q}`);
}

/** What the last confirmed season update did, read back from the query string. */
export function updatedSummary(url: URL): { added: number; changed: number; removed: number } | null {
	if (url.searchParams.get('updated') !== '1') return null;
	const n = (k: string): number => Math.max(0, Number(url.searchParams.get(k)) || 0);
	return { added: n('added'), changed: n('changed'), removed: n('removed') };
}

/** The summary of the last import, read back from the query string. */
export function importedSummary(
	url: URL
): { crops: number; varieties: number; beds: number; plantings: number; seasonCreated: boolean } | null {
	if (url.searchParams.get('imported') !== '1') return null;
	const n = (k: string): number => Math.max(0, Number(url.searchParams.get(k)) || 0);
	return {
		crops: n('crops'),
		varieties: n('varieties'),
		beds: n('beds'),
		plantings: n('plantings'),
		seasonCreated: url.searchParams.get('seasonCreated') === '1'
	};
}
