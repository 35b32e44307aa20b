// Resolves the season and week of a sheet URL for loads and actions alike. Actions run before
// the season layout's load, so they must check the season themselves (another farm's: 404).
import { error } from '@sveltejs/kit';
import * as seasons from '../seasons';
import type { Season } from '../seasons';
import { parseWeekParam } from './week-param';

export interface SheetContext {
	season: Season;
	week: string;
	monday: string;
	sunday: string;
}

export async function sheetContext(farmId: number, seasonParam: string, weekParam: string): Promise<SheetContext> {
	const id = Number(seasonParam);
	const season = Number.isInteger(id) && id > 0 ? await seasons.get(farmId, id) : null;
	if (!season) error(404, 'No such season on this farm.');
	const w = parseWeekParam(weekParam, season);
	if (!w.ok) error(w.status, w.message);
	return { season, week: w.week, monday: w.monday, sunday: w.sunday };
}
