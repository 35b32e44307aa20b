import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guards';
import { seasonFromParams } from '$lib/server/api';
import { getDemand } from '$lib/server/demand';
import { demandRows, toCsv, toXlsx } from '$lib/server/import/demand';
import { displayPrefs } from '$lib/server/farms';

/** The season's demand in the upload layout (the template): ?format=csv (default) or xlsx. */
export const GET: RequestHandler = async (event) => {
	const { farm } = requireUser(event);
	const season = await seasonFromParams(farm.id, event.params.id);
	const format = event.url.searchParams.get('format') ?? 'csv';
	if (format !== 'csv' && format !== 'xlsx') error(400, 'format must be csv or xlsx.');
	// In the farm's units (kg on a metric farm); the upload reads kg and lb alike.
	const [view, prefs] = await Promise.all([getDemand(farm.id, season.id), displayPrefs(farm.id)]);
	const rows = demandRows(view, prefs.unitSystem);
	const name = `demand-${season.year}.${format}`;
	const disposition = `attachment; filename="${name}"`;
	if (format === 'csv')
		return new Response(toCsv(rows), {
			headers: { 'content-type': 'text/csv; charset=utf-8', 'content-disposition': disposition }
		});
	return new Response(new Uint8Array(await toXlsx(rows)), {
		headers: {
			'content-type': 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
			'content-disposition': disposition
		}
	});
};
