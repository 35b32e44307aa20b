// The task rule of plantings/tasks.ts as SQL: the plantings (as `p`) with a task of a kind in the
// days from..until. A harvest is in them while it runs on any of those days.
import type { Knex } from 'knex';
import { doneStatuses, taskColumn, type TaskKind } from '$lib/plantings/tasks';

export function whereTask<Q extends Knex.QueryBuilder>(q: Q, kind: TaskKind, from: string, until: string): Q {
	q.whereNotIn('p.status', [...doneStatuses(kind)]);
	if (kind === 'harvest') q.where('p.first_harvest', '<=', until).andWhere('p.last_harvest', '>=', from);
	else q.whereBetween(`p.${taskColumn[kind]}`, [from, until]);
	if (kind === 'direct_sow' || kind === 'transplant')
		q.andWhere('p.method', kind === 'direct_sow' ? 'direct' : 'transplant');
	return q;
}
