import type { Farm, Variety } from '../../../src/lib/planning/index';

/** Invented farm at 42° N (the latitude of the published day-length check values). */
export const farm42: Farm = { lastSpringFrost: '2026-05-10', firstFallFrost: '2026-10-05', latitude: 42 };

export function variety(over: Partial<Variety>): Variety {
	return {
		id: 'v',
		crop: 'crop',
		method: 'direct',
		daysToMaturity: 50,
		harvestWindowDays: 14,
		yieldPerBedFoot: 1,
		rows: 1,
		inRowSpacingIn: 6,
		seedsPerSpot: 1,
		germinationRate: 0.9,
		seedsPerGram: 100,
		frostTender: false,
		...over
	};
}

export const targetsFor = (weeks: string[], quantity: number): { week: string; quantity: number }[] =>
	weeks.map((week) => ({ week, quantity }));
