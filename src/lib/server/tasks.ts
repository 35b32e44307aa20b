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
	{ ok: true; status: Status; version: number } | { ok: false; code: 404 | 409 | 400; field?: string; message: string };

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
			.first('id', 'method', 'status', 'version', 'notes', 'actual_first_harvest');
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
		return { ok: true, status, version: row.version + 1 } as const;
	});
}
