// The JSON the plantings and forecast API answer, shared by the routes that send it and the browser
// code that reads it, so a change to one is a type error in the other. Types only.
import type { PlantingView } from './types';
import type { PlantingField } from './schemas/planting';
import type { Role } from './roles';
import type { GridBed, GridFarm, GridVariety } from './plantings/derive';
import type { ForecastCrop, ForecastSeries, SeasonForecastRow } from './server/forecast';

/** Any 4xx: a sentence for the user, and per field what is wrong (`plantings.3.fieldDate`). */
export interface ApiErrorAnswer {
	message: string;
	errors?: Record<string, string>;
	/** The fields a role may not change (403). */
	fields?: string[];
}

/** GET /api/seasons/{id}/plantings: the season's plantings and what the grid needs to recalculate them. */
export interface PlantingsListAnswer {
	season: { id: number; name: string };
	plantings: PlantingView[];
	varieties: GridVariety[];
	beds: GridBed[];
	farm: GridFarm;
	role: Role;
	/** The fields this role may change. */
	editable: PlantingField[];
}

/** POST /api/seasons/{id}/plantings, 201: the new rows in the order sent. */
export interface PlantingsCreatedAnswer {
	plantings: PlantingView[];
}

/** PATCH /api/plantings/{id}, 200. */
export interface PlantingSavedAnswer {
	planting: PlantingView;
}

/** PATCH /api/plantings/{id}, 409: someone saved first; the row as it stands now. */
export interface PlantingConflictAnswer extends ApiErrorAnswer {
	current: PlantingView;
	changedBy: string | null;
}

/** GET /api/seasons/{id}/forecast: one row per crop and week in [from, to]. */
export interface ForecastAnswer {
	season: { id: number; name: string };
	from: string;
	to: string;
	weeks: string[];
	currentWeek: string;
	crops: ForecastCrop[];
	rows: SeasonForecastRow[];
}

/** The same with `shape=series`: per crop, one array per figure across `weeks`. */
export interface ForecastSeriesAnswer extends Omit<ForecastAnswer, 'rows'> {
	series: ForecastSeries[];
}
