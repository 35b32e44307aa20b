// The season's harvest log as JSON: GET lists records (everyone on the farm); POST logs one
// record, or a batch `{ records: [...] }` from the keyboard table, all or none (crew lead, owner).
import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireCan, requireUser } from '$lib/server/guards';
import { parseBody, seasonFromParams } from '$lib/server/api';
import * as harvests from '$lib/server/harvests';
import * as harvestLog from '$lib/server/harvest-log';
import { harvestBatchSchema, harvestSchema } from '$lib/schemas/harvest';

export const GET = (async (event) => {
	const { farm } = requireUser(event);
	const season = await seasonFromParams(farm.id, event.params.id);
	const today = await harvests.farmToday(farm.id);
	const [records, plantings] = await Promise.all([
		harvests.list(farm.id, season.id),
		harvests.plantingOptions(farm.id, season.id, today)
	]);
	return json({ today, harvests: records, plantings });
}) satisfies RequestHandler;

export const POST = (async (event) => {
	const { farm, user } = requireCan(event, 'harvests.log');
	const season = await seasonFromParams(farm.id, event.params.id);
	// A batch is told apart by its `records` list; anything else is one record.
	const peek = await event.request.clone().text();
	const isBatch = /^\s*\{\s*"records"\s*:/.test(peek);
	if (isBatch) {
		const parsed = await parseBody(event, harvestBatchSchema);
		if (!parsed.ok) return parsed.response;
		const out = await harvestLog.create(farm.id, season.id, user.id, parsed.data.records, true);
		if (!out.ok)
			return json({ message: 'Nothing was saved: fix the rows named.', errors: out.errors }, { status: out.status });
		return json({ harvests: out.value }, { status: 201 });
	}
	const parsed = await parseBody(event, harvestSchema);
	if (!parsed.ok) return parsed.response;
	const out = await harvestLog.create(farm.id, season.id, user.id, [parsed.data]);
	if (!out.ok)
		return json({ message: Object.values(out.errors).join(' '), errors: out.errors }, { status: out.status });
	return json({ harvest: out.value[0] }, { status: 201 });
}) satisfies RequestHandler;
