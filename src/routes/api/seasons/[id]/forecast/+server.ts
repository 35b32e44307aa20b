// GET /api/seasons/{id}/forecast?crops=3,7&from=2027-W20&to=2027-W30 — weekly supply, demand,
// shortfall and surplus per crop, for the forecast charts. Every role may read it.
// &shape=series answers per crop with arrays across the weeks instead of a row per crop-week.
import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guards';
import { invalidAnswer, seasonFromParams } from '$lib/server/api';
import { seasonForecast, toSeries } from '$lib/server/forecast';
import { forecastQuerySchema, MAX_FORECAST_WEEKS } from '$lib/schemas/forecast';
import { fieldErrors } from '$lib/schemas/common';
import { weeksBetween } from '$lib/planning';
import type { ForecastAnswer, ForecastSeriesAnswer } from '$lib/api-answers';

const bad = (errors: Record<string, string>): Response => invalidAnswer(errors, 'query');

export const GET: RequestHandler = async (event) => {
	const { farm } = requireUser(event);
	const season = await seasonFromParams(farm.id, event.params.id);
	const params = event.url.searchParams;
	const raw: Record<string, string> = {};
	for (const name of ['crops', 'from', 'to', 'shape']) if (params.has(name)) raw[name] = params.getAll(name).join(',');
	const parsed = forecastQuerySchema.safeParse(raw);
	if (!parsed.success) return bad(fieldErrors(parsed.error));

	const f = await seasonForecast(farm.id, season);
	const from = parsed.data.from ?? f.weeks[0];
	const to = parsed.data.to ?? f.weeks[f.weeks.length - 1];
	if (from > to)
		return bad({
			[parsed.data.from ? 'from' : 'to']:
				`the range ${from}–${to} is empty; the season runs ${f.weeks[0]}–${f.weeks[f.weeks.length - 1]}.`
		});
	const weeks = weeksBetween(from, to);
	if (weeks.length > MAX_FORECAST_WEEKS) return bad({ to: `at most ${MAX_FORECAST_WEEKS} weeks at once.` });

	const known = new Set(f.crops.map((c) => c.id));
	const asked = parsed.data.crops?.map(String);
	const unknown = asked?.filter((id) => !known.has(id)) ?? [];
	if (unknown.length) return bad({ crops: `no crop ${unknown.join(', ')} on this farm.` });

	const inRange = f.rows.filter((r) => r.week >= from && r.week <= to);
	// Without a list, the crops that have supply or demand in the range.
	const chosen = new Set(asked ?? inRange.filter((r) => r.supply > 0 || r.demand > 0).map((r) => r.crop));
	const serverTiming = `db;dur=${f.timing.db.toFixed(1)}, engine;dur=${f.timing.engine.toFixed(1)}`;
	const rows = inRange.filter((r) => chosen.has(r.crop));
	const head = {
		season: { id: season.id, name: season.name },
		from,
		to,
		weeks,
		currentWeek: f.currentWeek,
		crops: f.crops.filter((c) => chosen.has(c.id))
	};
	const body: ForecastAnswer | ForecastSeriesAnswer =
		parsed.data.shape === 'series' ? { ...head, series: toSeries(rows, weeks) } : { ...head, rows };
	return json(body, { headers: { 'server-timing': serverTiming } });
};
