// A storage crop after its store: garlic dug in July, cured and kept, feeds the boxes into the
// autumn. Each week's harvest goes into the store as one lot; each week's demand is met from
// the lots, oldest first; what stays in store loses a share every week (`lossPerWeek`) and is
// gone once it has been kept `keepWeeks` weeks. Pure: no I/O.
import { addWeeks } from './iso-week';
import type { CropWeekQuantity } from './types';

export interface StoreResult {
	/** What the crop offers each week: what the store gives to that week's demand, plus, in the
	 *  week a lot was harvested, whatever of it no demand ever takes (the surplus). */
	supply: Map<string, number>;
	/** Lost in store (shrinkage and lots kept past their time), by the week the loss is counted. */
	lost: Map<string, number>;
	/** The part of `supply` given out of lots dug in earlier weeks: sold from store, not from the field. */
	fromStore: Map<string, number>;
}

interface Lot {
	week: string;
	age: number;
	quantity: number;
}

const add = (m: Map<string, number>, week: string, q: number): void => {
	if (q > 0) m.set(week, (m.get(week) ?? 0) + q);
};

/**
 * `harvest` and `demand` map ISO weeks to quantities. Weeks are walked one by one from the first
 * week with either to the last, so a lot ages in weeks without demand too.
 */
export function storeSupply(
	harvest: Map<string, number>,
	demand: Map<string, number>,
	keepWeeks: number,
	lossPerWeek: number
): StoreResult {
	const supply = new Map<string, number>();
	const lost = new Map<string, number>();
	const fromStore = new Map<string, number>();
	const weeks = [...harvest.keys(), ...demand.keys()].sort();
	if (!weeks.length) return { supply, lost, fromStore };
	const last = weeks.at(-1)!;
	let lots: Lot[] = [];
	const keep = Math.max(0, Math.floor(keepWeeks));
	const loss = Math.min(1, Math.max(0, lossPerWeek));
	for (let week = weeks[0]; week <= last; week = addWeeks(week, 1)) {
		// A week in store: every lot loses its share, and lots past their time are thrown out.
		const aged: Lot[] = [];
		for (const lot of lots) {
			const q = lot.quantity * (1 - loss);
			add(lost, week, lot.quantity - q);
			if (lot.age + 1 > keep) add(lost, week, q);
			else aged.push({ ...lot, age: lot.age + 1, quantity: q });
		}
		lots = aged;
		const dug = harvest.get(week) ?? 0;
		if (dug > 0) lots.push({ week, age: 0, quantity: dug });
		let need = demand.get(week) ?? 0;
		for (const lot of lots) {
			if (need <= 0) break;
			const take = Math.min(lot.quantity, need);
			lot.quantity -= take;
			need -= take;
			add(supply, week, take);
			if (lot.week !== week) add(fromStore, week, take);
		}
		lots = lots.filter((l) => l.quantity > 1e-9);
	}
	// What no demand took stays the surplus of the week it was harvested.
	for (const lot of lots) add(supply, lot.week, lot.quantity);
	return { supply, lost, fromStore };
}

/** A crop kept in store: how many weeks a harvest keeps, and the share lost each week. */
export interface CropStore {
	crop: string;
	keepWeeks: number;
	lossPerWeek: number;
}

/** Weekly supply after the stores, and the part of it sold from store (storage crops only). */
export interface StoredSupply {
	supply: CropWeekQuantity[];
	fromStore: CropWeekQuantity[];
}

/**
 * Weekly supply with every storage crop's harvest put through its store (storeSupply), so garlic
 * dug in July fills the autumn boxes; other crops as they are. The forecast page, share boxes,
 * overview and the workbook's Forecast sheet all read supply through this.
 */
export function throughStores(
	supply: CropWeekQuantity[],
	targets: CropWeekQuantity[],
	stores: CropStore[]
): CropWeekQuantity[] {
	return throughStoresSplit(supply, targets, stores).supply;
}

/** throughStores, also telling what each week's supply of a storage crop takes out of store. */
export function throughStoresSplit(
	supply: CropWeekQuantity[],
	targets: CropWeekQuantity[],
	stores: CropStore[]
): StoredSupply {
	const kept = new Map(stores.filter((c) => c.keepWeeks > 0).map((c) => [c.crop, c]));
	if (!kept.size) return { supply, fromStore: [] };
	const byCrop = (rows: CropWeekQuantity[], crop: string): Map<string, number> => {
		const m = new Map<string, number>();
		for (const r of rows) if (r.crop === crop) m.set(r.week, (m.get(r.week) ?? 0) + r.quantity);
		return m;
	};
	const out = supply.filter((s) => !kept.has(s.crop));
	const fromStore: CropWeekQuantity[] = [];
	for (const [crop, c] of kept) {
		const r = storeSupply(byCrop(supply, crop), byCrop(targets, crop), c.keepWeeks, c.lossPerWeek);
		for (const [week, quantity] of r.supply) out.push({ crop, week, quantity });
		for (const [week, quantity] of r.fromStore) fromStore.push({ crop, week, quantity });
	}
	return { supply: out, fromStore };
}
