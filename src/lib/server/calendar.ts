// Personal calendar feeds (RFC 5545, built with ical-generator): the tasks a user is responsible
// for by role, at a secret URL a calendar app polls without a session. Only the token's SHA-256
// is stored (as for invites); a new feed URL revokes the old one, and revoking answers 404.
import { plantingTasks, type TaskKind } from '$lib/plantings/tasks';
import ical, { ICalCalendarMethod } from 'ical-generator';
import { formatWeekDate, weekStart, weeksBetween } from '$lib/planning';
import type { Role } from '$lib/roles';
import { db } from './db';
import { hashToken, newToken } from './tokens';
import { todayIn } from '$lib/today';
import { plural } from '$lib/plural';
import { formatFeet, formatInches, formatNumber, formatQuantity, toDisplayFeet, type UnitSystem } from '$lib/format';

export interface FeedStatus {
	createdAt: string;
	lastFetchedAt: string | null;
}

/** Creates a feed for the user on this farm, revoking any earlier one (its choice of seasons carries over); returns the secret token. */
export async function createFeed(farmId: number, userId: string): Promise<string> {
	const { token, hash } = newToken();
	await db().transaction(async (trx) => {
		const last = await trx('calendar_feeds')
			.where({ farm_id: farmId, user_id: userId })
			.orderBy('id', 'desc')
			.first('season_ids');
		await trx('calendar_feeds')
			.where({ farm_id: farmId, user_id: userId })
			.whereNull('revoked_at')
			.update({ revoked_at: new Date() });
		await trx('calendar_feeds').insert({
			farm_id: farmId,
			user_id: userId,
			token_hash: hash,
			season_ids: last?.season_ids ?? null
		});
	});
	return token;
}

/**
 * The farm's current seasons on `today`: those running that day; between seasons, the ones still
 * to come; with none to come, the latest. Test and past seasons are left out unless chosen.
 */
export async function currentSeasonIds(farmId: number, today: string): Promise<number[]> {
	const all: { id: number; starts_on: string; ends_on: string }[] = await db()('seasons')
		.where({ farm_id: farmId })
		.orderBy('starts_on')
		.select('id', 'starts_on', 'ends_on');
	const running = all.filter((x) => x.starts_on <= today && x.ends_on >= today);
	if (running.length) return running.map((x) => x.id);
	const coming = all.filter((x) => x.starts_on > today);
	if (coming.length) return coming.map((x) => x.id);
	return all.length ? [all[all.length - 1].id] : [];
}

/** The seasons the user's open feed covers as chosen, or null for "the current ones". */
export async function chosenSeasons(farmId: number, userId: string): Promise<number[] | null> {
	const r = await db()('calendar_feeds')
		.where({ farm_id: farmId, user_id: userId })
		.orderBy('id', 'desc')
		.first('season_ids');
	if (!r?.season_ids) return null;
	try {
		const ids: unknown = JSON.parse(r.season_ids);
		return Array.isArray(ids) ? ids.filter((n): n is number => Number.isInteger(n)) : null;
	} catch {
		return null;
	}
}

/** Sets the seasons of the user's feeds on this farm (only the farm's own seasons; null = current ones). */
export async function chooseSeasons(farmId: number, userId: string, ids: number[] | null): Promise<void> {
	const own =
		ids === null
			? null
			: ((await db()('seasons').where({ farm_id: farmId }).whereIn('id', ids).pluck('id')) as number[]);
	await db()('calendar_feeds')
		.where({ farm_id: farmId, user_id: userId })
		.whereNull('revoked_at')
		.update({ season_ids: own === null ? null : JSON.stringify(own.sort((a, b) => a - b)) });
}

/** Revokes the user's feed on this farm; returns how many feeds were open. */
export async function revokeFeed(farmId: number, userId: string): Promise<number> {
	return db()('calendar_feeds')
		.where({ farm_id: farmId, user_id: userId })
		.whereNull('revoked_at')
		.update({ revoked_at: new Date() });
}

export async function feedStatus(farmId: number, userId: string): Promise<FeedStatus | null> {
	const r = await db()('calendar_feeds')
		.where({ farm_id: farmId, user_id: userId })
		.whereNull('revoked_at')
		.orderBy('id', 'desc')
		.first('created_at', 'last_fetched_at');
	if (!r) return null;
	return {
		createdAt: new Date(r.created_at).toISOString(),
		lastFetchedAt: r.last_fetched_at ? new Date(r.last_fetched_at).toISOString() : null
	};
}

