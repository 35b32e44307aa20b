import type { RequestHandler } from './$types';
import { requireCan } from '$lib/server/guards';
import { seasonFromParams } from '$lib/server/api';
import { displayPrefs } from '$lib/server/farms';
import { seasonSeedOrder, seedOrderCsv } from '$lib/server/seed-order';

/** The season's seed order as CSV, for a seed company's order form or a spreadsheet. */
export const GET: RequestHandler = async (event) => {
	const { farm } = requireCan(event, 'plan.read');
	const season = await seasonFromParams(farm.id, event.params.id);
	const [{ lines }, prefs] = await Promise.all([seasonSeedOrder(farm.id, season), displayPrefs(farm.id)]);
	const name = `furrowcast-seed-order-${season.year}.csv`;
	return new Response(seedOrderCsv(lines, prefs.currency, prefs.unitSystem), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': `attachment; filename="${name}"`,
			'cache-control': 'private, no-store'
		}
	});
};
