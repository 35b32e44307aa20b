import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guards';
import * as farms from '$lib/server/farms';
import { tasksForWeek } from '$lib/server/plantings';
import { addDays, addWeeks, isoWeek, weekStart } from '$lib/planning/iso-week';
import { todayIn } from '$lib/today';
import { isoWeekProblem } from '$lib/schemas/common';

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
	return {
		week,
		monday,
		sunday,
		today,
		isCurrent: week === isoWeek(today),
		previousWeek: addWeeks(week, -1),
		nextWeek: addWeeks(week, 1),
		tasks: await tasksForWeek(farm.id, monday, sunday)
	};
}) satisfies PageServerLoad;
