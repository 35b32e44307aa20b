// The JSON the plantings API answers, shared by the routes that send it and the browser code that
// reads it, so a change to one is a type error in the other.
import type { PlantingView } from './types';

/** Any 4xx: a sentence for the user, and per field what is wrong (`plantings.3.fieldDate`). */
export interface ApiErrorAnswer {
	message: string;
	errors?: Record<string, string>;
	/** The fields a role may not change (403). */
	fields?: string[];
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
