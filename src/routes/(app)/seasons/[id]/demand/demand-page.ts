// The demand page's arithmetic, shared by its server load and its components: which weeks a grid
// shows, what each cell holds, and the engine input with unsaved edits laid over it (so the
// targets table recalculates while the user types, with the same engine the server runs).
import { explainTargets, weeksBetween, type ExplainStep, type TargetInput } from '$lib/planning';

export interface PageShare {
	id: number;
	name: string;
	members: number;
	firstWeek: string;
	lastWeek: string;
}
export interface PageCrop {
	id: number;
	name: string;
	family: string;
	unit: string;
}
export interface PageDemand {
	shareSizes: PageShare[];
	boxItems: { shareSizeId: number; week: string; cropId: number; quantity: number }[];
	channelDemand: { channel: string; cropId: number; week: string; quantity: number }[];
	crops: PageCrop[];
}

/** "share:12", "market" or "restaurant". */
export type Grid = string;

export function gridLabel(demand: PageDemand, grid: Grid): string {
	if (grid === 'market') return 'Market stand';
	if (grid === 'restaurant') return 'Restaurants';
	return demand.shareSizes.find((s) => `share:${s.id}` === grid)?.name ?? grid;
}

/** What the cells of a grid hold, keyed "cropId|week". */
export function gridCells(demand: PageDemand, grid: Grid): Map<string, number> {
	const out = new Map<string, number>();
	if (grid.startsWith('share:')) {
		const id = Number(grid.slice(6));
		for (const b of demand.boxItems) if (b.shareSizeId === id) out.set(`${b.cropId}|${b.week}`, b.quantity);
	} else {
		for (const c of demand.channelDemand) if (c.channel === grid) out.set(`${c.cropId}|${c.week}`, c.quantity);
	}
	return out;
}

/**
 * The weeks across the top: a share size's distribution weeks; for a channel, the span of the
 * share weeks and any channel weeks already entered, within the season (the whole season if empty).
 */
export function gridWeeks(demand: PageDemand, grid: Grid, season: { first: string; last: string }): string[] {
	const share = demand.shareSizes.find((s) => `share:${s.id}` === grid);
	if (share) return weeksBetween(share.firstWeek, share.lastWeek);
	const weeks = [
		...demand.shareSizes.flatMap((s) => [s.firstWeek, s.lastWeek]),
		...demand.channelDemand.filter((c) => c.channel === grid).map((c) => c.week)
	].filter((w) => w >= season.first && w <= season.last);
	if (!weeks.length) return weeksBetween(season.first, season.last);
	weeks.sort();
	return weeksBetween(weeks[0], weeks[weeks.length - 1]);
}

/** Crop rows of a grid: crops with a quantity in it, in library order. */
export function gridCrops(demand: PageDemand, grid: Grid): PageCrop[] {
	const used = new Set([...gridCells(demand, grid).keys()].map((k) => Number(k.split('|')[0])));
	return demand.crops.filter((c) => used.has(c.id));
}

/** The engine's input: crops and share sizes by id, as the server's targetInput gives them. */
export function engineInput(demand: PageDemand): TargetInput {
	return {
		shareSizes: demand.shareSizes.map((s) => ({
			id: String(s.id),
			members: s.members,
			firstWeek: s.firstWeek,
			lastWeek: s.lastWeek
		})),
		boxItems: demand.boxItems.map((b) => ({
			shareSizeId: String(b.shareSizeId),
			week: b.week,
			crop: String(b.cropId),
			quantity: b.quantity
		})),
		channelDemand: demand.channelDemand.map((c) => ({ crop: String(c.cropId), week: c.week, quantity: c.quantity }))
	};
}

/** Parses what the user typed in a cell: null for empty, NaN for junk. */
export function typed(text: string): number | null {
	const t = text.trim().replace(',', '.');
	if (t === '') return null;
	const n = Number(t);
	return Number.isFinite(n) && n >= 0 ? n : NaN;
}

/** The demand with a grid's unsaved edits ("cropId|week" → typed text) laid over it; junk is ignored. */
export function withEdits(demand: PageDemand, grid: Grid, edits: Record<string, string>): PageDemand {
	const entries = Object.entries(edits)
		.map(([k, v]) => {
			const [crop, week] = k.split('|');
			return { cropId: Number(crop), week, q: typed(v) };
		})
		.filter((e) => !Number.isNaN(e.q) && e.cropId > 0);
	if (!entries.length) return demand;
	const hit = (cropId: number, week: string): boolean => entries.some((e) => e.cropId === cropId && e.week === week);
	const set = entries.filter((e) => e.q !== null && e.q > 0);
	/** The rows of this grid its edits touch replaced by the edited cells that hold a quantity. */
	function laid<T extends { cropId: number; week: string }>(
		rows: T[],
		ofGrid: (r: T) => boolean,
		row: (e: { cropId: number; week: string; quantity: number }) => T
	): T[] {
		const kept = rows.filter((r) => !ofGrid(r) || !hit(r.cropId, r.week));
		return [...kept, ...set.map((e) => row({ cropId: e.cropId, week: e.week, quantity: e.q as number }))];
	}
	if (grid.startsWith('share:')) {
		const id = Number(grid.slice(6));
		const boxItems = laid(
			demand.boxItems,
			(b) => b.shareSizeId === id,
			(e) => ({ shareSizeId: id, ...e })
		);
		return { ...demand, boxItems };
	}
	const channelDemand = laid(
		demand.channelDemand,
		(c) => c.channel === grid,
		(e) => ({ channel: grid, ...e })
	);
	return { ...demand, channelDemand };
}

/** How one target was reached, in words the page can show: share names and channel names. */
export function explainCell(demand: PageDemand, input: TargetInput, cropId: number, week: string): ExplainStep[] {
	const steps = explainTargets(input, String(cropId), week);
	// explainTargets lists box items, then channel rows, in input order: name them the same way.
	const channelNames = demand.channelDemand
		.filter((c) => c.cropId === cropId && c.week === week)
		.map((c) => (c.channel === 'market' ? 'Market stand' : 'Restaurants'));
	const shareName = new Map(demand.shareSizes.map((s) => [String(s.id), s.name]));
	let ch = 0;
	return steps.map((s, i) => {
		if (i === steps.length - 1) return { ...s, label: 'Target' };
		if (s.label === 'other channels')
			return { ...s, label: channelNames[ch++] ?? 'Other channel', formula: 'weekly quantity' };
		const id = s.label.replace(/ shares$/, '').replace(/ box \(not distributing.*$/, '');
		const name = shareName.get(id) ?? id;
		return { ...s, label: s.label.endsWith(' shares') ? name : `${name} (not distributing this week)` };
	});
}
