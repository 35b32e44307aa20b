// Rows of one farm can point only at rows of the same farm. Every child table that carries
// farm_id references its parents by (farm_id, parent_id) → parent (farm_id, id), so a planting
// with farm B's farm_id in farm A's season (or on A's bed, or of A's variety) is refused by the
// database itself, whatever a route forgets to check.
//
// Each parent gets a unique key (farm_id, id) to be referenced; each child an index on its pair
// (named here, so down removes exactly what up made). The old one-column keys stay, except
// plantings.bed_id: its ON DELETE SET NULL cannot hold on a pair whose farm_id is NOT NULL, so
// the pair key cascades instead and removing a bed (src/lib/server/beds.ts) first takes its
// plantings off it, in one transaction, so no planting is ever deleted with a bed.
//
// Not covered: box_items (no farm_id; reached only through its share size), harvest_audit and
// variety_figure_changes.season_id (history that is set to NULL when its row goes), sessions.
import type { Knex } from 'knex';

const parents = ['blocks', 'beds', 'crops', 'varieties', 'seasons', 'plantings', 'share_sizes'];

interface PairKey {
	table: string;
	column: string;
	parent: string;
	onDelete: 'CASCADE' | 'RESTRICT';
	/** The parent's columns, when they are not (farm_id, id). */
	parentColumns?: [string, string];
}

const keys: PairKey[] = [
	{ table: 'beds', column: 'block_id', parent: 'blocks', onDelete: 'RESTRICT' },
	{ table: 'varieties', column: 'crop_id', parent: 'crops', onDelete: 'CASCADE' },
	{ table: 'plantings', column: 'season_id', parent: 'seasons', onDelete: 'CASCADE' },
	{ table: 'plantings', column: 'variety_id', parent: 'varieties', onDelete: 'RESTRICT' },
	{ table: 'plantings', column: 'bed_id', parent: 'beds', onDelete: 'CASCADE' },
	{ table: 'share_sizes', column: 'season_id', parent: 'seasons', onDelete: 'CASCADE' },
	{ table: 'channel_demand', column: 'season_id', parent: 'seasons', onDelete: 'CASCADE' },
	{ table: 'channel_demand', column: 'crop_id', parent: 'crops', onDelete: 'CASCADE' },
	{ table: 'harvest_records', column: 'planting_id', parent: 'plantings', onDelete: 'CASCADE' },
	{ table: 'box_swaps', column: 'season_id', parent: 'seasons', onDelete: 'CASCADE' },
	{ table: 'box_swaps', column: 'share_size_id', parent: 'share_sizes', onDelete: 'CASCADE' },
	{ table: 'box_swaps', column: 'from_crop_id', parent: 'crops', onDelete: 'CASCADE' },
	{ table: 'box_swaps', column: 'to_crop_id', parent: 'crops', onDelete: 'CASCADE' },
	{ table: 'variety_figure_changes', column: 'variety_id', parent: 'varieties', onDelete: 'CASCADE' },
	// A calendar feed belongs to a member of the farm: it goes when the membership goes.
	{
		table: 'calendar_feeds',
		column: 'user_id',
		parent: 'farm_members',
		onDelete: 'CASCADE',
		parentColumns: ['farm_id', 'user_id']
	}
];

const fkName = (k: PairKey) => `${k.table}_${k.column}_farm_fk`;
const indexName = (k: PairKey) => `${k.table}_farm_${k.column}_idx`;
const uniqueName = (table: string) => `${table}_farm_id_unique`;

// Parents before children, so each key finds its parent's (farm_id, id) already there.
const order = [
	'blocks',
	'crops',
	'seasons',
	'beds',
	'varieties',
	'plantings',
	'share_sizes',
	'channel_demand',
	'harvest_records',
	'box_swaps',
	'variety_figure_changes',
	'calendar_feeds'
];

export async function up(knex: Knex): Promise<void> {
	await knex.schema.alterTable('plantings', (t) => t.dropForeign(['bed_id']));
	// One ALTER TABLE per table: adding a checked foreign key copies the table, so each is copied once.
	for (const table of order) {
		const clauses: string[] = [];
		const bindings: string[] = [];
		if (parents.includes(table)) {
			clauses.push('ADD UNIQUE ?? (`farm_id`, `id`)');
			bindings.push(uniqueName(table));
		}
		for (const k of keys.filter((x) => x.table === table)) {
			const [pa, pb] = k.parentColumns ?? ['farm_id', 'id'];
			clauses.push(
				`ADD INDEX ?? (\`farm_id\`, ??), ADD CONSTRAINT ?? FOREIGN KEY (\`farm_id\`, ??) REFERENCES ?? (??, ??) ON DELETE ${k.onDelete}`
			);
			bindings.push(indexName(k), k.column, fkName(k), k.column, k.parent, pa, pb);
		}
		if (clauses.length) await knex.raw(`ALTER TABLE ?? ${clauses.join(', ')}`, [table, ...bindings]);
	}
}

/**
 * Drops an index that starts with farm_id. InnoDB lets a new index take over from the one the
 * farm_id foreign key had, so that key gets its own index back (knex's name for it) first.
 */
async function dropIndexKeepingFarmKey(knex: Knex, table: string, index: string): Promise<void> {
	const [rows] = await knex.raw(
		'SELECT COUNT(DISTINCT index_name) AS n FROM information_schema.statistics WHERE table_schema = DATABASE() AND table_name = ? AND column_name = ? AND seq_in_index = 1 AND index_name <> ?',
		[table, 'farm_id', index]
	);
	if (Number((rows as { n: number }[])[0].n) === 0)
		await knex.schema.alterTable(table, (t) => t.index(['farm_id'], `${table}_farm_id_foreign`));
	await knex.raw('ALTER TABLE ?? DROP INDEX ??', [table, index]);
}

export async function down(knex: Knex): Promise<void> {
	for (const k of [...keys].reverse()) {
		await knex.schema.alterTable(k.table, (t) => t.dropForeign(['farm_id', k.column], fkName(k)));
	}
	for (const k of [...keys].reverse()) await dropIndexKeepingFarmKey(knex, k.table, indexName(k));
	await knex.schema.alterTable('plantings', (t) => t.foreign('bed_id').references('beds.id').onDelete('SET NULL'));
	for (const table of [...parents].reverse()) {
		await dropIndexKeepingFarmKey(knex, table, uniqueName(table));
	}
}
