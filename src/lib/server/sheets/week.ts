// The week's crew sheets for one season: what to sow in trays, direct-sow, transplant and
// harvest, with the figures the crew needs (cells, trays, seed grams, plants, expected harvest and
// who it is for), grouped by block and bed in walking order. Figures come from the engine.
import type { SeedNeed } from '$lib/planning';
import { plantingSeed } from '$lib/engine-inputs';
import { plannedByWeek, plannedOf } from '../planned-supply';
import { db } from '../db';
import * as farms from '../farms';
import { listVarieties, type VarietyView } from '../crops';
import { tasksForWeek, type PlantingView } from '../plantings';
import type { TaskKind } from './schemas';
import type { UnitSystem } from '$lib/format';

export type SectionKind = 'tray_sow' | 'direct_sow' | 'transplant' | 'harvest';

export interface DemandLine {
	/** Share size name, "Market" or "Restaurant". */
	for: string;
	quantity: number;
	unit: string;
	/** How it was reached, e.g. "60 members × 1 bunch". */
	detail?: string;
}

export interface SheetRow {
	plantingId: number;
	version: number;
	status: string;
	crop: string;
	variety: string;
	block: string | null;
	bed: string | null;
	startFt: number;
	endFt: number;
	lengthFt: number;
	rows: number;
	inRowSpacingIn: number;
	seedsPerSpot: number;
	/** The planned date of this task. */
	date: string;
	/** The actual date already recorded for this task, if any. */
	doneOn: string | null;
	/** The actions the crew may take on this row, in order. */
	actions: TaskKind[];
	seed: Pick<SeedNeed, 'seeds' | 'grams' | 'cells' | 'trays' | 'plants'> | null;
	cellsPerTray: number | null;
	// Harvest rows only.
	lastHarvest?: string;
	weekQuantity?: number;
	unit?: string;
	demand?: DemandLine[];
}

export interface SheetGroup {
	label: string;
	rows: SheetRow[];
}

export interface SheetSection {
	kind: SectionKind;
	title: string;
	count: number;
	groups: SheetGroup[];
}

export interface WeekSheet {
	week: string;
	monday: string;
	sunday: string;
	/** The farm's weekly normal mean for this ISO week number, °F, when the farm has one. */
	weekMeanF: number | null;
	/** The farm's units: the figures above are the database's (ft, in, lb, g), shown in these. */
	unitSystem: UnitSystem;
	sections: SheetSection[];
}

const titles: Record<SectionKind, string> = {
	tray_sow: 'Tray sowing',
	direct_sow: 'Direct sowing',
	transplant: 'Transplanting',
	harvest: 'Harvest'
};

interface Actuals {
	actual_tray_sow_date: string | null;
	actual_field_date: string | null;
	actual_first_harvest: string | null;
	actual_last_harvest: string | null;
}

async function actualsFor(farmId: number, ids: number[]): Promise<Map<number, Actuals>> {
	if (ids.length === 0) return new Map();
	const rows = await db()('plantings')
		.where('farm_id', farmId)
		.whereIn('id', ids)
		.select('id', 'actual_tray_sow_date', 'actual_field_date', 'actual_first_harvest', 'actual_last_harvest');
	return new Map(rows.map((r) => [r.id as number, r as Actuals]));
}

/** What the season's demand asks of each crop (by name) in one ISO week, per share size and channel. */
export async function demandForWeek(
	farmId: number,
	seasonId: number,
	week: string
): Promise<Map<string, DemandLine[]>> {
	const [boxes, channels] = await Promise.all([
		db()('box_items as i')
			.join('share_sizes as s', 's.id', 'i.share_size_id')
			.join('crops as c', 'c.id', 'i.crop_id')
			.where({ 's.farm_id': farmId, 's.season_id': seasonId, 'i.week': week })
			.andWhere('s.first_week', '<=', week)
			.andWhere('s.last_week', '>=', week)
			.orderBy('s.name')
			.select('c.name as crop', 's.name as share', 's.members', 'i.quantity', 'i.unit'),
		db()('channel_demand as d')
			.join('crops as c', 'c.id', 'd.crop_id')
			.where({ 'd.farm_id': farmId, 'd.season_id': seasonId, 'd.week': week })
			.orderBy('d.channel')
			.select('c.name as crop', 'd.channel', 'd.quantity', 'c.harvest_unit as unit')
	]);
	const out = new Map<string, DemandLine[]>();
	const add = (crop: string, line: DemandLine) => out.set(crop, [...(out.get(crop) ?? []), line]);
	for (const b of boxes) {
		const q = Number(b.quantity);
		add(b.crop, {
			for: b.share,
			quantity: round(b.members * q, 2),
			unit: b.unit,
			detail: `${b.members} members × ${q} ${b.unit}`
		});
	}
	for (const c of channels)
		add(c.crop, { for: c.channel === 'market' ? 'Market' : 'Restaurant', quantity: Number(c.quantity), unit: c.unit });
	return out;
}

