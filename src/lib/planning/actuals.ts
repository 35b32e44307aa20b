/**
 * Actual against plan: what the harvest log says next to what the plan forecast, per planting,
 * per crop and ISO week, and per variety; and the rest of the season's forecast scaled by each
 * crop's observed ratio so far. Pure: plain data in and out.
 *
 * Definitions (the results page explains each):
 * - Forecast per week is the engine's flat harvest curve (forecast()): bed-feet × planned yield
 *   per bed-foot spread evenly over the planned window.
 * - "So far" is the weeks before the current week, which are complete; a harvest logged this
 *   week shows in its week but does not yet count in the ratio.
 * - Crop ratio = Σ logged so far ÷ Σ forecast so far (null when nothing was forecast so far).
 *   Adjusted forecast of a week from the current one on = forecast × ratio.
 * - Planned days to maturity = planned first harvest − planned field date. Actual = actual first
 *   harvest (or the earliest logged harvest) − actual field date (or the planned field date).
 * - Observed yield per bed-foot of a variety = Σ logged ÷ Σ bed-feet over its finished plantings
 *   with harvests (an unfinished planting would pull it down); observed days to maturity = the
 *   mean of its plantings' actual days, rounded to a whole day. Each comes with its count.
 */
import type { HarvestCurve } from './harvest-curve';
import { daysBetween, isoWeek, weekStart } from './iso-week';
import { type ForecastPlanting, forecast } from './forecast';
import { PlanningInputError } from './errors';

/** A planting with its planned harvest dates and yield, as the forecast also takes it. */
export interface ActualsPlanting extends ForecastPlanting {
	key: string;
	crop: string;
	variety: string;
	bedFeet: number;
	/** Planned harvest units per bed-foot over the whole window. */
	yieldPerBedFoot: number;
	/** How the yield spreads over the window (default flat), and the full window when the dates cut it short. */
	curve?: HarvestCurve;
	windowDays?: number;
	fieldDate: string;
	firstHarvest: string;
	lastHarvest: string;
	actualFieldDate?: string | null;
	actualFirstHarvest?: string | null;
	finished?: boolean;
}

export interface ActualsHarvest {
	plantingKey: string;
	date: string;
	quantity: number;
}

export interface ActualsInput {
	plantings: ActualsPlanting[];
	harvests: ActualsHarvest[];
	/** The farm's current ISO week. */
	currentWeek: string;
}

export interface PlantingActual {
	key: string;
	crop: string;
	variety: string;
	bedFeet: number;
	forecastTotal: number;
	forecastSoFar: number;
	logged: number;
	/** logged ÷ forecast so far × 100; null when nothing was forecast so far. */
	pctOfForecast: number | null;
	plannedDtm: number;
	actualDtm: number | null;
	plannedYieldPerBedFoot: number;
	actualYieldPerBedFoot: number;
}

export interface CropWeekActual {
	crop: string;
	week: string;
	forecast: number;
	logged: number;
	pctOfForecast: number | null;
	/** Before the current week: complete, so it counts in the ratio. */
	past: boolean;
	/** From the current week on: forecast × the crop's ratio (the forecast itself when there is no ratio). */
	adjusted: number | null;
}

export interface CropActual {
	crop: string;
	forecastSoFar: number;
	loggedSoFar: number;
	ratio: number | null;
	forecastRest: number;
	adjustedRest: number;
}

export interface VarietyObserved {
	variety: string;
	crop: string;
	yieldPlantings: number;
	observedYieldPerBedFoot: number | null;
	dtmPlantings: number;
	observedDtm: number | null;
}

export interface ActualsResult {
	plantings: PlantingActual[];
	weeks: CropWeekActual[];
	crops: CropActual[];
	varieties: VarietyObserved[];
}

function add(m: Map<string, number>, k: string, q: number): void {
	m.set(k, (m.get(k) ?? 0) + q);
}

