// Which work a planting asks of the crew, and on which days: the one rule the crew's week view and
// sheets (server/plantings.ts tasksForWeek, sheets/next-task.ts), the workbook's Weekly tasks
// sheet (server/export/rows.ts) and the calendar feed (server/calendar.ts) all follow.
// - Tray sowing on the tray sowing date (only a transplant has one), field work on the field date (direct
//   sowing or transplanting), while the planting has not failed.
// - Harvest every day from the first to the last harvest, while it has neither failed nor finished.
import type { PlantingStatus } from './table';

export type TaskKind = 'tray_sow' | 'direct_sow' | 'transplant' | 'harvest';

/** The statuses whose planting no longer has a task of this kind to do. */
export function doneStatuses(kind: TaskKind): readonly PlantingStatus[] {
	return kind === 'harvest' ? ['failed', 'finished'] : ['failed'];
}

/** The planting's date column each kind of task falls on (its first day, for a harvest). */
export const taskColumn: Record<TaskKind, 'tray_sow_date' | 'field_date' | 'first_harvest'> = {
	tray_sow: 'tray_sow_date',
	direct_sow: 'field_date',
	transplant: 'field_date',
	harvest: 'first_harvest'
};

export interface TaskPlanting {
	method: 'direct' | 'transplant';
	status: string;
	traySowDate: string | null;
	fieldDate: string;
	firstHarvest: string;
	lastHarvest: string;
}

export interface PlantingTask {
	kind: TaskKind;
	/** First and last day of the work (the same day but for a harvest). */
	from: string;
	to: string;
}

/**
 * The planting's tasks. `record` keeps the tasks of a finished planting's harvest too, for a
 * calendar that shows what was done as well as what is to do.
 */
export function plantingTasks(p: TaskPlanting, opts: { record?: boolean } = {}): PlantingTask[] {
	const open = (kind: TaskKind): boolean =>
		!doneStatuses(kind).includes(p.status as PlantingStatus) || (!!opts.record && p.status === 'finished');
	const out: PlantingTask[] = [];
	if (p.traySowDate && open('tray_sow')) out.push({ kind: 'tray_sow', from: p.traySowDate, to: p.traySowDate });
	const field: TaskKind = p.method === 'direct' ? 'direct_sow' : 'transplant';
	if (open(field)) out.push({ kind: field, from: p.fieldDate, to: p.fieldDate });
	if (open('harvest')) out.push({ kind: 'harvest', from: p.firstHarvest, to: p.lastHarvest });
	return out;
}
