// The upload's form fields, shared by the JSON route and the page's form action.
import type { RequestEvent } from '@sveltejs/kit';
import { fieldErrors } from '$lib/schemas/common';
import { IMPORT_MAX_BYTES, importOptionsSchema, type ImportIssue, type ImportOptions } from '$lib/schemas/import';

// Multipart framing around the file: boundaries and the other fields, never near this.
const FORM_OVERHEAD_BYTES = 64 * 1024;

export type UploadRequest =
	| { ok: true; file: File; options: ImportOptions }
	| { ok: false; status: 400 | 413 | 415; message: string; issues: ImportIssue[] };

const bad = (status: 400 | 413 | 415, header: string, message: string): UploadRequest => ({
	ok: false,
	status,
	message,
	issues: [{ sheet: 'upload', row: null, column: null, header, message }]
});

/** Reads the multipart body; a body past the limit is refused before it is read. */
export async function readUpload(event: RequestEvent, seasonId?: number): Promise<UploadRequest> {
	const length = Number(event.request.headers.get('content-length') ?? 0);
	if (length > IMPORT_MAX_BYTES + FORM_OVERHEAD_BYTES)
		return bad(413, 'file', `The upload is over the ${IMPORT_MAX_BYTES / 1024 / 1024} MB limit.`);
	if (!(event.request.headers.get('content-type') ?? '').startsWith('multipart/form-data')) {
		return bad(415, 'file', 'Send the file as multipart/form-data, in a field named "file".');
	}
	let form: FormData;
	try {
		form = await event.request.formData();
	} catch {
		return bad(400, 'file', 'The upload could not be read as a form.');
	}
	const file = form.get('file');
	if (!(file instanceof File) || file.name === '') return bad(400, 'file', 'Choose a .xlsx or .csv file to import.');
	const parsed = importOptionsSchema.safeParse({
		seasonId: seasonId ?? form.get('seasonId') ?? undefined,
		sheet: form.get('sheet') ?? undefined
	});
	if (!parsed.success) {
		const errors = fieldErrors(parsed.error);
		const [field, message] = Object.entries(errors)[0];
		return bad(400, field, message);
	}
	return { ok: true, file, options: parsed.data };
}

/**
 * Reads and drops a refused upload's body (up to the limit) before the 401/403 goes out:
 * answering while the client is still sending makes many clients see a reset connection
 * instead of the answer.
 */
export async function drainUpload(event: RequestEvent): Promise<void> {
	const length = Number(event.request.headers.get('content-length') ?? 0);
	if (length > IMPORT_MAX_BYTES + FORM_OVERHEAD_BYTES) return;
	await event.request.arrayBuffer().catch(() => undefined);
}
