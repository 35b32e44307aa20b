// The rows of each workbook sheet, worked out from the season's data with the planning
// engine (seed, forecast, targets). Pure: no I/O, so the bench and tests can call it alike.
// Values are plain: dates as 'YYYY-MM-DD' (the writer turns them into real Excel dates),
// money in dollars, rates as fractions.
import type { SeedNeed } from '$lib/planning';
import { plantingSeed } from '$lib/engine-inputs';
import { fromDayNumber, toDayNumber, weekdayOf } from '$lib/planning/day-number';
import { isoWeekOfDay, weekStart } from '$lib/planning/iso-week';
import type { VarietyView } from '../crops';
import type { SeasonData } from './season-data';
import {
	bedsSheet,
	cellsOf,
	cropsSheet,
	forecastSheet,
	seasonFields,
	seasonSheet,
	seedOrderSheet,
	tasksSheet,
	type RowOf
} from './layout';
import { pick } from '$lib/pick';
import { plantingTasks } from '$lib/plantings/tasks';
import { plantingCells } from './planting-columns';
import { seedOrder, seedOrderRow } from '../seed-order';
import { type PlannedPlanting, plannedByWeek, plannedOf, plannedSupply } from '../planned-supply';

export type Cell = string | number | Date | null;
export type Row = Cell[];

export interface SheetRows {
	season: Row[];
	plantings: Row[];
	seedOrder: Row[];
	tasks: Row[];
	forecast: Row[];
	crops: Row[];
	beds: Row[];
}

/** A calendar date as a Date at UTC midnight: exceljs turns it into a whole Excel day number. */
export function excelDate(iso: string): Date {
	return new Date(Date.UTC(Number(iso.slice(0, 4)), Number(iso.slice(5, 7)) - 1, Number(iso.slice(8, 10))));
}

const round2 = (n: number): number => Math.round(n * 100) / 100;

function plantingRows(d: SeasonData): Row[] {
	return d.plantings.map(plantingCells);
}

/** The Seed order sheet: the season's seed order (src/lib/server/seed-order.ts), money in dollars. */
function seedOrderRows(d: SeasonData, seeds: Map<number, SeedNeed>, varieties: Map<number, VarietyView>): Row[] {
	return seedOrder(d.plantings, seeds, varieties).map((l) => cellsOf(seedOrderSheet, seedOrderRow(l)));
}

const taskOrder = { 'Tray sowing': 0, 'Direct sowing': 1, Transplanting: 2, Harvest: 3 } as const;
type TaskName = keyof typeof taskOrder;

interface TaskRow {
	/** Week (its Monday's day number) × 4 + kind of task: one number sorts both. */
	order: number;
	/** Walking order packed in one number: block, bed, start foot (tenths). */
	walk: number;
	/** Tray work sorts by crop and variety, as the tray bench does. */
	name: string;
	row: TaskCells;
}
type TaskCells = RowOf<typeof tasksSheet>;

// Positions and feet are far below these bounds, so the packed key stays an exact integer.
const walkKey = (block: number | null, bed: number | null, startFt: number): number =>
	(Math.min(block ?? 99_999, 99_999) * 100_000 + Math.min(bed ?? 99_999, 99_999)) * 100_000 + Math.round(startFt * 10);

/**
 * Per ISO week, the same four kinds of work as the crew's week view, by the one task rule
 * (plantings/tasks.ts). Worked out in memory from the season's plantings rather than with
 * one query per week, so a large season streams at the writer's pace.
 */
function taskRows(d: SeasonData, seeds: Map<number, SeedNeed>, varieties: Map<number, VarietyView>): Row[] {
	const out: TaskRow[] = [];
	// Other seasons' plantings harvesting in this season (last autumn's garlic) add their harvests only.
	const others = new Set(d.otherHarvests.map((p) => p.id));
	for (const p of [...d.plantings, ...d.otherHarvests]) {
		const s = seeds.get(p.id);
		const walk = walkKey(p.blockPosition, p.bedPosition, p.startFt);
		const where = pick(p, ['crop', 'variety', 'block', 'bed', 'startFt', 'lengthFt']);
		const push = (day: number, task: TaskName, rest: TaskCells, byCrop = false): void => {
			const monday = day - weekdayOf(day) + 1;
			out.push({
				order: monday * 4 + taskOrder[task],
				walk: byCrop ? 0 : walk,
				name: byCrop ? `${p.crop}\u0000${p.variety}` : '',
				row: {
					week: isoWeekOfDay(day),
					monday: fromDayNumber(monday),
					task,
					...where,
					date: fromDayNumber(day),
					...rest
				}
			});
		};
		// Another season's planting: only its harvest here, its sowing belongs to its own season's workbook.
		for (const t of plantingTasks(p)) {
			const day = toDayNumber(t.from);
			if (t.kind === 'harvest') {
				// The planned supply (planned-supply.ts), as on the Forecast sheet: a task on the first
				// harvest day in each week.
				const planned = plannedOf(p, varieties.get(p.varietyId));
				for (const w of planned ? plannedByWeek(planned) : [])
					push(Math.max(day, toDayNumber(weekStart(w.week))), 'Harvest', {
						quantity: round2(w.quantity),
						unit: p.harvestUnit
					});
			} else if (others.has(p.id)) continue;
			else if (t.kind === 'tray_sow')
				push(day, 'Tray sowing', { quantity: s?.cells, unit: 'cells', trays: s?.trays, grams: s?.grams }, true);
			else if (t.kind === 'direct_sow')
				push(day, 'Direct sowing', { quantity: s?.seeds, unit: 'seeds', grams: s?.grams });
			else push(day, 'Transplanting', { quantity: s?.plants ?? s?.spots, unit: 'plants' });
		}
	}
	out.sort((x, y) => x.order - y.order || x.walk - y.walk || (x.name < y.name ? -1 : x.name > y.name ? 1 : 0));
	return out.map((t) => cellsOf(tasksSheet, t.row));
}

