// The season's seed order, one line per variety: Σ of the engine's seed need over its plantings,
// with grams rounded up once for the whole order (so cost = grams × price per gram to the cent)
// and packets bought per variety (ceil of Σ seeds ÷ seeds per packet). The Seed order page, its
// CSV and the workbook's Seed order sheet all read these lines.
import type { SeedNeed } from '$lib/planning';
import Papa from 'papaparse';
import { plantingSeed } from '$lib/engine-inputs';
import type { VarietyView } from './crops';
import { loadSeasonData } from './export/season-data';
import type { Season } from './seasons';
import type { UnitSystem } from '$lib/format';
import { cellsOf, headerIn, seedOrderSheet, type RowOf } from './export/layout';
import { rowsIn } from './export/units';

export interface SeedOrderLine {
	crop: string;
	variety: string;
	method: 'direct' | 'transplant';
	plantings: number;
	bedFeet: number;
	seeds: number;
	grams: number;
	seedsPerPacket: number | null;
	packets: number | null;
	priceCentsPerGram: number;
	costCents: number;
	/** Transplants only. */
	cells: number | null;
	trays: number | null;
}

export interface SeedOrderTotals {
	plantings: number;
	bedFeet: number;
	seeds: number;
	grams: number;
	packets: number;
	costCents: number;
	cells: number;
	trays: number;
}

/** Rounded up to the hundredth of a gram, as the engine rounds one planting's seed: never short. */
function orderGrams(seeds: number, summedGrams: number, v: VarietyView): number {
	const g = v.seedsPerGram > 0 ? seeds / v.seedsPerGram : summedGrams;
	return Math.ceil(Math.round(g * 1e6) / 1e4) / 100;
}

export function seedOrder(
	plantings: { id: number; varietyId: number; lengthFt: number }[],
	seeds: Map<number, SeedNeed>,
	varieties: Map<number, VarietyView>
): SeedOrderLine[] {
	const totals = new Map<
		number,
		{ v: VarietyView; n: number; ft: number; seeds: number; grams: number; cells: number; trays: number }
	>();
	for (const p of plantings) {
		const v = varieties.get(p.varietyId);
		const s = seeds.get(p.id);
		if (!v || !s) continue;
		let t = totals.get(v.id);
		if (!t) totals.set(v.id, (t = { v, n: 0, ft: 0, seeds: 0, grams: 0, cells: 0, trays: 0 }));
		t.n += 1;
		t.ft += p.lengthFt;
		t.seeds += s.seeds;
		t.grams += s.grams;
		t.cells += s.cells;
		t.trays += s.trays;
	}
	return [...totals.values()]
		.sort((a, b) => a.v.crop.localeCompare(b.v.crop) || a.v.name.localeCompare(b.v.name))
		.map(({ v, n, ft, seeds: count, grams, cells, trays }) => {
			const g = orderGrams(count, grams, v);
			const transplant = v.method === 'transplant';
			return {
				crop: v.crop,
				variety: v.name,
				method: v.method,
				plantings: n,
				bedFeet: Math.round(ft * 100) / 100,
				seeds: count,
				grams: g,
				seedsPerPacket: v.seedsPerPacket,
				packets: v.seedsPerPacket ? Math.ceil(count / v.seedsPerPacket) : null,
				priceCentsPerGram: v.seedPriceCentsPerGram,
				costCents: Math.round(g * v.seedPriceCentsPerGram),
				cells: transplant ? cells : null,
				trays: transplant ? trays : null
			};
		});
}

/** Column sums of an order (packets and money add up; seeds of different crops are just a count). */
export function seedOrderTotals(lines: SeedOrderLine[]): SeedOrderTotals {
	const sum = (f: (l: SeedOrderLine) => number | null) => lines.reduce((a, l) => a + (f(l) ?? 0), 0);
	return {
		plantings: sum((l) => l.plantings),
		bedFeet: Math.round(sum((l) => l.bedFeet) * 100) / 100,
		seeds: sum((l) => l.seeds),
		grams: Math.round(sum((l) => l.grams) * 100) / 100,
		packets: sum((l) => l.packets),
		costCents: sum((l) => l.costCents),
		cells: sum((l) => l.cells),
		trays: sum((l) => l.trays)
	};
}

/** The season's seed order for a grower's ordering: loaded, worked out and totalled. */
export async function seasonSeedOrder(
	farmId: number,
	season: Season
): Promise<{ lines: SeedOrderLine[]; totals: SeedOrderTotals }> {
	const d = await loadSeasonData(farmId, season);
	const varieties = new Map(d.varieties.map((v) => [v.id, v]));
	const seeds = new Map<number, SeedNeed>();
	for (const p of d.plantings) {
		const v = varieties.get(p.varietyId);
		if (v) seeds.set(p.id, plantingSeed(p, v));
	}
	const lines = seedOrder(d.plantings, seeds, varieties);
	return { lines, totals: seedOrderTotals(lines) };
}

/** One line as the Seed order sheet's row (layout.ts), keyed by column: money in whole units. */
export function seedOrderRow(l: SeedOrderLine): RowOf<typeof seedOrderSheet> {
	return { ...l, pricePerGram: l.priceCentsPerGram / 100, cost: l.costCents / 100 };
}

/**
 * The order as CSV (RFC 4180, CRLF), formulae escaped: money in the farm's currency unit, bed
 * length and seed weight in the farm's units (metres and grams, or feet and ounces).
 */
export function seedOrderCsv(lines: SeedOrderLine[], currency: string, system: UnitSystem = 'imperial'): string {
	// The sheet's own headers and conversions (export/layout.ts); money named by its ISO 4217 code.
	const fields = seedOrderSheet.columns.map((c) =>
		c.key === 'seeds' ? 'Seeds' : headerIn(c, system, 'USD').replace('($', `(${currency}`)
	);
	const keys = seedOrderSheet.columns.map((c) => c.key);
	const rows = rowsIn(
		seedOrderSheet,
		lines.map((l) => cellsOf(seedOrderSheet, seedOrderRow(l))),
		system
	);
	// Money with two decimals, as the currency writes it; an empty cell where a figure does not apply.
	const data = rows.map((r) =>
		r.map((v, i) => {
			if (v === null) return '';
			const key = keys[i];
			if (key === 'pricePerGram' || key === 'cost') return Number(v).toFixed(2);
			if (key === 'bedFeet') return String(Math.round(Number(v) * 100) / 100);
			// Grams as ordered (to the hundredth); ounces to the ten-thousandth (0.0102 oz is 0.29 g).
			if (key === 'grams') return String(Math.round(Number(v) * 1e4) / 1e4);
			return v;
		})
	);
	return Papa.unparse({ fields, data }, { newline: '\r\n', escapeFormulae: true }) + '\r\n';
}
