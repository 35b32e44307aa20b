// Data for the bed timeline and the free-space question. Beds hold their feet across seasons
// (garlic planted in the fall is dug the next summer), so both look at every planting of the
// farm whose time in the ground touches the window, not only the season's own.
import { addDays, checkBedConflicts, formatWeekDate, freeSpace, weekStart, type BedPlanting } from '$lib/planning';
import type { FreeSpaceQuery } from '$lib/schemas/free-space';
import type {
	FreeBed,
	FreeSpaceAnswer,
	TimelineBed,
	TimelineData,
	TimelineFlag,
	TimelinePlanting
} from '$lib/timeline-types';
import { holdingBedIn } from './bed-holders';
import * as bedData from './beds';
import * as farms from './farms';
import type { Season } from './seasons';
import { plantingsWithCrop } from './planting-query';
import { fromStored, storedColumn, type StoredPlanting } from '$lib/plantings/fields';
import { pick } from '$lib/pick';

export type { FreeBed, FreeSpaceAnswer, TimelineBed, TimelineData, TimelineFlag, TimelinePlanting };

/** The planting's fields and figures the timeline draws, read through the planting field table. */
const drawn = [
	'bedId',
	'startFt',
	'lengthFt',
	'method',
	'fieldDate',
	'status',
	'traySowDate',
	'firstHarvest',
	'lastHarvest'
] as const satisfies readonly (keyof StoredPlanting)[];

/** What the joins give: each named as TimelinePlanting names it. */
const joined = ['id', 'seasonId', 'crop', 'variety', 'family'] as const;

const columns = [
	'p.id',
	'p.season_id as seasonId',
	'c.name as crop',
	'v.name as variety',
	'c.family',
	...drawn.map((f) => `p.${storedColumn(f)}`)
];

/** A row as `columns` reads it. */
type TimelineRow = Record<string, unknown> & Pick<TimelinePlanting, (typeof joined)[number]>;

const toPlanting = (r: TimelineRow): TimelinePlanting => ({ ...pick(r, joined), ...pick(fromStored(r), drawn) });

/** The season's plantings, plus other seasons' placed plantings that hold a bed in [from, to]. */
async function plantingsTouching(
	farmId: number,
	seasonId: number | null,
	from: string,
	to: string,
	turnaroundDays: number
): Promise<TimelinePlanting[]> {
	const rows = await plantingsWithCrop()
		.where('p.farm_id', farmId)
		.andWhere((q) => {
			if (seasonId !== null) q.where('p.season_id', seasonId);
			q.orWhere((o) => holdingBedIn(o, from, to, turnaroundDays));
		})
		.orderBy([{ column: 'p.field_date' }, { column: 'p.id' }])
		.select(columns);
	return rows.map(toPlanting);
}

// A failed planting gives its bed-feet back: it neither conflicts nor takes free space.
function enginePlantings(list: TimelinePlanting[]): BedPlanting[] {
	return list
		.filter((p) => p.bedId !== null && p.status !== 'failed')
		.map((p) => ({
			key: String(p.id),
			bedId: String(p.bedId),
			startFt: p.startFt,
			lengthFt: p.lengthFt,
			fieldDate: p.fieldDate,
			lastHarvest: p.lastHarvest,
			family: p.family
		}));
}

function engineBeds(beds: TimelineBed[]): { id: string; lengthFt: number; blockId: string }[] {
	return beds.map((b) => ({ id: String(b.id), lengthFt: b.lengthFt, blockId: String(b.blockId) }));
}

function ft(a: number, b: number): string {
	return `${a}–${b} ft`;
}