/**
 * The planned supply (planned-supply.ts) of the season's plantings, and of other seasons' plantings
 * harvesting in its dates, against the derived weekly targets.
 */
function forecastRows(d: SeasonData, varieties: Map<number, VarietyView>): Row[] {
	const plantings: PlannedPlanting[] = [];
	for (const p of [...d.plantings, ...d.otherHarvests]) {
		if (p.status === 'failed') continue;
		const planned = plannedOf(p, varieties.get(p.varietyId));
		if (planned) plantings.push(planned);
	}
	const crops = new Map(d.crops.map((c) => [String(c.id), c]));
	// Storage crops through their store, as on the Forecast page (planning/storage.ts).
	const stores = d.crops
		.filter((c) => (c.storageWeeks ?? 0) > 0)
		.map((c) => ({ crop: String(c.id), keepWeeks: c.storageWeeks!, lossPerWeek: c.storageLossPerWeek }));
	return plannedSupply(plantings, d.demand, stores).map((r) =>
		cellsOf(forecastSheet, {
			crop: crops.get(r.crop)?.name ?? r.crop,
			unit: crops.get(r.crop)?.harvestUnit,
			week: r.week,
			monday: weekStart(r.week),
			supply: round2(r.supply),
			demand: round2(r.demand),
			shortfall: round2(r.shortfall),
			surplus: round2(r.surplus)
		})
	);
}

/** A crop's row for each of its varieties; a crop without varieties still gets a row, so the import keeps it. */
function cropRows(d: SeasonData): Row[] {
	const byCrop = new Map<number, VarietyView[]>();
	for (const v of d.varieties) byCrop.set(v.cropId, [...(byCrop.get(v.cropId) ?? []), v]);
	return d.crops.flatMap((c) => {
		const crop: RowOf<typeof cropsSheet> = {
			...pick(c, ['family', 'harvestUnit', 'frostTolerance', 'heatLimitF', 'baseTempF', 'sowFrom', 'sowTo']),
			crop: c.name
		};
		const vs = byCrop.get(c.id) ?? [];
		if (!vs.length) return [cellsOf(cropsSheet, crop)];
		return vs.map((v) =>
			cellsOf(cropsSheet, { ...v, ...crop, variety: v.name, seedPrice: v.seedPriceCentsPerGram / 100 })
		);
	});
}

/** The Season sheet: one row a field, its label in the Field column. */
function seasonRows(d: SeasonData, today: string): Row[] {
	const values: Record<keyof typeof seasonFields, Cell> = {
		name: d.season.name,
		year: d.season.year,
		startsOn: excelDate(d.season.startsOn),
		endsOn: excelDate(d.season.endsOn),
		farm: d.farmName,
		exportedOn: excelDate(today)
	};
	return (Object.keys(seasonFields) as (keyof typeof seasonFields)[]).map((k) =>
		cellsOf(seasonSheet, { field: seasonFields[k], value: values[k] })
	);
}

export function buildSheetRows(d: SeasonData, today: string): SheetRows {
	const varieties = new Map(d.varieties.map((v) => [v.id, v]));
	const seeds = new Map<number, SeedNeed>();
	for (const p of d.plantings) {
		const v = varieties.get(p.varietyId);
		if (v) seeds.set(p.id, plantingSeed(p, v));
	}
	return {
		season: seasonRows(d, today),
		plantings: plantingRows(d),
		seedOrder: seedOrderRows(d, seeds, varieties),
		tasks: taskRows(d, seeds, varieties),
		forecast: forecastRows(d, varieties),
		crops: cropRows(d),
		beds: d.beds.map((b) => cellsOf(bedsSheet, { ...b, bed: b.name }))
	};
}

export function rowCount(r: SheetRows): number {
	return Object.values(r).reduce((n, rows: Row[]) => n + rows.length, 0);
}
