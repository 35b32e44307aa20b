/** Beds and bed-foot ranges. A place in a bed is [startFt, startFt + lengthFt). */
export interface Bed {
	id: string;
	lengthFt: number;
	blockId?: string;
}

/** A planting already in a bed (fixed, or placed earlier). */
export interface BedPlanting {
	key: string;
	bedId: string;
	startFt: number;
	lengthFt: number;
	fieldDate: string;
	lastHarvest: string;
	family?: string;
}

/**
 * Time a planting holds its bed-feet, as day numbers, half-open [s, e):
 * from the field date through last harvest plus turnaround days (clearing and
 * bed prep), i.e. the closed interval [fieldDate, lastHarvest + turnaround].
 * Tray days are not counted: the seedlings are in the greenhouse.
 */
export interface Occupancy {
	s: number;
	e: number;
	a: number;
	b: number;
	key: string;
}

export const DEFAULT_TURNAROUND_DAYS = 7;
export const FT_EPSILON = 1e-9;
