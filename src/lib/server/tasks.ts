// Marking a crew task done: the planting's status moves forward to what the task implies and the
// matching actual date is recorded, in one transaction with the row locked, bumping `version`.
import { db } from './db';
import { shareSeasonLock } from './seasons';
import { seasonDateProblem } from '$lib/schemas/common';
import type { MarkDone, TaskKind } from './sheets/schemas';

type Status = 'planned' | 'sown' | 'transplanted' | 'harvesting' | 'finished' | 'failed';

// Status only ever moves forward: ticking the tray sowing of a planting already in the field
// records the date but leaves it "transplanted".
const rank: Record<Exclude<Status, 'failed'>, number> = {
	planned: 0,
	sown: 1,
	transplanted: 2,
	harvesting: 3,
	finished: 4
};

const implied: Record<
	TaskKind,
	{ status: Exclude<Status, 'failed'>; column: string; method?: 'direct' | 'transplant' }
> = {
	tray_sow: { status: 'sown', column: 'actual_tray_sow_date', method: 'transplant' },
	direct_sow: { status: 'sown', column: 'actual_field_date', method: 'direct' },
	transplant: { status: 'transplanted', column: 'actual_field_date', method: 'transplant' },
	harvest: { status: 'harvesting', column: 'actual_first_harvest' },
	finish: { status: 'finished', column: 'actual_last_harvest' }
};

export type MarkDoneResult =
	| { ok: true; status: Status; version: number; markId: number }
	| { ok: false; code: 404 | 409 | 400; field?: string; message: string };

/** The planting fields a tick may change, and an undo puts back. */
const undoable = [
	'status',
	'notes',
	'actual_tray_sow_date',
	'actual_field_date',
	'actual_first_harvest',
	'actual_last_harvest'
];

/** Marks one task of a planting of this farm and season done (a planting elsewhere is 404). */
export async function markTaskDone(
	farmId: number,
	seasonId: number,
	userId: string,
	input: MarkDone,
	today: string
): Promise<MarkDoneResult> {
	if (input.date > today)
		return { ok: false, code: 400, field: 'date', message: `Actual date cannot be after today (${today}).` };
	const rule = implied[input.kind];
	return db().transaction(async (trx) => {
		await shareSeasonLock(trx, farmId, seasonId);
		const row = await trx('plantings')
			.where({ id: input.plantingId, farm_id: farmId, season_id: seasonId })
			.forUpdate()
			.first(
				'id',
				'method',
				'status',
				'version',
				'notes',
				'actual_tray_sow_date',
				'actual_field_date',
				'actual_first_harvest',
				'actual_last_harvest'
			);
		if (!row) return { ok: false, code: 404, message: 'No such planting in this season.' } as const;
		// The same date rules as an edit in the grid or the API.
		const season = await trx('seasons').where({ id: seasonId, farm_id: farmId }).first('year');
		const wrong = season ? seasonDateProblem('Actual date', input.date, Number(season.year)) : null;
		if (wrong) return { ok: false, code: 400, field: 'date', message: wrong } as const;
		if (input.version !== undefined && input.version !== row.version) {
			return {
				ok: false,
				code: 409,
				message: 'Someone changed this planting since the sheet was opened. Reload the sheet and try again.'
			} as const;
		}
		if (row.status === 'failed')
			return {
				ok: false,
				code: 409,
				message: 'This planting is marked failed; change its status in the planting grid first.'
			} as const;
		if (rule.method && rule.method !== row.method) {
			return {
				ok: false,
				code: 400,
				field: 'kind',
				message: `This planting is ${row.method === 'direct' ? 'direct-sown' : 'transplanted'}; that task does not apply.`
			} as const;
		}
		const current = row.status as Exclude<Status, 'failed'>;
		const status = rank[rule.status] > rank[current] ? rule.status : current;
		const patch: Record<string, unknown> = {
			status,
			[rule.column]: input.date,
			version: row.version + 1,
			updated_by: userId,
			updated_at: new Date()
		};
		// The first harvest keeps its first date; finishing without a logged start fills it too.
		if (input.kind === 'harvest' && row.actual_first_harvest) delete patch.actual_first_harvest;
		if (input.kind === 'finish' && !row.actual_first_harvest) patch.actual_first_harvest = input.date;
		if (input.note)
			patch.notes = [row.notes, `${input.date} ${input.kind.replace('_', ' ')}: ${input.note}`]
				.filter(Boolean)
				.join('\n');
		await trx('plantings').where({ id: row.id }).update(patch);
		// What the tick changed, as it was, so it can be taken back (undoTaskMark).
		const before = Object.fromEntries(
			Object.keys(patch)
				.filter((k) => undoable.includes(k))
				.map((k) => [k, (row as Record<string, unknown>)[k] ?? null])
		);
		const [markId] = await trx('task_marks').insert({
			farm_id: farmId,
			planting_id: row.id,
			kind: input.kind,
			done_on: input.date,
			before_values: JSON.stringify(before),
			version_after: row.version + 1,
			marked_by: userId
		});
		return { ok: true, status, version: row.version + 1, markId } as const;
	});
}

