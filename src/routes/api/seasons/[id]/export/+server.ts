import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guards';
import { seasonFromParams } from '$lib/server/api';
import { exportSeason } from '$lib/server/export';

/**
 * The season as an .xlsx workbook, streamed. Every role may export: the plan is what the
 * crew and the share manager work from, and the file holds nothing they cannot already see.
 */
export const GET: RequestHandler = async (event) => {
	const { farm } = requireUser(event);
	const season = await seasonFromParams(farm.id, event.params.id);
	const file = await exportSeason(farm.id, season);
	return new Response(file.body, {
		headers: {
			'content-type': 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
			'content-disposition': `attachment; filename="${file.filename}"`,
			'cache-control': 'private, no-store',
			'x-furrowcast-rows': String(file.rows),
			'x-furrowcast-estimated-bytes': String(file.estimatedBytes)
		}
	});
};