export interface Feed {
	/** The seasons the feed covers (as chosen, or the current ones). */
	seasonIds?: number[];
	farmId: number;
	farmName: string;
	timeZone: string;
	/** The farm's units: lengths, spacing and harvest quantities in the events are written in them. */
	unitSystem?: UnitSystem;
	userId: string;
	role: Role;
}

/** The open feed behind a token, with the user's current role; null when unknown or revoked. */
export async function findFeed(token: string): Promise<Feed | null> {
	if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return null;
	const r = await db()('calendar_feeds as c')
		.join('farm_members as m', function () {
			this.on('m.farm_id', '=', 'c.farm_id').andOn('m.user_id', '=', 'c.user_id');
		})
		.join('farms as f', 'f.id', 'c.farm_id')
		.where('c.token_hash', hashToken(token))
		.whereNull('c.revoked_at')
		.first('c.id', 'c.farm_id', 'c.user_id', 'c.season_ids', 'm.role', 'f.name', 'f.time_zone', 'f.unit_system');
	if (!r) return null;
	let seasonIds: number[] | null = null;
	try {
		const ids: unknown = r.season_ids ? JSON.parse(r.season_ids) : null;
		if (Array.isArray(ids)) seasonIds = ids.filter((n): n is number => Number.isInteger(n));
	} catch {
		seasonIds = null;
	}
	seasonIds ??= await currentSeasonIds(r.farm_id, todayIn(r.time_zone));
	// Best effort: when a feed was last read, shown on its page; a failure here must not fail the feed.
	await db()('calendar_feeds')
		.where({ id: r.id })
		.update({ last_fetched_at: new Date() })
		.catch(() => undefined);
	return {
		farmId: r.farm_id,
		farmName: r.name,
		timeZone: r.time_zone,
		unitSystem: r.unit_system === 'metric' ? 'metric' : 'imperial',
		userId: r.user_id,
		role: r.role,
		seasonIds
	};
}

/** A calendar date as the UTC midnight ical-generator prints as a DATE value (no calendar time zone is set on purpose). */
function day(d: string): Date {
	return new Date(`${d}T00:00:00Z`);
}
function nextDay(d: string): Date {
	return new Date(day(d).getTime() + 86_400_000);
}

type Kind = TaskKind;
const byRole: Record<Role, readonly Kind[]> = {
	owner: ['tray_sow', 'direct_sow', 'transplant', 'harvest'],
	crew_lead: ['tray_sow', 'direct_sow', 'transplant', 'harvest'],
	share_manager: ['harvest']
};
const verb: Record<Kind, string> = {
	tray_sow: 'Sow in trays',
	direct_sow: 'Direct sow',
	transplant: 'Transplant',
	harvest: 'Harvest starts'
};

/** The feed's calendar as RFC 5545 text. */
export async function feedCalendar(feed: Feed, url: string): Promise<string> {
	const cal = ical({
		name: `Furrowcast tasks · ${feed.farmName}`,
		prodId: { company: 'Furrowcast', product: 'tasks', language: 'EN' },
		method: ICalCalendarMethod.PUBLISH,
		url,
		ttl: 3600,
		// Every event is an all-day DATE value, which carries no time zone; the farm's zone is
		// named for calendar apps that show "today" and reminders by it.
		x: [{ key: 'X-WR-TIMEZONE', value: feed.timeZone }]
	});
	const kinds = byRole[feed.role];
	const plantings = await db()('plantings as p')
		.join('varieties as v', 'v.id', 'p.variety_id')
		.join('crops as c', 'c.id', 'v.crop_id')
		.leftJoin('beds as b', 'b.id', 'p.bed_id')
		.leftJoin('blocks as k', 'k.id', 'b.block_id')
		.where('p.farm_id', feed.farmId)
		.whereIn('p.season_id', feed.seasonIds ?? [])
		.whereNot('p.status', 'failed')
		.orderBy('p.id')
		.select(
			'p.id',
			'p.method',
			'p.tray_sow_date',
			'p.field_date',
			'p.first_harvest',
			'p.last_harvest',
			'p.start_ft',
			'p.length_ft',
			'p.rows',
			'p.in_row_spacing_in',
			'p.expected_yield',
			'p.status',
			'p.updated_at',
			'p.version',
			'v.name as variety',
			'c.name as crop',
			'c.harvest_unit',
			'b.name as bed',
			'k.name as block'
		);
	const system = feed.unitSystem ?? 'imperial';
	for (const p of plantings) {
		const start = Number(p.start_ft);
		const end = start + Number(p.length_ft);
		const stretch = `${formatNumber(toDisplayFeet(start, system), 2)}–${formatFeet(end, system, 2)}`;
		const where = p.bed ? `${p.block} · bed ${p.bed}, ${stretch}` : 'not placed in a bed yet';
		// The one task rule (plantings/tasks.ts); a finished planting keeps its harvest in the calendar.
		const tasks = plantingTasks(
			{
				method: p.method,
				status: p.status,
				traySowDate: p.tray_sow_date,
				fieldDate: p.field_date,
				firstHarvest: p.first_harvest,
				lastHarvest: p.last_harvest
			},
			{ record: true }
		);
		for (const { kind, from: date } of tasks) {
			if (!kinds.includes(kind)) continue;
			const details =
				kind === 'harvest'
					? `Harvest window ${formatWeekDate(p.first_harvest)} to ${formatWeekDate(p.last_harvest)}; about ${formatQuantity(Number(p.expected_yield), p.harvest_unit, system)} in all.`
					: `${plural(p.rows, 'row')} at ${formatInches(Number(p.in_row_spacing_in), system)}.`;
			cal.createEvent({
				// Stable across fetches, so a calendar app updates the event instead of adding another.
				id: `planting-${p.id}-${kind}@furrowcast`,
				allDay: true,
				start: day(date),
				end: nextDay(date),
				stamp: new Date(p.updated_at),
				// Every saved change of a planting raises its version: a moved date reaches calendar apps
				// that keep an event until its SEQUENCE grows (RFC 5545 §3.8.7.4), with LAST-MODIFIED too.
				sequence: Math.max(0, Number(p.version) - 1),
				lastModified: new Date(p.updated_at),
				summary: `${verb[kind]}: ${p.crop} · ${p.variety} (${p.bed ? `${p.block} ${p.bed}` : 'no bed'})`,
				description: `${formatWeekDate(date)} · ${where}. ${details} Status: ${p.status}.`
			});
		}
	}
	if (feed.role === 'share_manager') await addShareWeeks(cal, feed.farmId, feed.seasonIds ?? [], system);
	return rfc5545(cal.toString());
}

