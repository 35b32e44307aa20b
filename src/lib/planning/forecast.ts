import { PlanningInputError, requireNonNegative, requirePositive } from './errors';
import { type DayNumber, toDayNumber, weekdayOf } from './day-number';
import { isoWeekOfDay, weekStartDay } from './iso-week';
import type { CropWeekQuantity, ExplainStep } from './types';
import { type HarvestCurve, cumulativeWeights, shareOfDays, validateCurve } from './harvest-curve';

/**
 * A planting as the forecast sees it. Give either bedFeet × yieldPerBedFoot
 * (spread evenly over the harvest window) or weeklyYield (per full week).
 * lastHarvest defaults to firstHarvest + harvestWindowDays − 1.
 */
export interface ForecastPlanting {
	key?: string;
	crop: string;
	firstHarvest: string;
	lastHarvest?: string;
	harvestWindowDays?: number;
	bedFeet?: number;
	yieldPerBedFoot?: number;
	weeklyYield?: number;
	/** How the yield spreads over the window; default flat. */
	curve?: HarvestCurve;
	/**
	 * The full harvest window (days) the yield and curve are given over, when the planting's
	 * harvest was cut short of it: only the days up to lastHarvest are picked.
	 */
	windowDays?: number;
}

export interface ForecastRow {
	crop: string;
	week: string;
	supply: number;
	demand: number;
	shortfall: number;
	surplus: number;
}

interface Window {
	a: DayNumber;
	b: DayNumber;
	perDay: number;
	/** Days the yield is spread over: the dates' days, or more when the harvest was cut short. */
	n: number;
	/** Cumulative curve weights over the n days, when it is not flat. */
	curve?: Float64Array;
}

/** What a window yields on days from..to (day numbers, inclusive). */
export function windowAmount(w: Window, from: DayNumber, to: DayNumber): number {
	const lo = Math.max(w.a, from);
	const hi = Math.min(w.b, to);
	if (hi < lo) return 0;
	if (!w.curve) return (hi - lo + 1) * w.perDay;
	return w.perDay * w.n * shareOfDays(w.curve, lo - w.a, hi - w.a);
}

/**
 * Flat harvest curve: a planting yields the same amount every day of its
 * window, so a week gets (days of the window inside it) × daily yield. A week
 * half inside the window gets the pro-rata share of its days, not a whole
 * week's worth; total supply over all weeks equals the planting's total yield.
 */
export function harvestWindow(p: ForecastPlanting, field = 'planting'): Window {
	const a = toDayNumber(p.firstHarvest, `${field}.firstHarvest`);
	let b: DayNumber;
	if (p.lastHarvest !== undefined) b = toDayNumber(p.lastHarvest, `${field}.lastHarvest`);
	else if (p.harvestWindowDays !== undefined) b = a + p.harvestWindowDays - 1;
	else throw new PlanningInputError(`${field}.lastHarvest`, 'or harvestWindowDays is required');
	if (b < a) throw new PlanningInputError(`${field}.lastHarvest`, 'is before firstHarvest');
	let perDay: number;
	let n = b - a + 1;
	if (p.windowDays !== undefined && p.windowDays > n)
		n = requirePositive(`${field}.windowDays`, Math.floor(p.windowDays));
	if (p.bedFeet !== undefined && p.yieldPerBedFoot !== undefined) {
		requireNonNegative(`${field}.bedFeet`, p.bedFeet);
		requireNonNegative(`${field}.yieldPerBedFoot`, p.yieldPerBedFoot);
		perDay = (p.bedFeet * p.yieldPerBedFoot) / n;
	} else if (p.weeklyYield !== undefined) {
		perDay = requireNonNegative(`${field}.weeklyYield`, p.weeklyYield) / 7;
	} else {
		throw new PlanningInputError(`${field}.weeklyYield`, 'or bedFeet with yieldPerBedFoot is required');
	}
	const shape = p.curve?.shape;
	if (shape === undefined || shape === 'flat') return { a, b, perDay, n };
	return { a, b, perDay, n, curve: cumulativeWeights(validateCurve(p.curve, `${field}.curve`), n) };
}

function addTo(map: Map<string, Map<DayNumber, number>>, crop: string, monday: DayNumber, q: number): void {
	let m = map.get(crop);
	if (!m) map.set(crop, (m = new Map()));
	m.set(monday, (m.get(monday) ?? 0) + q);
}

/**
 * Weekly projected harvest per crop against weekly targets (DESIGN step 7).
 * One row per crop and ISO week that has supply or demand, sorted by crop
 * then week. Accumulates into per-crop maps keyed by each week's Monday.
 */
