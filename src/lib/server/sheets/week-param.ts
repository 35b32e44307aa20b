// The [isoWeek] of a sheet's URL: a well-formed ISO week that exists (else 400) and touches the
// season's dates (else 404).
import { addDays, weekStart } from '$lib/planning';
import { isoWeekProblem } from '$lib/schemas/common';
import type { Season } from '../seasons';

export type WeekParam =
	{ ok: true; week: string; monday: string; sunday: string } | { ok: false; status: 400 | 404; message: string };

export function parseWeekParam(raw: string, season: Season): WeekParam {
	const week = raw.toUpperCase();
	const problem = isoWeekProblem('week', week);
	if (problem) return { ok: false, status: 400, message: `"${raw}" is not an ISO week we plan for: ${problem}` };
	let monday: string;
	try {
		monday = weekStart(week);
	} catch (e) {
		return { ok: false, status: 400, message: `"${raw}" is not an ISO week: ${(e as Error).message}.` };
	}
	const sunday = addDays(monday, 6);
	if (sunday < season.startsOn || monday > season.endsOn) {
		return {
			ok: false,
			status: 404,
			message: `${week} is outside ${season.name} (${season.startsOn} to ${season.endsOn}).`
		};
	}
	return { ok: true, week, monday, sunday };
}
