// What the plan screen needs besides the engine: a fingerprint of the state a preview was made
// from (so an apply from an outdated preview is refused), a snapshot of the planned plantings
// each apply replaces, and the one-step undo that puts them back exactly as they were.
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { db } from './db';
import { demandHash, lockSeason } from './seasons';
import { insertPlantings } from './planting-query';

export class PlanConflictError extends Error {
	constructor(
		message: string,
		readonly reason: 'stale' | 'nothing_to_undo' | 'moved_on'
	) {
		super(message);
	}
}

/**
 * The state a plan run depends on: the season's plan counter (bumped by every apply and undo),
 * every planting's id, version and status (so a grid edit or a sowing counts), and the weekly
 * targets. Two previews of the same state have the same fingerprint.
 */
export async function planFingerprint(
	farmId: number,
	seasonId: number,
	trx?: Knex.Transaction,
	demandDigest?: string
): Promise<string> {
	const q = trx ?? db();
	const season: { plan_version: number } | undefined = await q('seasons')
		.where({ farm_id: farmId, id: seasonId })
		.first('plan_version');
	const rows: { id: number; version: number; status: string }[] = await q('plantings')
		.where({ farm_id: farmId, season_id: seasonId })
		.orderBy('id')
		.select('id', 'version', 'status');
	const hash = createHash('sha256');
	hash.update(`v${season?.plan_version ?? 0};d${demandDigest ?? (await demandHash(farmId, seasonId))};`);
	for (const r of rows) hash.update(`${r.id}:${r.version}:${r.status},`);
	return hash.digest('hex').slice(0, 32);
}

/** A TIMESTAMP as MariaDB takes it back ('YYYY-MM-DD HH:MM:SS', UTC: the pool's time zone is Z). */
function sqlTime(v: unknown): unknown {
	return v instanceof Date ? v.toISOString().slice(0, 19).replace('T', ' ') : v;
}

/**
 * Inside the apply's transaction, before it deletes anything: locks the season row (a second
 * apply waits here) and refuses when the state moved on since the preview was made.
 */
// `demandDigest`: the demand hash, taken by apply together with the demand it plans from. Under the lock,
// work must stay on `trx`: planting edits queue behind the season lock holding pool connections, and
// asking the pool for another one could wait on them until the lock wait times out.
export async function lockForApply(
	trx: Knex.Transaction,
	farmId: number,
	seasonId: number,
	expected: string | undefined,
	demandDigest?: string
): Promise<void> {
	await lockSeason(trx, farmId, seasonId);
	if (expected === undefined) return;
	if ((await planFingerprint(farmId, seasonId, trx, demandDigest)) !== expected) {
		throw new PlanConflictError(
			'The plan or its demand changed since this preview was made (another apply, an undo, a grid edit or new demand). Preview again before applying.',
			'stale'
		);
	}
}

/** Rows of the planned plantings about to be replaced, every column, for the snapshot. */
export async function snapshotPlanned(trx: Knex.Transaction, ids: number[]): Promise<Record<string, unknown>[]> {
	if (ids.length === 0) return [];
	const rows: Record<string, unknown>[] = await trx('plantings').whereIn('id', ids).orderBy('id').select('*');
	return rows.map((r) => Object.fromEntries(Object.entries(r).map(([k, v]) => [k, sqlTime(v)])));
}

/** After the inserts: keeps the snapshot and the added ids, bumps the counter, stamps the time. */
export async function recordApply(
	trx: Knex.Transaction,
	a: {
		farmId: number;
		seasonId: number;
		userId: string;
		options: unknown;
		replaced: Record<string, unknown>[];
		demandDigest?: string;
	}
): Promise<void> {
	const season: { plan_applied_at: Date | null; plan_demand_hash: string | null } = await trx('seasons')
		.where({ farm_id: a.farmId, id: a.seasonId })
		.first('plan_applied_at', 'plan_demand_hash');
	// Everything still planned in the season now is what this apply added (the rest is kept work).
	const added = (
		await trx('plantings').where({ farm_id: a.farmId, season_id: a.seasonId, status: 'planned' }).select('id')
	).map((r) => r.id as number);
	await trx('plan_applies').insert({
		farm_id: a.farmId,
		season_id: a.seasonId,
		applied_by: a.userId,
		options: JSON.stringify(a.options ?? {}),
		replaced: JSON.stringify(a.replaced),
		added_ids: JSON.stringify(added),
		previous_demand_hash: season.plan_demand_hash,
		previous_applied_at: sqlTime(season.plan_applied_at)
	});
	await trx('seasons')
		.where({ farm_id: a.farmId, id: a.seasonId })
		.update({
			plan_version: trx.raw('plan_version + 1'),
			plan_applied_at: trx.fn.now(),
			plan_demand_hash: a.demandDigest ?? (await demandHash(a.farmId, a.seasonId))
		});
	// Only the last apply can be undone; older snapshots are kept a while as history, then dropped.
	const old = await trx('plan_applies')
		.where({ season_id: a.seasonId })
		.orderBy('id', 'desc')
		.offset(10)
		.limit(1000)
		.select('id');
	const oldIds = old.map((r) => r.id);
	if (oldIds.length) await trx('plan_applies').whereIn('id', oldIds).delete();
}

