// A season's plantings as one JSON array, written by MariaDB itself: one JSON_OBJECT per row, in
// the exact shape of PlantingView (plantings.ts toView; its fields from the field table). The
// planting grid asks for every row of a season at once; for 5,000 rows, building 5,000 row objects in Node, converting them and
// stringifying 3 MB took several times longer than the database's own JSON functions, and held
// the server's one thread while it did. tests/integration/plantings-json.test.ts checks that this
// parses to the same value as JSON.stringify(listForSeason(…)), field by field.
// The GET route keeps its answer until a table read here changes: a table added to this query must
// be stamped too (db/migrations/20261203_11d_change_stamps.ts, plantings-cache.ts).
import { plantingFieldTable, plantingFigureTable } from '$lib/plantings/fields';
import { db } from './db';

/** A stored field's or figure's SQL: decimals as doubles, so 20.0 reads 20 as Number() gives it. */
const stored = (spec: { column: string; decimal?: boolean }): string =>
	spec.decimal ? `CAST(p.\`${spec.column}\` AS DOUBLE)` : `p.\`${spec.column}\``;

/** PlantingView's keys and the SQL that gives each; the fields and figures from their tables. */
const fields: [string, string][] = [
	['id', 'p.id'],
	['seasonId', 'p.season_id'],
	['variety', 'v.name'],
	['crop', 'c.name'],
	['family', 'c.family'],
	['harvestUnit', 'c.harvest_unit'],
	['bed', 'b.name'],
	['block', 'k.name'],
	['blockPosition', 'k.position'],
	['bedPosition', 'b.position'],
	...Object.entries(plantingFieldTable).map(([k, spec]): [string, string] => [k, stored(spec)]),
	...Object.entries(plantingFigureTable).map(([k, spec]): [string, string] => [k, stored(spec)]),
	['version', 'p.version'],
	['updatedBy', 'u.name'],
	// ISO 8601 in UTC whatever the session's time zone: seconds since the epoch added to 1970-01-01.
	[
		'updatedAt',
		"DATE_FORMAT('1970-01-01 00:00:00' + INTERVAL UNIX_TIMESTAMP(p.updated_at) SECOND, '%Y-%m-%dT%H:%i:%s.000Z')"
	]
];
// CAST … AS CHAR: plain text, which the driver passes on as it is (a JSON column it would parse).
const rowJson = `CAST(JSON_OBJECT(${fields.map(([k, sql]) => `'${k}', ${sql}`).join(', ')}) AS CHAR)`;

/** `[{…}, …]`: the season's plantings in field-date order, as listForSeason gives them. */
export async function seasonPlantingsJson(farmId: number, seasonId: number): Promise<string> {
	// STRAIGHT_JOIN: plantings are read first, through an index that starts with (farm_id, season_id),
	// whatever the other farms' rows make the optimizer think of the small tables.
	const [rows] = (await db().raw(
		`SELECT STRAIGHT_JOIN ${rowJson} AS j
		 FROM plantings p
		 JOIN varieties v ON v.id = p.variety_id
		 JOIN crops c ON c.id = v.crop_id
		 LEFT JOIN beds b ON b.id = p.bed_id
		 LEFT JOIN blocks k ON k.id = b.block_id
		 LEFT JOIN users u ON u.id = p.updated_by
		 WHERE p.farm_id = ? AND p.season_id = ?
		 ORDER BY p.field_date, p.id`,
		[farmId, seasonId]
	)) as [{ j: string }[]];
	let out = '[';
	for (let i = 0; i < rows.length; i++) out += (i ? ',' : '') + rows[i].j;
	return out + ']';
}
