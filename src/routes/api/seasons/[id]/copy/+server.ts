// Copies the season into the next year (owner only): 201 with the new season and the report
// of what the frost, heat and rotation checks found; 409 when that year's season exists.
import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireCan } from '$lib/server/guards';
import { parseBody, seasonFromParams } from '$lib/server/api';
import { copySeason } from '$lib/server/season-copy';
import { z } from 'zod';

export const POST = (async (event) => {
	const { farm, user } = requireCan(event, 'season.copy');
	const season = await seasonFromParams(farm.id, event.params.id);
	// No options yet; an empty object keeps the door open and refuses stray fields.
	const parsed = await parseBody(event, z.strictObject({}));
	if (!parsed.ok) return parsed.response;
	const out = await copySeason(farm.id, season, user.id);
	if (!out.ok) return json({ message: out.message }, { status: out.status });
	return json({ report: out.report }, { status: 201 });
}) satisfies RequestHandler;