function round(n: number, places: number): number {
	const f = 10 ** places;
	return Math.round(n * f) / f;
}

function seedFor(p: PlantingView, v: VarietyView | undefined): SheetRow['seed'] {
	if (!v) return null;
	try {
		const s = plantingSeed(p, v);
		return { seeds: s.seeds, grams: s.grams, cells: s.cells, trays: s.trays, plants: s.plants ?? s.spots };
	} catch {
		// A planting with figures the engine refuses still belongs on the sheet, without seed.
		return null;
	}
}

/**
 * This planting's expected harvest in the week: the one planned supply (planned-supply.ts), the
 * variety's current yield spread by its harvest curve, as on the Forecast page and the workbook.
 */
function weekHarvest(p: PlantingView, v: VarietyView | undefined, week: string): number {
	const planned = plannedOf(p, v);
	const q = planned ? (plannedByWeek(planned).find((r) => r.week === week)?.quantity ?? 0) : 0;
	return round(q, 1);
}

function groupByBed(rows: SheetRow[]): SheetGroup[] {
	const groups: SheetGroup[] = [];
	for (const r of rows) {
		const label = r.bed ? `${r.block} · bed ${r.bed}` : 'Not placed in a bed yet';
		const last = groups[groups.length - 1];
		if (last && last.label === label) last.rows.push(r);
		else groups.push({ label, rows: [r] });
	}
	return groups;
}

/** The crew sheets of one ISO week of a season (monday..sunday), farm-scoped. */
export async function weekSheet(
	farmId: number,
	seasonId: number,
	week: string,
	monday: string,
	sunday: string
): Promise<WeekSheet> {
	const [tasks, varieties, demand, normals, prefs] = await Promise.all([
		tasksForWeek(farmId, monday, sunday),
		listVarieties(farmId),
		demandForWeek(farmId, seasonId, week),
		farms.weeklyTemps(farmId),
		farms.displayPrefs(farmId)
	]);
	const inSeason = (list: PlantingView[]) => list.filter((p) => p.seasonId === seasonId);
	const t = {
		tray_sow: inSeason(tasks.traySowing),
		direct_sow: inSeason(tasks.directSowing),
		transplant: inSeason(tasks.transplanting),
		harvest: inSeason(tasks.harvest)
	};
	const ids = [...new Set(Object.values(t).flatMap((l) => l.map((p) => p.id)))];
	const actuals = await actualsFor(farmId, ids);
	const byId = new Map(varieties.map((v) => [v.id, v]));

	function row(p: PlantingView, kind: SectionKind): SheetRow {
		const v = byId.get(p.varietyId);
		const a = actuals.get(p.id);
		const base: SheetRow = {
			plantingId: p.id,
			version: p.version,
			status: p.status,
			crop: p.crop,
			variety: p.variety,
			block: p.block,
			bed: p.bed,
			startFt: p.startFt,
			endFt: p.startFt + p.lengthFt,
			lengthFt: p.lengthFt,
			rows: p.rows,
			inRowSpacingIn: p.inRowSpacingIn,
			seedsPerSpot: p.seedsPerSpot,
			date: kind === 'tray_sow' ? (p.traySowDate ?? p.fieldDate) : kind === 'harvest' ? p.firstHarvest : p.fieldDate,
			doneOn: null,
			actions: [kind],
			seed: seedFor(p, v),
			cellsPerTray: v?.cellsPerTray ?? null
		};
		if (kind === 'tray_sow') base.doneOn = a?.actual_tray_sow_date ?? null;
		if (kind === 'direct_sow' || kind === 'transplant') base.doneOn = a?.actual_field_date ?? null;
		if (kind === 'harvest') {
			base.doneOn = a?.actual_first_harvest ?? null;
			// Once harvest has started the remaining task is to close the planting out.
			base.actions = base.doneOn ? ['finish'] : ['harvest', 'finish'];
			base.lastHarvest = p.lastHarvest;
			base.weekQuantity = weekHarvest(p, v, week);
			base.unit = p.harvestUnit;
			base.demand = demand.get(p.crop) ?? [];
		}
		return base;
	}

	const sections: SheetSection[] = (Object.keys(titles) as SectionKind[]).map((kind) => {
		const rows = t[kind].map((p) => row(p, kind));
		// Trays are sown in the greenhouse, not along the beds: one group, by crop.
		const groups =
			kind === 'tray_sow' ? (rows.length ? [{ label: 'Greenhouse · trays', rows }] : []) : groupByBed(rows);
		return { kind, title: titles[kind], count: rows.length, groups };
	});
	return {
		week,
		monday,
		sunday,
		weekMeanF: normals[Number(week.slice(6))] ?? null,
		unitSystem: prefs.unitSystem,
		sections
	};
}
