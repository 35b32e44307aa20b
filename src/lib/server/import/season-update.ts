// An import into a season that already holds plantings: first a preview of what the file
// would change (kept on the server under a random token for a while), then, on the owner's
// confirmation, all of it in one transaction. A preview made before someone else changed the
// season is refused at apply time (409), so a confirmation never writes over unseen edits.
import { randomBytes } from 'node:crypto';
import type { Knex } from 'knex';
import type { ImportIssue } from '$lib/schemas/import';
import type { VarietyView } from '$lib/types';
import { growingFigures } from '$lib/engine-inputs';
import { db } from '../db';
import { listVarieties } from '../crops';
import { gridContext } from '../plantings';
import { displayPrefs } from '../farms';
import { lockSeason, type Season } from '../seasons';
import { plantingsSheet } from '../export/layout';
import { diffSeason, varietyKey, type ExistingPlanting, type SeasonDiff, type WantedPlanting } from './season-diff';
import type { ImportPlan } from './validate';
import { plantingColumnsOf, writeBeds, writeLibrary } from './write';
import { fileFieldNames, fromStored, pick, plantingFigureNames } from '$lib/plantings/fields';
import { insertPlantings, plantingsWithCrop } from '../planting-query';

export interface PreviewSummary {
	token: string;
	seasonId: number;
	seasonName: string;
	added: { row: number; crop: string; variety: string; bed: string | null; fieldDate: string }[];
	changed: {
		row: number;
		id: number;
		crop: string;
		variety: string;
		changes: SeasonDiff['changed'][number]['changes'];
	}[];
	removed: { id: number; crop: string; variety: string; bed: string | null; fieldDate: string }[];
	unchanged: number;
	duplicates: { row: number; of: number }[];
	library: { crops: number; varieties: number; beds: number };
}

interface StoredPreview {
	farmId: number;
	userId: string;
	season: Season;
	plan: ImportPlan;
	diff: SeasonDiff;
	at: number;
}

/** Previews wait this long for a confirmation; at most MAX are kept (the oldest go first). */
const PREVIEW_TTL_MS = 30 * 60 * 1000;
const MAX_PREVIEWS = 50;
const previews = new Map<string, StoredPreview>();

function keep(p: StoredPreview): string {
	const now = Date.now();
	for (const [k, v] of previews) if (now - v.at > PREVIEW_TTL_MS) previews.delete(k);
	while (previews.size >= MAX_PREVIEWS) previews.delete(previews.keys().next().value!);
	const token = randomBytes(18).toString('base64url');
	previews.set(token, p);
	return token;
}

/** A planting row joined with its names and its harvest count. */
type JoinedRow = Record<string, unknown> & {
	id: number;
	version: number;
	crop: string;
	variety: string;
	bed: string | null;
};

export async function seasonPlantings(
	conn: Knex,
	farmId: number,
	seasonId: number,
	lock = false
): Promise<ExistingPlanting[]> {
	const q = plantingsWithCrop(conn)
		.leftJoin('beds as b', 'b.id', 'p.bed_id')
		.where({ 'p.farm_id': farmId, 'p.season_id': seasonId })
		.orderBy('p.id')
		.select('p.*', 'v.name as variety', 'c.name as crop', 'b.name as bed')
		.select(conn.raw('(select count(*) from harvest_records h where h.planting_id = p.id) as harvests'));
	if (lock) q.forUpdate();
	const rows: JoinedRow[] = await q;
	return rows.map((r) => ({
		...pick(fromStored(r), [...fileFieldNames, ...plantingFigureNames]),
		id: Number(r.id),
		version: Number(r.version),
		varietyKey: varietyKey(String(r.crop), String(r.variety)),
		crop: String(r.crop),
		variety: String(r.variety),
		bed: r.bed === null ? null : String(r.bed),
		harvests: Number(r.harvests)
	}));
}

