// The form action behind BulkBedsForm, shared by the set-up path and the Farm & beds page.
import { fail, type RequestEvent } from '@sveltejs/kit';
import { requireCan } from './guards';
import { addBeds } from './bed-bulk';
import { BedInputError } from './beds';
import { bulkBedsSchemaFor } from '$lib/schemas/farm';
import { displayPrefs } from './farms';
import { fieldErrors } from '$lib/schemas/common';
import { textValues } from '$lib/library-form';

export async function bulkBedsAction(event: RequestEvent) {
	const { farm } = requireCan(event, 'farm.settings');
	const values = textValues(await event.request.formData());
	const parsed = bulkBedsSchemaFor((await displayPrefs(farm.id)).unitSystem).safeParse(values);
	if (!parsed.success) return fail(400, { bulk: { errors: fieldErrors(parsed.error), values } });
	try {
		const out = await addBeds(farm.id, parsed.data);
		return { bulk: { added: out.names, block: out.block } };
	} catch (e) {
		if (e instanceof BedInputError) return fail(409, { bulk: { errors: { [e.field]: e.message }, values } });
		throw e;
	}
}
