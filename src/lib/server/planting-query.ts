// The start of most reads of plantings: each planting (`p`) with its variety (`v`) and crop (`c`)
// joined in. The plantings repository (plantings.ts) and the other readers build on it.
import type { Knex } from 'knex';
import { db } from './db';

export function plantingsWithCrop(conn: Knex = db()) {
	return conn('plantings as p').join('varieties as v', 'v.id', 'p.variety_id').join('crops as c', 'c.id', 'v.crop_id');
}
