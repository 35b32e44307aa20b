// What matters now in a season, for its overview: this week's work (or the next week that has
// some), crops running short from this week on, plantings without a bed, and the plan's warnings.
import { deriveRow, storedHarvestDays } from '$lib/plantings/derive';
import { addDays, isoWeek, weekStart } from '$lib/planning/iso-week';
import type { PlantingView } from '$lib/types';
import { todayIn } from '$lib/today';
import * as farms from './farms';
import { seasonForecast } from './forecast';
import { gridContext, listForSeason } from './plantings';
import { dayInSeason, type Season } from './seasons';
import { nextTaskDate } from './sheets/next-task';

export interface WeekWork {
	week: string;
	/** The week asked for had none: this is the next week that has work. */
	skipped: string | null;
	traySowing: number;
	directSowing: number;
	transplanting: number;
	harvest: number;
}

export interface ShortCrop {
	crop: string;
	name: string;
	unit: string;
	weeks: number;
	firstWeek: string;
	shortfall: number;
}

export interface SeasonOverview {
	plantings: PlantingView[];
	totals: { plantings: number; crops: number; bedFeet: number };
	work: WeekWork;
	short: ShortCrop[];
	unplaced: PlantingView[];
	warnings: { plantingId: number; label: string; message: string }[];
}

function workIn(plantings: PlantingView[], week: string, skipped: string | null): WeekWork {
	const monday = weekStart(week);
	const sunday = addDays(monday, 6);
	const live = plantings.filter((p) => p.status !== 'failed');
	const inWeek = (d: string | null) => d !== null && d >= monday && d <= sunday;
	return {
		week,
		skipped,
		traySowing: live.filter((p) => inWeek(p.traySowDate)).length,
		directSowing: live.filter((p) => p.method === 'direct' && inWeek(p.fieldDate)).length,
		transplanting: live.filter((p) => p.method === 'transplant' && inWeek(p.fieldDate)).length,
		harvest: live.filter((p) => p.status !== 'finished' && p.firstHarvest <= sunday && p.lastHarvest >= monday).length
	};
}

export async function seasonOverview(farmId: number, season: Season): Promise<SeasonOverview> {
	const [plantings, ctx, forecast, farm] = await Promise.all([
		listForSeason(farmId, season.id),
		gridContext(farmId),
		seasonForecast(farmId, season),
		farms.get(farmId)
	]);
	const today = todayIn(farm.timeZone);
	const day = dayInSeason(today, season);
	let work = workIn(plantings, isoWeek(day), null);
	if (!work.traySowing && !work.directSowing && !work.transplanting && !work.harvest) {
		const next = await nextTaskDate(farmId, season.id, addDays(weekStart(work.week), 7), season.endsOn);
		if (next) work = workIn(plantings, isoWeek(next), work.week);
	}

	// Short from the current week on: weeks already past cannot be helped by a plan.
	const from = forecast.currentWeek;
	const byCrop = new Map<string, ShortCrop>();
	const cropOf = new Map(forecast.crops.map((c) => [c.id, c]));
	for (const r of forecast.rows) {
		if (r.week < from || r.shortfall <= 1e-9) continue;
		const c = cropOf.get(r.crop);
		let s = byCrop.get(r.crop);
		if (!s)
			byCrop.set(
				r.crop,
				(s = { crop: r.crop, name: c?.name ?? r.crop, unit: c?.unit ?? '', weeks: 0, firstWeek: r.week, shortfall: 0 })
			);
		s.weeks += 1;
		s.shortfall += r.shortfall;
		if (r.week < s.firstWeek) s.firstWeek = r.week;
	}

	const varieties = new Map(ctx.varieties.map((v) => [v.id, v]));
	const warnings: SeasonOverview['warnings'] = [];
	for (const p of plantings) {
		const v = varieties.get(p.varietyId);
		if (!v || p.status === 'failed' || p.status === 'finished') continue;
		const d = deriveRow({ ...p, harvestDays: storedHarvestDays(p.firstHarvest, p.lastHarvest) }, v, ctx.farm);
		const label = `${p.crop} · ${p.variety}, ${p.bed ? `${p.block} ${p.bed}` : 'not placed'}, field ${p.fieldDate}`;
		if (!d.ok) warnings.push({ plantingId: p.id, label, message: d.message });
		else for (const w of d.value.warnings) warnings.push({ plantingId: p.id, label, message: w.message });
	}

	return {
		plantings,
		totals: {
			plantings: plantings.length,
			crops: new Set(plantings.map((p) => p.crop)).size,
			bedFeet: plantings.reduce((n, p) => n + p.lengthFt, 0)
		},
		work,
		short: [...byCrop.values()].sort((a, b) => b.weeks - a.weeks || a.name.localeCompare(b.name)),
		unplaced: plantings.filter((p) => p.bedId === null && p.status !== 'failed'),
		warnings
	};
}
