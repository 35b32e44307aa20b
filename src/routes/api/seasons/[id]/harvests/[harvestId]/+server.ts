// One harvest record: GET (everyone), PATCH and DELETE (crew lead, owner). Every edit and
// delete is kept in the audit trail with the values before and after.
import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireCan, requireUser } from '$lib/server/guards';
import { parseBody, seasonFromParams } from '$lib/server/api';
import * as harvests from '$lib/server/harvests';
import * as harvestLog from '$lib/server/harvest-log';
import { harvestPatchSchema } from '$lib/schemas/harvest';

function idOf(raw: string): number {
	const id = Number(raw);
	if (!Number.isInteger(id) || id <= 0) error(404, 'No such harvest record in this season.');
	return id;
}

export const GET = (async (event) => {
	const { farm } = requireUser(event);
	const season = await seasonFromParams(farm.id, event.params.id);
	const record = await harvests.get(farm.id, season.id, idOf(event.params.harvestId));
	if (!record) error(404, 'No such harvest record in this season.');
	return json({ harvest: record });
}) satisfies RequestHandler;

export const PATCH = (async (event) => {
	const { farm, user } = requireCan(event, 'harvests.log');
	const season = await seasonFromParams(farm.id, event.params.id);
	const id = idOf(event.params.harvestId);
	const parsed = await parseBody(event, harvestPatchSchema);
	if (!parsed.ok) return parsed.response;
	const out = await harvestLog.update(farm.id, season.id, id, user.id, parsed.data);
	if (!out.ok)
		return json({ message: Object.values(out.errors).join(' '), errors: out.errors }, { status: out.status });
	return json({ harvest: out.value });
}) satisfies RequestHandler;

export const DELETE = (async (event) => {
	const { farm, user } = requireCan(event, 'harvests.log');
	const season = await seasonFromParams(farm.id, event.params.id);
	if (!(await harvestLog.remove(farm.id, season.id, idOf(event.params.harvestId), user.id)))
		error(404, 'No such harvest record in this season.');
	return new Response(null, { status: 204 });
}) satisfies RequestHandler;
