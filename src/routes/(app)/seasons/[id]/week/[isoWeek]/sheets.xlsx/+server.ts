// The week's crew sheets as a workbook download (the same file the e-mail carries).
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guards';
import { sheetContext } from '$lib/server/sheets/context';
import { weekSheet } from '$lib/server/sheets/week';
import { weekWorkbook } from '$lib/server/sheets/workbook';

export const GET: RequestHandler = async (event) => {
	const { farm } = requireUser(event);
	const ctx = await sheetContext(farm.id, event.params.id, event.params.isoWeek);
	const sheet = await weekSheet(farm.id, ctx.season.id, ctx.week, ctx.monday, ctx.sunday);
	const body = await weekWorkbook(sheet, `Crew sheets ${ctx.week} · ${ctx.season.name}`, farm.name);
	return new Response(new Uint8Array(body), {
		headers: {
			'content-type': 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
			'content-disposition': `attachment; filename="crew-sheets-${ctx.week}.xlsx"`,
			'cache-control': 'private, no-store'
		}
	});
};
