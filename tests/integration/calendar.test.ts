// The personal task calendar: a secret, revocable feed URL per user, read without a session and
// parsed with ical.js (a general-purpose iCalendar library, not the one that writes it).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import ICAL from 'ical.js';
import ical from 'node-ical';
import { baseUrl } from '../helpers/env';
import { Client, html } from '../helpers/http';
import { closeTestDb, count, testDb } from '../helpers/db';
import { makeSheetFarm, type SheetFarm } from './sheets-fixture';

afterAll(closeTestDb);

let f: SheetFarm;
beforeAll(async () => {
	// A farm far from UTC, so a date that slipped through a time-zone conversion would show.
	f = await makeSheetFarm('Pacific/Auckland');
});

/** Makes a feed link through the page's form, as a person would, and returns its path. */
async function newFeed(client: Client): Promise<string> {
	const res = await client.postForm('/calendar?/create', {});
	expect(res.status).toBe(200);
	const m = (await html(res)).match(/value="(https?:\/\/[^"]+\/calendar\/[A-Za-z0-9_-]+\.ics)"/);
	expect(m).not.toBeNull();
	return new URL(m![1]).pathname;
}

interface Parsed {
	cal: InstanceType<typeof ICAL.Component>;
	events: InstanceType<typeof ICAL.Event>[];
}
async function fetchFeed(
	path: string
): Promise<{ status: number; text: string; type: string | null; parsed?: Parsed }> {
	const res = await new Client().get(path, { headers: { accept: 'text/calendar' } });
	const text = await res.text();
	if (res.status !== 200) return { status: res.status, text, type: res.headers.get('content-type') };
	const cal = new ICAL.Component(ICAL.parse(text));
	return {
		status: 200,
		text,
		type: res.headers.get('content-type'),
		parsed: { cal, events: cal.getAllSubcomponents('vevent').map((v) => new ICAL.Event(v)) }
	};
}

describe('the crew lead feed', () => {
	let path: string;
	beforeAll(async () => {
		path = await newFeed(f.crew);
	});

	it('is RFC 5545 text with all-day DATE events on the task dates and the farm time zone named', async () => {
		const feed = await fetchFeed(path);
		expect(feed.status).toBe(200);
		expect(feed.type).toMatch(/^text\/calendar/);
		const { cal, events } = feed.parsed!;
		expect(cal.getFirstPropertyValue('version')).toBe('2.0');
		expect(cal.getFirstPropertyValue('x-wr-timezone')).toBe('Pacific/Auckland');
		// Every event is a DATE (not DATE-TIME) value: a task day, whatever the reader's zone.
		for (const e of events) expect(e.startDate.isDate).toBe(true);
		const bySummary = (s: string) => events.find((e) => e.summary.startsWith(s));
		// The direct carrot is sown on 25 May 2027, in bed E2 of block East (fixture).
		const sow = bySummary('Direct sow: Carrot · Test Nantes (East E2)')!;
		expect(sow).toBeDefined();
		expect(sow.startDate.toString()).toBe('2027-05-25');
		expect(sow.endDate.toString()).toBe('2027-05-26');
		expect(sow.uid).toBe(`planting-${f.p.directCarrot}-direct_sow@furrowcast`);
		expect(events.find((e) => e.uid === `planting-${f.p.trayLettuce}-tray_sow@furrowcast`)!.summary).toBe(
			'Sow in trays: Lettuce · Test Butterhead (East E1)'
		);
		expect(events.find((e) => e.uid === `planting-${f.p.trayLettuce}-tray_sow@furrowcast`)!.startDate.toString()).toBe(
			'2027-05-27'
		);
		expect(
			events.find((e) => e.uid === `planting-${f.p.transplantLettuce}-transplant@furrowcast`)!.startDate.toString()
		).toBe('2027-05-26');
		expect(events.find((e) => e.uid === `planting-${f.p.harvestCarrot}-harvest@furrowcast`)!.startDate.toString()).toBe(
			'2027-05-24'
		);
		// Four plantings: 2 direct (sow + harvest each) and 2 transplants (trays + transplant + harvest) = 10 events.
		expect(events).toHaveLength(10);
	});
	it('keeps its UIDs across fetches', async () => {
		const a = (await fetchFeed(path)).parsed!.events.map((e) => e.uid).sort();
		const b = (await fetchFeed(path)).parsed!.events.map((e) => e.uid).sort();
		expect(a.length).toBeGreaterThan(0);
		expect(b).toEqual(a);
	});
	it('stores only a hash of the token', async () => {
		const token = path.slice('/calendar/'.length, -'.ics'.length);
		expect(await count('calendar_feeds', { token_hash: token })).toBe(0);
		expect(await count('calendar_feeds', { farm_id: f.farmId })).toBeGreaterThan(0);
	});
	it('a new link revokes the old one; revoking answers 404 from then on', async () => {
		const second = await newFeed(f.crew);
		expect((await fetchFeed(path)).status).toBe(404);
		expect((await fetchFeed(second)).status).toBe(200);
		const res = await f.crew.postForm('/calendar?/revoke', {});
		expect(res.status).toBe(303);
		expect((await fetchFeed(second)).status).toBe(404);
		expect(await html(await f.crew.get('/calendar?revoked=1'))).toContain('Your feed link is revoked');
	});
	it('an unknown token is a 404, a malformed one too', async () => {
		expect((await fetchFeed('/calendar/AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA.ics')).status).toBe(404);
		expect((await fetchFeed('/calendar/x.ics')).status).toBe(404);
	});
});