/**
 * The calendar's own properties before its components, and a line break after the last line
 * (RFC 5545 §3.1: every content line ends with CRLF). The generator writes X- properties last.
 */
export function rfc5545(text: string): string {
	const lines = text.split(/\r\n/).filter((l, i, all) => l !== '' || i < all.length - 1);
	const tz = lines.findIndex((l) => l.startsWith('X-WR-TIMEZONE:'));
	if (tz >= 0) {
		const [line] = lines.splice(tz, 1);
		const first = lines.findIndex((l) => l.startsWith('BEGIN:V') && l !== 'BEGIN:VCALENDAR');
		lines.splice(first >= 0 ? first : lines.length - 1, 0, line);
	}
	return lines.join('\r\n') + '\r\n';
}

/** One week-long all-day event per farm-share distribution week, with each share size's box. */
async function addShareWeeks(
	cal: ReturnType<typeof ical>,
	farmId: number,
	seasonIds: number[],
	system: UnitSystem
): Promise<void> {
	const [shares, items] = await Promise.all([
		db()('share_sizes')
			.where({ farm_id: farmId })
			.whereIn('season_id', seasonIds)
			.orderBy(['season_id', 'name'])
			.select('id', 'season_id', 'name', 'members', 'first_week', 'last_week', 'pickup_days'),
		db()('box_items as i')
			.join('share_sizes as s', 's.id', 'i.share_size_id')
			.join('crops as c', 'c.id', 'i.crop_id')
			.where('s.farm_id', farmId)
			.orderBy('c.name')
			.select('i.share_size_id', 'i.week', 'c.name as crop', 'i.quantity', 'i.unit')
	]);
	const weeks = new Map<string, string[]>();
	for (const s of shares) {
		for (const week of weeksBetween(s.first_week, s.last_week)) {
			const box = items
				.filter((i) => i.share_size_id === s.id && i.week === week)
				.map((i) => `${i.crop} ${formatQuantity(Number(i.quantity), i.unit, system)}`);
			const line = `${s.name} (${s.members} members${s.pickup_days ? `, pick-up ${s.pickup_days}` : ''}): ${box.join(', ') || 'no box contents yet'}`;
			const key = `${s.season_id}|${week}`;
			weeks.set(key, [...(weeks.get(key) ?? []), line]);
		}
	}
	for (const [key, lines] of weeks) {
		const [seasonId, week] = key.split('|');
		const monday = weekStart(week);
		cal.createEvent({
			id: `share-week-${seasonId}-${week}@furrowcast`,
			allDay: true,
			start: day(monday),
			end: new Date(day(monday).getTime() + 7 * 86_400_000),
			summary: `Farm-share week ${week}`,
			description: lines.join('\n')
		});
	}
}
