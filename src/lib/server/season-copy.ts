// Next season from this one: the owner copies a season into the next year. Every planting
// moves to the same ISO week and weekday (week 53 → week 52, see $lib/planning/season-shift),
// with actual dates cleared and status back to planned; share sizes, box contents and channel
// demand come along with their weeks moved the same way. Plantings are placed again with the
// engine's previous-family rule, so each family is kept off the beds it held this season
// where another bed has room (a rotation warning where none has). Frost and heat checks run
// on the old and the new dates and the report lists what changed. One transaction: all or nothing.
import type { Knex } from 'knex';
import {
	compareChecks,
	frostHeatChecks,
	isoWeek as isoWeekOf,
	nextYearDate,
	nextYearWeek,
	placePlantings,
	shiftPlantingDates,
	type PlanningWarning
} from '$lib/planning';
import { figureColumns, nextSeasonColumns, toColumns } from '$lib/plantings/fields';
import { engineFarm } from '$lib/engine-inputs';
import { db } from './db';
import * as farms from './farms';
import { familiesByBed } from './rotation';
import * as beds from './beds';
import { bedHolders } from './bed-holders';
import { lockSeason, type Season } from './seasons';
import { insertPlantings, plantingsWithCrop } from './planting-query';

export interface CopyPlantingNote {
	plantingId: number;
	crop: string;
	variety: string;
	fromField: string;
	toField: string;
	fromBed: string | null;
	toBed: string | null;
	added: PlanningWarning[];
	cleared: PlanningWarning[];
}

export interface CopyReport {
	season: { id: number; year: number; name: string; startsOn: string; endsOn: string };
	plantings: number;
	/** Plantings whose frost or heat checks differ on the new dates. */
	checkChanges: CopyPlantingNote[];
	rotation: { crop: string; bed: string | null; message: string }[];
	unplaced: { crop: string; variety: string; reason: string }[];
	/** Plantings whose field date was in week 53 and now sits in week 52. */
	week53: number;
	demand: { shareSizes: number; boxItems: number; channelDemand: number; droppedWeek53: number };
}

export type CopyResult = { ok: true; report: CopyReport } | { ok: false; status: 409; message: string };

function seasonDates(s: Season, year: number): { startsOn: string; endsOn: string } {
	// A calendar-year season stays one; any other span moves like the plantings do.
	if (s.startsOn === `${s.year}-01-01` && s.endsOn === `${s.year}-12-31`)
		return { startsOn: `${year}-01-01`, endsOn: `${year}-12-31` };
	return { startsOn: nextYearDate(s.startsOn), endsOn: nextYearDate(s.endsOn) };
}

/** The source's plantings moved on (an apply, an edit, a harvest) between reading and writing the copy. */
class SourceMoved extends Error {}

/** Ids and versions of a season's plantings: what the copy was computed from. */
async function plantingStamp(q: Knex, farmId: number, seasonId: number): Promise<string> {
	const rows: { id: number; version: number }[] = await q('plantings')
		.where({ farm_id: farmId, season_id: seasonId })
		.orderBy('id')
		.select('id', 'version');
	return rows.map((r) => `${r.id}:${r.version}`).join(',');
}

/**
 * Copies `source` into the next year. The copy is worked out from the source as read before the
 * transaction (placing plantings needs the pool); the transaction then takes the source season's
 * lock, as every writer of its plantings does, and writes only if the source's plantings are still
 * what the copy was made from. Otherwise it is worked out again (three tries, then 409).
 */
export async function copySeason(farmId: number, source: Season, userId: string): Promise<CopyResult> {
	for (let attempt = 1; attempt <= 3; attempt++) {
		try {
			return await copyOnce(farmId, source, userId);
		} catch (err) {
			if (!(err instanceof SourceMoved)) throw err;
		}
	}
	return {
		ok: false,
		status: 409,
		message: `${source.name} kept changing while it was being copied (plan applies or edits); nothing was copied. Try again.`
	};
}