export interface LastApply {
	id: number;
	appliedAt: string;
	appliedBy: string | null;
	options: unknown;
	replaced: number;
	added: number;
	undoneAt: string | null;
}

export async function lastApply(farmId: number, seasonId: number): Promise<LastApply | null> {
	const r = await db()('plan_applies as a')
		.leftJoin('users as u', 'u.id', 'a.applied_by')
		.where({ 'a.farm_id': farmId, 'a.season_id': seasonId })
		.orderBy('a.id', 'desc')
		.first('a.id', 'a.applied_at', 'a.options', 'a.replaced', 'a.added_ids', 'a.undone_at', 'u.name as user_name');
	if (!r) return null;
	return {
		id: r.id,
		appliedAt: new Date(r.applied_at).toISOString(),
		appliedBy: r.user_name ?? null,
		options: JSON.parse(r.options),
		replaced: (JSON.parse(r.replaced) as unknown[]).length,
		added: (JSON.parse(r.added_ids) as unknown[]).length,
		undoneAt: r.undone_at ? new Date(r.undone_at).toISOString() : null
	};
}

/**
 * Undoes the season's last apply in one transaction: deletes the plantings it added and puts
 * back the planned plantings it replaced, with their ids, versions and times. Refused when the
 * last apply was already undone, or when a planting it added has since been sown or harvested
 * (undoing would throw that work away).
 */
export async function undoLastApply(
	farmId: number,
	seasonId: number,
	userId: string
): Promise<{ restored: number; removed: number }> {
	return db().transaction(async (trx) => {
		await lockSeason(trx, farmId, seasonId);
		const last = await trx('plan_applies')
			.where({ farm_id: farmId, season_id: seasonId })
			.orderBy('id', 'desc')
			.first();
		if (!last || last.undone_at)
			throw new PlanConflictError(
				'There is no apply to undo: the last one was already undone, or none was made.',
				'nothing_to_undo'
			);
		const addedIds = JSON.parse(last.added_ids) as number[];
		const replaced = JSON.parse(last.replaced) as Record<string, unknown>[];
		const present: { id: number; status: string }[] = addedIds.length
			? await trx('plantings')
					.where({ farm_id: farmId, season_id: seasonId })
					.whereIn('id', addedIds)
					.forUpdate()
					.select('id', 'status')
			: [];
		const moved = present.filter((p) => p.status !== 'planned');
		if (moved.length) {
			throw new PlanConflictError(
				`${moved.length} of the plantings this apply made ${moved.length === 1 ? 'has' : 'have'} since been sown or harvested; undoing would delete that work.`,
				'moved_on'
			);
		}
		const harvested = present.length
			? await trx('harvest_records')
					.whereIn(
						'planting_id',
						present.map((p) => p.id)
					)
					.count({ n: '*' })
					.first()
			: { n: 0 };
		if (Number(harvested?.n ?? 0) > 0)
			throw new PlanConflictError(
				'Harvests are logged against plantings this apply made; undoing would delete them.',
				'moved_on'
			);
		const presentIds = present.map((p) => p.id);
		if (presentIds.length) await trx('plantings').whereIn('id', presentIds).delete();
		await insertPlantings(trx, replaced);
		await trx('plan_applies').where({ id: last.id }).update({ undone_at: trx.fn.now(), undone_by: userId });
		await trx('seasons')
			.where({ farm_id: farmId, id: seasonId })
			.update({
				plan_version: trx.raw('plan_version + 1'),
				plan_applied_at: last.previous_applied_at,
				plan_demand_hash: last.previous_demand_hash
			});
		return { restored: replaced.length, removed: present.length };
	});
}