/** The farm's varieties as they will be once the file's Crops & varieties sheet is written. */
function mergedVarieties(farm: VarietyView[], plan: ImportPlan): Map<string, VarietyView> {
	const out = new Map(farm.map((v) => [varietyKey(v.crop, v.name), v]));
	const crops = new Map(plan.crops.map(({ data }) => [data.crop.trim().toLowerCase(), data]));
	for (const { data: v } of plan.varieties) {
		const k = varietyKey(v.crop, v.variety);
		const before = out.get(k);
		const c = crops.get(v.crop.trim().toLowerCase());
		out.set(k, {
			id: before?.id ?? 0,
			cropId: before?.cropId ?? 0,
			crop: v.crop,
			family: c?.family ?? before?.family ?? '',
			harvestUnit: c?.harvestUnit ?? before?.harvestUnit ?? 'lb',
			frostTolerance: c?.frostTolerance ?? before?.frostTolerance ?? 'hardy',
			heatLimitF: c ? c.heatLimitF : (before?.heatLimitF ?? null),
			baseTempF: c?.baseTempF ?? before?.baseTempF ?? 40,
			sowFrom: c && c.sowFrom !== undefined ? c.sowFrom : (before?.sowFrom ?? null),
			sowTo: c && c.sowTo !== undefined ? c.sowTo : (before?.sowTo ?? null),
			name: v.variety,
			...growingFigures(v),
			daysInTray: v.daysInTray,
			seedPriceCentsPerGram: v.seedPrice,
			seedsPerPacket: v.seedsPerPacket,
			cellsPerTray: v.cellsPerTray,
			margin: v.margin,
			gddToMaturity: v.gddToMaturity
		});
	}
	return out;
}

export type PreviewOutcome = { ok: true; preview: PreviewSummary } | { ok: false; issues: ImportIssue[] };

/** Works out what the file would change in the season; nothing is written. */
export async function previewSeasonUpdate(
	farmId: number,
	userId: string,
	season: Season,
	plan: ImportPlan,
	letters: Record<string, string>
): Promise<PreviewOutcome> {
	const [existing, varieties, ctx, prefs] = await Promise.all([
		seasonPlantings(db(), farmId, season.id),
		listVarieties(farmId),
		gridContext(farmId),
		displayPrefs(farmId)
	]);
	const issues: ImportIssue[] = [];
	const merged = mergedVarieties(varieties, plan);
	// The preview shows lengths, spacing and yields in the farm's units.
	const diff = diffSeason(plan.plantings, existing, merged, ctx.farm, issues, letters, prefs.unitSystem);
	if (issues.length) return { ok: false, issues };
	const token = keep({ farmId, userId, season, plan, diff, at: Date.now() });
	const place = (p: WantedPlanting | ExistingPlanting) => ({
		crop: p.crop,
		variety: p.variety,
		bed: p.bed,
		fieldDate: p.fieldDate
	});
	return {
		ok: true,
		preview: {
			token,
			seasonId: season.id,
			seasonName: season.name,
			added: diff.added.map((a) => ({ row: a.row, ...place(a.planting) })),
			changed: diff.changed.map((c) => ({
				row: c.row,
				id: c.id,
				crop: c.planting.crop,
				variety: c.planting.variety,
				changes: c.changes
			})),
			removed: diff.removed.map((p) => ({ id: p.id, ...place(p) })),
			unchanged: diff.unchanged,
			duplicates: diff.duplicates,
			library: { crops: plan.crops.length, varieties: plan.varieties.length, beds: plan.beds.length }
		}
	};
}

/**
 * Plantings going into a season that holds none (a new season, or an empty one): each row goes
 * through the grid's derivation, as a grid edit would, so tray sowing, harvest dates, expected
 * yield and seeds needed follow the row's own figures and the receiving farm's climate; the
 * file's worked-out columns are not kept. A file's planting ids belong to the season it came
 * from and are ignored here. Exact copies of a row are refused, naming both rows.
 */
export async function deriveNewPlantings(
	farmId: number,
	plan: ImportPlan,
	letters: Record<string, string>
): Promise<{ ok: true; plan: ImportPlan } | { ok: false; issues: ImportIssue[] }> {
	const [varieties, ctx] = await Promise.all([listVarieties(farmId), gridContext(farmId)]);
	const issues: ImportIssue[] = [];
	const rows = plan.plantings.map((r) => ({ row: r.row, data: { ...r.data, id: null } }));
	const diff = diffSeason(rows, [], mergedVarieties(varieties, plan), ctx.farm, issues, letters);
	for (const d of diff.duplicates) {
		issues.push({
			sheet: plantingsSheet.name,
			row: d.row,
			column: null,
			header: null,
			message: `Row ${d.row} repeats row ${d.of} exactly (a row pasted twice?); delete one of the two, or tell them apart in Notes.`
		});
	}
	if (issues.length) return { ok: false, issues };
	const byRow = new Map(diff.added.map((a) => [a.row, a.planting]));
	const plantings = plan.plantings.map(({ row, data }) => {
		const w = byRow.get(row)!;
		return {
			row,
			data: { ...data, ...pick(w, plantingFigureNames) }
		};
	});
	return { ok: true, plan: { ...plan, plantings } };
}

