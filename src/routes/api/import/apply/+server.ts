import { json } from '@sveltejs/kit';
import { z } from 'zod';
import type { RequestHandler } from './$types';
import { requireCan } from '$lib/server/guards';
import { applySeasonUpdate } from '$lib/server/import/season-update';

const body = z
	.object({ token: z.string({ error: 'token is required.' }).min(1, 'token is required.').max(100) })
	.strict();

/**
 * POST { token } from an import preview: writes it in one transaction. Owner only. 200 with
 * { seasonId, added, changed, removed }; 404 when the preview is gone (expired, another user's);
 * 409 when the season changed after the preview was made (nothing is written).
 */
export const POST: RequestHandler = async (event) => {
	const { farm, user } = requireCan(event, 'season.import');
	const parsed = body.safeParse(await event.request.json().catch(() => null));
	if (!parsed.success)
		return json(
			{ message: parsed.error.issues[0].message, errors: { token: parsed.error.issues[0].message } },
			{ status: 400 }
		);
	const out = await applySeasonUpdate(farm.id, user.id, parsed.data.token);
	if (!out.ok) return json({ message: out.message }, { status: out.status });
	return json(out);
};