export function actualsAgainstPlan(input: ActualsInput): ActualsResult {
	const currentMonday = weekStart(input.currentWeek);
	const byKey = new Map(input.plantings.map((p) => [p.key, p]));
	const loggedByPlanting = new Map<string, number>();
	const firstLogged = new Map<string, string>();
	const loggedByCropWeek = new Map<string, number>();
	input.harvests.forEach((h, i) => {
		const p = byKey.get(h.plantingKey);
		if (!p) throw new PlanningInputError(`harvests[${i}].plantingKey`, `names no planting (${h.plantingKey})`);
		if (!(h.quantity >= 0)) throw new PlanningInputError(`harvests[${i}].quantity`, 'must be 0 or more');
		add(loggedByPlanting, p.key, h.quantity);
		const seen = firstLogged.get(p.key);
		if (seen === undefined || h.date < seen) firstLogged.set(p.key, h.date);
		add(loggedByCropWeek, `${p.crop}|${isoWeek(h.date)}`, h.quantity);
	});

	const plantings: PlantingActual[] = input.plantings.map((p) => {
		const rows = forecast([p], []);
		const soFar = rows.filter((r) => weekStart(r.week) < currentMonday).reduce((n, r) => n + r.supply, 0);
		const logged = loggedByPlanting.get(p.key) ?? 0;
		const first = p.actualFirstHarvest ?? firstLogged.get(p.key) ?? null;
		return {
			key: p.key,
			crop: p.crop,
			variety: p.variety,
			bedFeet: p.bedFeet,
			forecastTotal: rows.reduce((n, r) => n + r.supply, 0),
			forecastSoFar: soFar,
			logged,
			pctOfForecast: soFar > 0 ? (logged / soFar) * 100 : null,
			plannedDtm: daysBetween(p.fieldDate, p.firstHarvest),
			actualDtm: first ? daysBetween(p.actualFieldDate ?? p.fieldDate, first) : null,
			plannedYieldPerBedFoot: p.yieldPerBedFoot,
			actualYieldPerBedFoot: p.bedFeet > 0 ? logged / p.bedFeet : 0
		};
	});

	const supply = forecast(input.plantings, []);
	const cells = new Map<string, { crop: string; week: string; forecast: number; logged: number }>();
	for (const r of supply)
		cells.set(`${r.crop}|${r.week}`, { crop: r.crop, week: r.week, forecast: r.supply, logged: 0 });
	for (const [k, q] of loggedByCropWeek) {
		const [crop, week] = k.split('|');
		const c = cells.get(k) ?? { crop, week, forecast: 0, logged: 0 };
		c.logged += q;
		cells.set(k, c);
	}
	const sorted = [...cells.values()].sort((a, b) =>
		a.crop === b.crop ? (a.week < b.week ? -1 : 1) : a.crop < b.crop ? -1 : 1
	);

	const crops = new Map<string, CropActual>();
	for (const c of sorted) {
		const t = crops.get(c.crop) ?? {
			crop: c.crop,
			forecastSoFar: 0,
			loggedSoFar: 0,
			ratio: null,
			forecastRest: 0,
			adjustedRest: 0
		};
		if (weekStart(c.week) < currentMonday) {
			t.forecastSoFar += c.forecast;
			t.loggedSoFar += c.logged;
		} else t.forecastRest += c.forecast;
		crops.set(c.crop, t);
	}
	for (const t of crops.values()) {
		t.ratio = t.forecastSoFar > 0 ? t.loggedSoFar / t.forecastSoFar : null;
		t.adjustedRest = t.forecastRest * (t.ratio ?? 1);
	}
	const weeks: CropWeekActual[] = sorted.map((c) => {
		const past = weekStart(c.week) < currentMonday;
		const ratio = crops.get(c.crop)!.ratio;
		return {
			...c,
			pctOfForecast: c.forecast > 0 ? (c.logged / c.forecast) * 100 : null,
			past,
			adjusted: past ? null : c.forecast * (ratio ?? 1)
		};
	});

	const vars = new Map<string, { crop: string; feet: number; logged: number; n: number; dtm: number[] }>();
	for (const p of plantings) {
		const v = vars.get(p.variety) ?? { crop: p.crop, feet: 0, logged: 0, n: 0, dtm: [] };
		if (byKey.get(p.key)!.finished && p.logged > 0 && p.bedFeet > 0) {
			v.feet += p.bedFeet;
			v.logged += p.logged;
			v.n += 1;
		}
		if (p.actualDtm !== null) v.dtm.push(p.actualDtm);
		vars.set(p.variety, v);
	}
	const varieties: VarietyObserved[] = [...vars]
		.filter(([, v]) => v.n > 0 || v.dtm.length > 0)
		.map(([variety, v]) => ({
			variety,
			crop: v.crop,
			yieldPlantings: v.n,
			observedYieldPerBedFoot: v.n > 0 ? v.logged / v.feet : null,
			dtmPlantings: v.dtm.length,
			observedDtm: v.dtm.length > 0 ? Math.round(v.dtm.reduce((a, b) => a + b, 0) / v.dtm.length) : null
		}));
	return { plantings, weeks, crops: [...crops.values()], varieties };
}

/** Fewest plantings behind an observed figure before it may replace the variety's own. */
export const MIN_PLANTINGS_FOR_FIGURES = 3;
