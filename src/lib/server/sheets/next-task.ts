// The first day on or after a date when a season has crew work: a tray to sow, a bed to sow or
// plant, or a harvest running (the task rule of plantings/tasks.ts). The crew sheets open on it
// when the current week has nothing (in winter the season's first week is often empty), so the
// crew lead lands on real work.
import { taskColumn, type TaskKind } from '$lib/plantings/tasks';
import { db } from '../db';
import { whereTask } from '../planting-tasks';

const kinds: TaskKind[] = ['tray_sow', 'direct_sow', 'transplant', 'harvest'];

export async function nextTaskDate(
	farmId: number,
	seasonId: number,
	from: string,
	until: string
): Promise<string | null> {
	const firsts = await Promise.all(
		kinds.map((kind) =>
			whereTask(db()('plantings as p').where({ 'p.farm_id': farmId, 'p.season_id': seasonId }), kind, from, until)
				.min({ d: `p.${taskColumn[kind]}` })
				.first()
		)
	);
	// A harvest already running on `from` counts from `from`; one still to come from its first day.
	const dates = firsts
		.map((r) => r?.d)
		.filter((d): d is string => typeof d === 'string' && d !== '')
		.map((d) => (d < from ? from : d));
	return dates.length ? dates.sort()[0] : null;
}
