// The plantings table's two shared primitives: the start of most reads — each planting (`p`) with
// its variety (`v`) and crop (`c`) joined in — and the batched insert every bulk writer uses (plan
// apply and undo, import, season copy). The plantings repository (plantings.ts) builds on them.
import type { Knex } from 'knex';
import { db } from './db';

export function plantingsWithCrop(conn: Knex = db()) {
	return conn('plantings as p').join('varieties as v', 'v.id', 'p.variety_id').join('crops as c', 'c.id', 'v.crop_id');
}

/** Rows per INSERT: a whole season's plan, import or copy goes in a few statements. */
const INSERT_BATCH = 500;

/** Writes new planting rows in batches, inside the caller's transaction. */
export async function insertPlantings(trx: Knex.Transaction, rows: readonly object[]): Promise<void> {
	for (let i = 0; i < rows.length; i += INSERT_BATCH) await trx('plantings').insert(rows.slice(i, i + INSERT_BATCH));
}
