// Plantings of a farm's seasons, with their variety, crop and bed joined in for display.
import { db } from './db';

import type { PlantingView } from '$lib/types';

export type { PlantingView };

function base(farmId: number) {
	return db()('plantings as p')
		.join('varieties as v', 'v.id', 'p.variety_id')
		.join('crops as c', 'c.id', 'v.crop_id')
		.leftJoin('beds as b', 'b.id', 'p.bed_id')
		.leftJoin('blocks as k', 'k.id', 'b.block_id')
		.where('p.farm_id', farmId)
		.select(
			'p.id', 'p.season_id', 'p.variety_id', 'v.name as variety', 'c.name as crop', 'c.family', 'c.harvest_unit',
			'p.bed_id', 'b.name as bed', 'k.name as block', 'k.position as block_position', 'b.position as bed_position',
			'p.start_ft', 'p.length_ft', 'p.rows', 'p.in_row_spacing_in', 'p.seeds_per_spot', 'p.method', 'p.tray_sow_date',
			'p.field_date', 'p.first_harvest', 'p.last_harvest', 'p.expected_yield', 'p.seeds_needed', 'p.status', 'p.notes', 'p.version'
		);
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function toView(r: any): PlantingView {
	return {
		id: r.id,
		seasonId: r.season_id,
		varietyId: r.variety_id,
		variety: r.variety,
		crop: r.crop,
		family: r.family,
		harvestUnit: r.harvest_unit,
		bedId: r.bed_id,
		bed: r.bed,
		block: r.block,
		blockPosition: r.block_position,
		bedPosition: r.bed_position,
		startFt: Number(r.start_ft),
		lengthFt: Number(r.length_ft),
		rows: r.rows,
		inRowSpacingIn: Number(r.in_row_spacing_in),
		seedsPerSpot: r.seeds_per_spot,
		method: r.method,
		traySowDate: r.tray_sow_date,
		fieldDate: r.field_date,
		firstHarvest: r.first_harvest,
		lastHarvest: r.last_harvest,
		expectedYield: Number(r.expected_yield),
		seedsNeeded: r.seeds_needed,
		status: r.status,
		notes: r.notes,
		version: r.version
	};
}

export async function listForSeason(farmId: number, seasonId: number): Promise<PlantingView[]> {
	return (await base(farmId).andWhere('p.season_id', seasonId).orderBy([{ column: 'p.field_date' }, { column: 'p.id' }])).map(toView);
}

export interface WeekTasks {
	traySowing: PlantingView[];
	directSowing: PlantingView[];
	transplanting: PlantingView[];
	harvest: PlantingView[];
}

/** What the crew does in the week monday..sunday, in walking order (block, bed, start foot). */
export async function tasksForWeek(farmId: number, monday: string, sunday: string): Promise<WeekTasks> {
	const walking = [{ column: 'k.position' }, { column: 'b.position' }, { column: 'p.start_ft' }];
	const [tray, field, harvest] = await Promise.all([
		base(farmId).whereBetween('p.tray_sow_date', [monday, sunday]).whereNotIn('p.status', ['failed']).orderBy('c.name'),
		base(farmId).whereBetween('p.field_date', [monday, sunday]).whereNotIn('p.status', ['failed']).orderBy(walking),
		base(farmId).where('p.first_harvest', '<=', sunday).andWhere('p.last_harvest', '>=', monday).whereNotIn('p.status', ['failed', 'finished']).orderBy(walking)
	]);
	const fieldViews = field.map(toView);
	return {
		traySowing: tray.map(toView),
		directSowing: fieldViews.filter((p) => p.method === 'direct'),
		transplanting: fieldViews.filter((p) => p.method === 'transplant'),
		harvest: harvest.map(toView)
	};
}
