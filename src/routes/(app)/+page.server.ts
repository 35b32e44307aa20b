import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guards';
import * as farms from '$lib/server/farms';
import { tasksForWeek } from '$lib/server/plantings';
import { addDays, addWeeks, isoWeek, weekStart } from '$lib/planning/iso-week';
import { todayIn } from '$lib/today';
import { isoWeekProblem } from '$lib/schemas/common';
import * as seasons from '$lib/server/seasons';
import { nextTaskDate } from '$lib/server/sheets/next-task';

export const load = (async (event) => {
	const { farm } = requireUser(event);
	const settings = await farms.get(farm.id);
	const today = todayIn(settings.timeZone);
	const requested = event.url.searchParams.get('week');
	const problem = requested === null ? null : isoWeekProblem('week', requested);
	if (problem) error(400, problem);
	const week = requested ?? isoWeek(today);
	let monday: string;
	try {
		monday = weekStart(week);
	} catch (e) {
		error(400, (e as Error).message);
	}
	const sunday = addDays(monday, 6);
	const [tasks, seasonList] = await Promise.all([tasksForWeek(farm.id, monday, sunday), seasons.list(farm.id)]);
	// The crew sheets of this week (one per season it falls in): marking done, logging harvests, printing.
	const sheets = seasonList
		.filter((s) => s.startsOn <= sunday && s.endsOn >= monday)
		.map((s) => ({ seasonId: s.id, name: s.name, week }));
	// A week without work: where the next work is, in the first season not yet over.
	const empty =
		!tasks.traySowing.length && !tasks.directSowing.length && !tasks.transplanting.length && !tasks.harvest.length;
	const upcoming = [...seasonList].reverse().find((s) => s.endsOn > sunday);
	const nextDate =
		empty && upcoming ? await nextTaskDate(farm.id, upcoming.id, addDays(sunday, 1), upcoming.endsOn) : null;
	return {
		sheets,
		nextWork: nextDate && upcoming ? { seasonId: upcoming.id, name: upcoming.name, week: isoWeek(nextDate) } : null,
		week,
		monday,
		sunday,
		today,
		isCurrent: week === isoWeek(today),
		previousWeek: addWeeks(week, -1),
		nextWeek: addWeeks(week, 1),
		tasks
	};
}) satisfies PageServerLoad;