export type ApplyOutcome =
	| { ok: true; seasonId: number; added: number; changed: number; removed: number }
	| { ok: false; status: 404 | 409; message: string };

const lower = (s: string): string => s.trim().toLowerCase();

/** Writes a previewed import in one transaction, if the season is still as the preview saw it. */
export async function applySeasonUpdate(farmId: number, userId: string, token: string): Promise<ApplyOutcome> {
	const p = previews.get(token);
	if (!p || p.farmId !== farmId || p.userId !== userId || Date.now() - p.at > PREVIEW_TTL_MS) {
		return {
			ok: false,
			status: 404,
			message: 'That preview is no longer kept (it expires after 30 minutes); upload the file again.'
		};
	}
	const out = await db().transaction(async (trx): Promise<ApplyOutcome> => {
		// The season first, as every writer of its plantings (plan apply, a harvest logged) takes it.
		if (!(await lockSeason(trx, farmId, p.season.id)))
			return { ok: false, status: 404, message: 'That season is no longer on this farm.' };
		const now = await seasonPlantings(trx, farmId, p.season.id, true);
		const fingerprint = now
			.map((x) => `${x.id}:${x.version}`)
			.sort()
			.join(',');
		const removedHaveHarvests = now.some((x) => x.harvests > 0 && p.diff.removed.some((r) => r.id === x.id));
		if (fingerprint !== p.diff.fingerprint || removedHaveHarvests) {
			return {
				ok: false,
				status: 409,
				message: `${p.season.name} changed after this preview was made; upload the file again to see what it would change now.`
			};
		}
		await writeLibrary(trx, farmId, p.plan);
		const beds = (await writeBeds(trx, farmId, p.plan)).beds;
		const varieties = new Map((await listVarieties(farmId, trx)).map((v) => [varietyKey(v.crop, v.name), v.id]));
		const columns = (w: WantedPlanting) => ({
			...plantingColumnsOf(w, varieties.get(w.varietyKey)!, w.bed === null ? null : (beds.get(lower(w.bed)) ?? null)),
			updated_by: userId
		});
		const version = new Map(now.map((x) => [x.id, x.version]));
		for (const c of p.diff.changed) {
			await trx('plantings')
				.where({ id: c.id, farm_id: farmId })
				.update({ ...columns(c.planting), version: (version.get(c.id) ?? 0) + 1, updated_at: trx.fn.now() });
		}
		const added = p.diff.added.map((a) => ({ ...columns(a.planting), farm_id: farmId, season_id: p.season.id }));
		await insertPlantings(trx, added);
		const gone = p.diff.removed.map((r) => r.id);
		for (let i = 0; i < gone.length; i += 500)
			await trx('plantings')
				.where({ farm_id: farmId, season_id: p.season.id })
				.whereIn('id', gone.slice(i, i + 500))
				.delete();
		return {
			ok: true,
			seasonId: p.season.id,
			added: added.length,
			changed: p.diff.changed.length,
			removed: gone.length
		};
	});
	if (out.ok) previews.delete(token);
	return out;
}

/** Planting dates outside the season are refused, naming the row (a season's plan stays in its dates). */
export function datesOutside(
	plan: ImportPlan,
	season: { startsOn: string; endsOn: string; name: string },
	letters: Record<string, string>
): ImportIssue[] {
	const issues: ImportIssue[] = [];
	for (const { row, data } of plan.plantings) {
		// Tray sowing may fall before the season's first day (onions sown in winter); the field date may not.
		for (const field of ['fieldDate'] as const) {
			const d = data[field];
			if (d === null || (d >= season.startsOn && d <= season.endsOn)) continue;
			const header = plantingsSheet.columns.find((c) => c.key === field)!.header;
			issues.push({
				sheet: plantingsSheet.name,
				row,
				column: letters[field] ?? null,
				header,
				message: `${d} is outside ${season.name} (${season.startsOn} to ${season.endsOn}).`
			});
		}
	}
	return issues;
}