describe('feeds by role and farm', () => {
	it('the share manager gets harvests and distribution weeks, not sowing or transplanting', async () => {
		const path = await newFeed(f.share);
		const { events } = (await fetchFeed(path)).parsed!;
		expect(events.some((e) => /^(Direct sow|Sow in trays|Transplant):/.test(e.summary))).toBe(false);
		expect(events.filter((e) => e.summary.startsWith('Harvest starts:'))).toHaveLength(4);
		// The fixture's share size runs 2027-W20 to 2027-W30: 11 distribution weeks, each a week-long all-day event.
		const weeks = events.filter((e) => e.summary.startsWith('Farm-share week'));
		expect(weeks).toHaveLength(11);
		const w21 = weeks.find((e) => e.summary === 'Farm-share week 2027-W21')!;
		// ISO 2027-W21 runs Mon 24 May to Sun 30 May; DTEND is exclusive, so the Monday after.
		expect([w21.startDate.toString(), w21.endDate.toString(), w21.startDate.isDate]).toEqual([
			'2027-05-24',
			'2027-05-31',
			true
		]);
		expect(w21.description).toContain('Test box (10 members, pick-up Thu): Carrot 1.5 lb');
	});
	it('the owner feed holds only this farm: a planting of another farm never appears', async () => {
		const path = await newFeed(f.owner);
		const { events } = (await fetchFeed(path)).parsed!;
		const ours = new Set(
			(await testDb()('plantings').where({ farm_id: f.farmId }).select('id')).map((r) => r.id as number)
		);
		for (const e of events) expect(ours.has(Number(/^planting-(\d+)-/.exec(e.uid)![1]))).toBe(true);
		expect(events).toHaveLength(10);
	});
	it('a person removed from the farm loses the feed', async () => {
		const path = await newFeed(f.share);
		const user = await testDb()('users').where({ email: f.emails.share }).first('id');
		await testDb()('farm_members').where({ farm_id: f.farmId, user_id: user.id }).update({ role: 'crew_lead' });
		// Role changes show at once: now the sowing tasks are theirs.
		expect((await fetchFeed(path)).parsed!.events.some((e) => e.summary.startsWith('Direct sow:'))).toBe(true);
		await testDb()('farm_members').where({ farm_id: f.farmId, user_id: user.id }).delete();
		expect((await fetchFeed(path)).status).toBe(404);
	});
	it('the feed page needs a session', async () => {
		const res = await new Client().get('/calendar');
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe('/signin?next=%2Fcalendar');
	});
});

describe('the feed as a second, independent reader sees it (node-ical)', () => {
	let path: string;
	beforeAll(async () => {
		path = await newFeed(f.owner);
	});

	it('names the time zone before the events and ends with CRLF (RFC 5545 §3.1, §3.4)', async () => {
		const { text } = await fetchFeed(path);
		// Source: RFC 5545 §3.1 — each content line is terminated by CRLF, the last one included.
		expect(text.endsWith('END:VCALENDAR\r\n')).toBe(true);
		expect(text.replace(/\r\n/g, '')).not.toMatch(/[\r\n]/);
		const tz = text.indexOf('X-WR-TIMEZONE:Pacific/Auckland');
		expect(tz).toBeGreaterThan(0);
		expect(tz).toBeLessThan(text.indexOf('BEGIN:VEVENT'));
		const parsed = ical.sync.parseICS(text);
		const events = Object.values(parsed).filter((c) => c?.type === 'VEVENT');
		expect(events.length).toBe(10);
	});

	it('a moved field date raises SEQUENCE and LAST-MODIFIED, so calendar apps take the new date', async () => {
		const read = async () => {
			const parsed = ical.sync.parseICS((await fetchFeed(path)).text);
			return parsed[`planting-${f.p.directCarrot}-direct_sow@furrowcast`] as ical.VEvent;
		};
		const before = await read();
		const p = await testDb()('plantings').where({ id: f.p.directCarrot }).first('version');
		const res = await f.owner.json(`/api/plantings/${f.p.directCarrot}`, 'PATCH', {
			version: p.version,
			fieldDate: '2027-05-27'
		});
		expect(res.status).toBe(200);
		const after = await read();
		expect(new Date(after.start).toISOString().slice(0, 10)).toBe('2027-05-27');
		expect(Number(after.sequence)).toBeGreaterThan(Number(before.sequence ?? 0));
		expect(after.lastmodified).toBeDefined();
	});

	it('covers the current seasons by default; a past test season comes in only when chosen', async () => {
		const [old] = await testDb()('seasons').insert({
			farm_id: f.farmId,
			year: 2019,
			name: 'Trial 2019',
			starts_on: '2019-01-01',
			ends_on: '2019-12-31'
		});
		const one = await testDb()('plantings').where({ id: f.p.directCarrot }).first();
		const [oldPlanting] = await testDb()('plantings').insert({
			...one,
			id: undefined,
			season_id: old,
			field_date: '2019-05-01',
			first_harvest: '2019-07-01',
			last_harvest: '2019-07-14',
			version: 1
		});
		const uid = `planting-${oldPlanting}-direct_sow@furrowcast`;
		expect(ical.sync.parseICS((await fetchFeed(path)).text)[uid]).toBeUndefined();
		const body = new URLSearchParams([
			['season', String(old)],
			['season', String(f.seasonId)]
		]);
		const res = await f.owner.request('/calendar?/seasons', {
			method: 'POST',
			body,
			headers: { origin: baseUrl(), accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded' }
		});
		expect(res.status).toBe(303);
		expect(ical.sync.parseICS((await fetchFeed(path)).text)[uid]).toBeDefined();
		// Back to "the current seasons": the trial season leaves the feed again.
		await f.owner.postForm('/calendar?/seasons', { current: 'on' });
		expect(ical.sync.parseICS((await fetchFeed(path)).text)[uid]).toBeUndefined();
	});
});
