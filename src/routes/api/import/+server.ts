import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireCan, type Viewer } from '$lib/server/guards';
import { seasonFromParams } from '$lib/server/api';
import { importUpload } from '$lib/server/import';
import { drainUpload, readUpload } from '$lib/server/import/request';

/**
 * POST multipart/form-data: `file` (.xlsx as Furrowcast exports it, or one sheet as .csv),
 * optional `seasonId` (plantings go into that season instead of the file's Season sheet) and
 * `sheet` (what a CSV holds). Owner only. 201 with what was written, or 400/413/415 with every
 * refused cell as { sheet, row, column, header, message }; nothing is written then.
 * Into a season that already holds plantings nothing is written: 200 with { preview } (added,
 * changed field by field, removed, unchanged, duplicates, and a token for POST /api/import/apply).
 */
export const POST: RequestHandler = async (event) => {
	let viewer: Viewer;
	try {
		viewer = requireCan(event, 'season.import');
	} catch (refusal) {
		await drainUpload(event);
		throw refusal;
	}
	const { farm, user } = viewer;
	const upload = await readUpload(event);
	if (!upload.ok) return json({ message: upload.message, errors: upload.issues }, { status: upload.status });
	if (upload.options.seasonId !== undefined) await seasonFromParams(farm.id, String(upload.options.seasonId));
	const outcome = await importUpload(farm.id, user.id, upload.file, upload.options);
	if (!outcome.ok) return json({ message: outcome.message, errors: outcome.issues }, { status: outcome.status });
	// A season that holds plantings is not written yet: the preview goes back, confirmed at /api/import/apply.
	if ('preview' in outcome) return json({ preview: outcome.preview }, { status: 200 });
	return json(outcome.summary, { status: 201 });
};
