// The invented carrot variety and a planting of it that the grid's unit tests share.
import type { GridVariety } from '../../src/lib/plantings/derive';
import type { PlantingView } from '../../src/lib/types';

export const carrot: GridVariety = {
	id: 1,
	cropId: 1,
	crop: 'Carrot',
	family: 'Apiaceae',
	harvestUnit: 'lb',
	frostTolerance: 'hardy',
	heatLimitF: null,
	baseTempF: 40,
	name: 'Invented Orange',
	method: 'direct',
	daysToMaturity: 70,
	daysInTray: 0,
	harvestWindowDays: 14,
	yieldPerBedFoot: 1.5,
	rows: 4,
	inRowSpacingIn: 1,
	seedsPerSpot: 2,
	germinationRate: 0.65,
	seedsPerGram: 776.03,
	seedPriceCentsPerGram: 0,
	seedsPerPacket: null,
	cellsPerTray: 128,
	margin: 0.1,
	gddToMaturity: null
};

/** A 60-ft carrot planting in bed B1, changed by `over`. */
export function planting(id: number, over: Partial<PlantingView> = {}): PlantingView {
	return {
		id,
		seasonId: 1,
		varietyId: 1,
		variety: 'Invented Orange',
		crop: 'Carrot',
		family: 'Apiaceae',
		harvestUnit: 'lb',
		bedId: 10,
		bed: 'B1',
		block: 'North',
		blockPosition: 1,
		bedPosition: 1,
		startFt: 0,
		lengthFt: 60,
		rows: 4,
		inRowSpacingIn: 1,
		seedsPerSpot: 2,
		method: 'direct',
		traySowDate: null,
		fieldDate: '2026-04-20',
		firstHarvest: '2026-06-29',
		lastHarvest: '2026-07-12',
		expectedYield: 90,
		seedsNeeded: 9748,
		status: 'planned',
		notes: null,
		version: 1,
		actualTraySowDate: null,
		actualFieldDate: null,
		actualFirstHarvest: null,
		actualLastHarvest: null,
		...over
	};
}