export type UndoResult = { ok: true } | { ok: false; code: 404 | 409; message: string };

/**
 * Takes back a tick on the crew sheet: the planting's status, actual date and note go back to what
 * they were, in one step. Refused (409) once anyone changed the planting since the tick, or when
 * the tick was already taken back; the tick and its undoing both stay on record.
 */
export async function undoTaskMark(
	farmId: number,
	seasonId: number,
	userId: string,
	markId: number
): Promise<UndoResult> {
	return db().transaction(async (trx) => {
		await shareSeasonLock(trx, farmId, seasonId);
		const mark = await trx('task_marks as m')
			.join('plantings as p', function () {
				this.on('p.id', 'm.planting_id').andOn('p.farm_id', 'm.farm_id');
			})
			.where({ 'm.id': markId, 'm.farm_id': farmId, 'p.season_id': seasonId })
			.forUpdate()
			.first('m.id', 'm.planting_id', 'm.before_values', 'm.version_after', 'm.undone_at', 'p.version');
		if (!mark) return { ok: false, code: 404, message: 'No such tick on this season’s sheets.' } as const;
		if (mark.undone_at) return { ok: false, code: 409, message: 'That tick was already taken back.' } as const;
		if (Number(mark.version) !== Number(mark.version_after))
			return {
				ok: false,
				code: 409,
				message: 'The planting changed after that tick; correct it in the planting grid instead.'
			} as const;
		const before = JSON.parse(String(mark.before_values)) as Record<string, unknown>;
		const restore = Object.fromEntries(Object.entries(before).filter(([k]) => undoable.includes(k)));
		await trx('plantings')
			.where({ id: mark.planting_id, farm_id: farmId })
			.update({ ...restore, version: Number(mark.version) + 1, updated_by: userId, updated_at: new Date() });
		await trx('task_marks').where({ id: mark.id }).update({ undone_at: new Date(), undone_by: userId });
		return { ok: true } as const;
	});
}

/** The latest tick of each planting that can still be taken back (nobody changed the planting since). */
export async function undoableMarks(
	farmId: number,
	plantingIds: number[]
): Promise<Map<number, { id: number; kind: string }>> {
	if (!plantingIds.length) return new Map();
	const rows: { id: number; planting_id: number; kind: string }[] = await db()('task_marks as m')
		.join('plantings as p', function () {
			this.on('p.id', 'm.planting_id').andOn('p.farm_id', 'm.farm_id');
		})
		.where('m.farm_id', farmId)
		.whereIn('m.planting_id', plantingIds)
		.whereNull('m.undone_at')
		.whereRaw('m.version_after = p.version')
		.select('m.id', 'm.planting_id', 'm.kind');
	return new Map(rows.map((r) => [Number(r.planting_id), { id: Number(r.id), kind: r.kind }]));
}