export async function loadTimeline(farmId: number, season: Season, blockId: number | null): Promise<TimelineData> {
	const [farm, blocks, allBeds] = await Promise.all([
		farms.get(farmId),
		bedData.listBlocks(farmId),
		bedData.list(farmId)
	]);
	const beds: TimelineBed[] = allBeds.map((b) => ({
		id: b.id,
		blockId: b.blockId,
		name: b.name,
		lengthFt: b.lengthFt
	}));
	const all = await plantingsTouching(farmId, season.id, season.startsOn, season.endsOn, farm.turnaroundDays);
	const byId = new Map(all.map((p) => [String(p.id), p]));
	const bedName = new Map(beds.map((b) => [String(b.id), b]));
	const flags: Record<number, TimelineFlag[]> = {};
	for (const c of checkBedConflicts(enginePlantings(all), engineBeds(beds), farm.turnaroundDays)) {
		const p = byId.get(c.plantingKey);
		if (!p || c.code === 'unknown_bed') continue;
		const bed = bedName.get(c.bedId);
		let flag: TimelineFlag;
		if (c.code === 'overlap') {
			const o = byId.get(c.withKey ?? '');
			const other = o
				? `${o.crop} · ${o.variety} (${ft(o.startFt, o.startFt + o.lengthFt)}, ${formatWeekDate(o.fieldDate)} to ${formatWeekDate(o.lastHarvest)})`
				: 'another planting';
			flag = {
				code: 'overlap',
				message: `Overlaps ${other} in bed ${bed?.name ?? ''}, counting ${farm.turnaroundDays} turnaround days.`
			};
		} else {
			flag = {
				code: 'past-end',
				message: `Runs past the end of bed ${bed?.name ?? ''} (${ft(0, bed?.lengthFt ?? 0)}).`
			};
		}
		(flags[p.id] ??= []).push(flag);
	}
	const shownBeds = blockId === null ? beds : beds.filter((b) => b.blockId === blockId);
	const shownBedIds = new Set(shownBeds.map((b) => b.id));
	// Other seasons' plantings only matter where they hold a bed; unplaced ones of this season stay listed.
	const plantings = all.filter((p) => (p.bedId === null ? p.seasonId === season.id : shownBedIds.has(p.bedId)));
	let from = season.startsOn;
	let to = season.endsOn;
	for (const p of all) {
		if (p.seasonId !== season.id) continue;
		const first = p.traySowDate ?? p.fieldDate;
		if (first < from) from = first;
		if (p.lastHarvest > to) to = p.lastHarvest;
	}
	return { from, to, turnaroundDays: farm.turnaroundDays, blocks, beds: shownBeds, plantings, flags };
}

/** Which beds are free for the whole of weeks from..to, and which feet; ranges shorter than minFt are left out. */
export async function freeSpaceFor(farmId: number, query: FreeSpaceQuery): Promise<FreeSpaceAnswer> {
	const fromDate = weekStart(query.from);
	const toDate = addDays(weekStart(query.to), 6);
	const minFt = query.minFt ?? 0;
	const [farm, allBeds] = await Promise.all([farms.get(farmId), bedData.list(farmId)]);
	const beds = query.block === undefined ? allBeds : allBeds.filter((b) => b.blockId === query.block);
	const plantings = await plantingsTouching(farmId, null, fromDate, toDate, farm.turnaroundDays);
	const answer = freeSpace(
		enginePlantings(plantings),
		beds.map((b) => ({ id: String(b.id), lengthFt: b.lengthFt })),
		fromDate,
		toDate,
		farm.turnaroundDays
	);
	const out: FreeBed[] = [];
	answer.forEach((a, i) => {
		const b = beds[i];
		const ranges = a.ranges.filter((r) => r.lengthFt > 0 && r.lengthFt >= minFt);
		if (!ranges.length) return;
		out.push({
			bedId: b.id,
			bed: b.name,
			block: b.blockName,
			lengthFt: b.lengthFt,
			ranges,
			freeFt: ranges.reduce((t, r) => t + r.lengthFt, 0),
			longestFt: ranges.reduce((m, r) => Math.max(m, r.lengthFt), 0)
		});
	});
	return {
		from: query.from,
		to: query.to,
		fromDate,
		toDate,
		minFt,
		turnaroundDays: farm.turnaroundDays,
		bedsChecked: beds.length,
		beds: out
	};
}