async function copyOnce(farmId: number, source: Season, userId: string): Promise<CopyResult> {
	const year = source.year + 1;
	const stamp = await plantingStamp(db(), farmId, source.id);
	const [farm, temps, bedList, plantings] = await Promise.all([
		farms.get(farmId),
		farms.weeklyTemps(farmId),
		beds.list(farmId),
		plantingsWithCrop()
			.where({ 'p.farm_id': farmId, 'p.season_id': source.id })
			.orderBy([{ column: 'p.field_date' }, { column: 'p.id' }])
			.select('p.*', 'c.name as crop', 'c.family', 'c.frost_tolerance', 'c.heat_limit_f', 'v.name as variety')
	]);
	const checkFarm = engineFarm(farm, temps);
	const bedName = new Map(bedList.map((b) => [b.id, `${b.blockName} · ${b.name}`]));

	const moved = plantings.map((p) => {
		const old = {
			traySowDate: p.tray_sow_date,
			fieldDate: p.field_date,
			firstHarvest: p.first_harvest,
			lastHarvest: p.last_harvest
		};
		const next = shiftPlantingDates(old);
		const facts = {
			frostTender: p.frost_tolerance === 'tender',
			heatLimitF: p.heat_limit_f === null ? undefined : Number(p.heat_limit_f)
		};
		const change = compareChecks(frostHeatChecks(facts, old, checkFarm), frostHeatChecks(facts, next, checkFarm));
		return { p, old, next, change };
	});

	// Which families each bed held this season and the ones before it (the farm's rotation look-back):
	// the engine keeps them off those beds next year.
	const previousFamilyByBed = await familiesByBed(farmId, year, farm.rotationYears);
	for (const p of plantings) {
		if (p.bed_id === null) continue;
		const list = (previousFamilyByBed[String(p.bed_id)] ??= []);
		if (!list.includes(p.family)) list.push(p.family);
	}
	// Whatever is in the beds while the new season runs (this season's fall plantings, dug next
	// summer, among them) stays where it is: the moved plantings are placed around it.
	const dates = seasonDates(source, year);
	const fixed = await bedHolders(farmId, dates.startsOn, dates.endsOn, farm.turnaroundDays);
	const placement = placePlantings(
		moved.map(({ p, next }) => ({
			key: String(p.id),
			bedFeet: Number(p.length_ft),
			fieldDate: next.fieldDate,
			lastHarvest: next.lastHarvest,
			family: p.family
		})),
		bedList.map((b) => ({ id: String(b.id), lengthFt: b.lengthFt, blockId: String(b.blockId) })),
		// Kept whole: splitting would change the planting's rows, seed and yield per piece.
		{ turnaroundDays: farm.turnaroundDays, previousFamilyByBed, fixed, allowSplit: false }
	);
	const placedBy = new Map(placement.placed.map((r) => [r.plantingKey, r]));
	const unplacedBy = new Map(placement.unplaced.map((u) => [u.plantingKey, u.reason]));

	return db().transaction(async (trx) => {
		// Exclusive: a second copy of the same season waits here, then finds the year taken.
		await lockSeason(trx, farmId, source.id);
		if ((await plantingStamp(trx, farmId, source.id)) !== stamp) throw new SourceMoved();
		if (await trx('seasons').where({ farm_id: farmId, year }).first('id')) {
			return {
				ok: false,
				status: 409,
				message: `This farm already has a ${year} season; copying would mix two plans.`
			} as const;
		}
		const name = `${year} season`;
		const [seasonId] = await trx('seasons').insert({
			farm_id: farmId,
			year,
			name,
			starts_on: dates.startsOn,
			ends_on: dates.endsOn
		});

		const rows = moved.map(({ p, next }) => {
			const at = placedBy.get(String(p.id));
			const reason = unplacedBy.get(String(p.id));
			return {
				...nextSeasonColumns(p),
				// The fields the copy moves itself ('moved' in the field table), and the shifted figures.
				...toColumns({
					bedId: at ? Number(at.bedId) : null,
					startFt: at ? at.startFt : 0,
					fieldDate: next.fieldDate,
					notes: reason
						? `Not placed: ${reason}`
						: p.notes && !String(p.notes).startsWith('Not placed:')
							? p.notes
							: null
				}),
				...figureColumns({ ...next, expectedYield: Number(p.expected_yield), seedsNeeded: Number(p.seeds_needed) }),
				farm_id: farmId,
				season_id: seasonId,
				updated_by: userId
			};
		});
		// Plan apply and import batch the same way; no ids are needed back from this insert.
		await insertPlantings(trx, rows);

		const shares = await trx('share_sizes').where({ farm_id: farmId, season_id: source.id });
		let boxItems = 0;
		let dropped = 0;
		for (const s of shares) {
			const [sid] = await trx('share_sizes').insert({
				farm_id: farmId,
				season_id: seasonId,
				name: s.name,
				members: s.members,
				first_week: nextYearWeek(s.first_week),
				last_week: nextYearWeek(s.last_week),
				pickup_days: s.pickup_days,
				price_cents: s.price_cents
			});
			const items = await trx('box_items').where({ share_size_id: s.id }).orderBy('week');
			const seen = new Set<string>();
			for (const i of items) {
				const week = nextYearWeek(i.week);
				// W52 and W53 both land on W52: the earlier week's quantity stands, W53's is left out.
				if (seen.has(`${week}|${i.crop_id}`)) {
					dropped++;
					continue;
				}
				seen.add(`${week}|${i.crop_id}`);
				await trx('box_items').insert({
					share_size_id: sid,
					week,
					crop_id: i.crop_id,
					quantity: i.quantity,
					unit: i.unit
				});
				boxItems++;
			}
		}
		const channels = await trx('channel_demand').where({ farm_id: farmId, season_id: source.id }).orderBy('week');
		const seen = new Set<string>();
		let channelDemand = 0;
		for (const c of channels) {
			const week = nextYearWeek(c.week);
			const key = `${c.channel}|${c.crop_id}|${week}`;
			if (seen.has(key)) {
				dropped++;
				continue;
			}
			seen.add(key);
			await trx('channel_demand').insert({
				farm_id: farmId,
				season_id: seasonId,
				channel: c.channel,
				crop_id: c.crop_id,
				week,
				quantity: c.quantity
			});
			channelDemand++;
		}

		const report: CopyReport = {
			season: { id: seasonId, year, name, ...dates },
			plantings: moved.length,
			checkChanges: moved
				.filter((m) => m.change.added.length || m.change.cleared.length)
				.map(({ p, next, change }) => ({
					plantingId: p.id,
					crop: p.crop,
					variety: p.variety,
					fromField: p.field_date,
					toField: next.fieldDate,
					fromBed: p.bed_id === null ? null : (bedName.get(p.bed_id) ?? null),
					toBed: placedBy.has(String(p.id)) ? (bedName.get(Number(placedBy.get(String(p.id))!.bedId)) ?? null) : null,
					...change
				})),
			rotation: placement.warnings
				.filter((w) => w.code === 'rotation_conflict')
				.map((w) => {
					const p = plantings.find((x) => String(x.id) === w.plantingKey);
					const at = placedBy.get(w.plantingKey);
					return { crop: p?.crop ?? '', bed: at ? (bedName.get(Number(at.bedId)) ?? null) : null, message: w.message };
				}),
			unplaced: placement.unplaced.map((u) => {
				const p = plantings.find((x) => String(x.id) === u.plantingKey);
				return { crop: p?.crop ?? '', variety: p?.variety ?? '', reason: u.reason };
			}),
			week53: moved.filter((m) => isoWeekOf(m.old.fieldDate).endsWith('-W53')).length,
			demand: { shareSizes: shares.length, boxItems, channelDemand, droppedWeek53: dropped }
		};
		return { ok: true, report } as const;
	});
}