export function forecast(plantings: ForecastPlanting[], targets: CropWeekQuantity[]): ForecastRow[] {
	const supply = new Map<string, Map<DayNumber, number>>();
	const demand = new Map<string, Map<DayNumber, number>>();
	plantings.forEach((p, i) => {
		if (typeof p.crop !== 'string') throw new PlanningInputError(`plantings[${i}].crop`, 'is required');
		const w = harvestWindow(p, `plantings[${i}]`);
		for (let monday = w.a - weekdayOf(w.a) + 1; monday <= w.b; monday += 7) {
			addTo(supply, p.crop, monday, windowAmount(w, monday, monday + 6));
		}
	});
	addTargets(demand, targets);
	return rowsOf(supply, demand);
}

function addTargets(demand: Map<string, Map<DayNumber, number>>, targets: CropWeekQuantity[]): void {
	targets.forEach((t, i) => {
		const q = requireNonNegative(`targets[${i}].quantity`, t.quantity);
		addTo(demand, t.crop, weekStartDay(t.week, `targets[${i}].week`), q);
	});
}

/**
 * Weekly supply already summed per crop and ISO week, against targets, as forecast() rows:
 * the same rows as forecast() over one Monday–Sunday planting of weeklyYield q per supply
 * entry (entries of 0 or less left out), without that second pass over pseudo-plantings.
 * forecast() spreads q as 7 days × (q ÷ 7), which is not always q to the last bit, so the
 * same product is taken here and the rows stay identical.
 */
export function forecastFromWeeklySupply(weekly: CropWeekQuantity[], targets: CropWeekQuantity[]): ForecastRow[] {
	const supply = new Map<string, Map<DayNumber, number>>();
	const demand = new Map<string, Map<DayNumber, number>>();
	weekly.forEach((s, i) => {
		if (!(s.quantity > 0)) return;
		if (typeof s.crop !== 'string') throw new PlanningInputError(`supply[${i}].crop`, 'is required');
		addTo(supply, s.crop, weekStartDay(s.week, `supply[${i}].week`), 7 * (s.quantity / 7));
	});
	addTargets(demand, targets);
	return rowsOf(supply, demand);
}

/** One row per crop and week with supply or demand, sorted by crop then week. */
function rowsOf(
	supply: Map<string, Map<DayNumber, number>>,
	demand: Map<string, Map<DayNumber, number>>
): ForecastRow[] {
	const weekName = new Map<DayNumber, string>();
	const nameOf = (m: DayNumber): string => {
		let s = weekName.get(m);
		if (s === undefined) weekName.set(m, (s = isoWeekOfDay(m)));
		return s;
	};
	const crops = [...new Set([...supply.keys(), ...demand.keys()])].sort();
	const rows: ForecastRow[] = [];
	for (const crop of crops) {
		const sm = supply.get(crop);
		const dm = demand.get(crop);
		const mondays = [...new Set([...(sm?.keys() ?? []), ...(dm?.keys() ?? [])])].sort((x, y) => x - y);
		for (const m of mondays) {
			const s = sm?.get(m) ?? 0;
			const d = dm?.get(m) ?? 0;
			rows.push({
				crop,
				week: nameOf(m),
				supply: s,
				demand: d,
				shortfall: Math.max(0, d - s),
				surplus: Math.max(0, s - d)
			});
		}
	}
	return rows;
}

/** How one crop's supply in one week was reached: each planting's share of days. */
export function explainSupply(plantings: ForecastPlanting[], crop: string, week: string): ExplainStep[] {
	const monday = weekStartDay(week);
	const steps: ExplainStep[] = [];
	let total = 0;
	plantings.forEach((p, i) => {
		if (p.crop !== crop) return;
		const w = harvestWindow(p, `plantings[${i}]`);
		const days = Math.min(w.b, monday + 6) - Math.max(w.a, monday) + 1;
		if (days <= 0) return;
		const q = windowAmount(w, monday, monday + 6);
		total += q;
		const whole = w.perDay * w.n;
		steps.push({
			label: `${p.key ?? `planting ${i + 1}`}: ${days} of 7 days in ${week}`,
			value: q,
			formula: w.curve
				? `${whole.toFixed(2)} over the window × ${(q / whole).toFixed(3)} of it in these days (${p.curve?.shape} harvest curve)`
				: `${days} d × ${w.perDay.toFixed(3)} per day (flat harvest curve)`
		});
	});
	steps.push({ label: `${crop} supply in ${week}`, value: total, formula: 'Σ plantings harvesting that week' });
	return steps;
}
