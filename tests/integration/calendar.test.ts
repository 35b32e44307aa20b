// The personal task calendar: a secret, revocable feed URL per user, read without a session and
// parsed with ical.js (a general-purpose iCalendar library, not the one that writes it).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import ICAL from 'ical.js';
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
async function fetchFeed(path: string): Promise<{ status: number; text: string; type: string | null; parsed?: Parsed }> {
	const res = await new Client().get(path, { headers: { accept: 'text/calendar' } });
	const text = await res.text();
	if (res.status !== 200) return { status: res.status, text, type: res.headers.get('content-type') };
	const cal = new ICAL.Component(ICAL.parse(text));
	return { status: 200, text, type: res.headers.get('content-type'), parsed: { cal, events: cal.getAllSubcomponents('vevent').map((v) => new ICAL.Event(v)) } };
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
		expect(events.find((e) => e.uid === `planting-${f.p.trayLettuce}-tray_sow@furrowcast`)!.summary).toBe('Sow in trays: Lettuce · Test Butterhead (East E1)');
		expect(events.find((e) => e.uid === `planting-${f.p.trayLettuce}-tray_sow@furrowcast`)!.startDate.toString()).toBe('2027-05-27');
		expect(events.find((e) => e.uid === `planting-${f.p.transplantLettuce}-transplant@furrowcast`)!.startDate.toString()).toBe('2027-05-26');
		expect(events.find((e) => e.uid === `planting-${f.p.harvestCarrot}-harvest@furrowcast`)!.startDate.toString()).toBe('2027-05-24');
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
		expect([w21.startDate.toString(), w21.endDate.toString(), w21.startDate.isDate]).toEqual(['2027-05-24', '2027-05-31', true]);
		expect(w21.description).toContain('Test box (10 members, pick-up Thu): Carrot 1.5 lb');
	});
	it('the owner feed holds only this farm: a planting of another farm never appears', async () => {
		const path = await newFeed(f.owner);
		const { events } = (await fetchFeed(path)).parsed!;
		const ours = new Set((await testDb()('plantings').where({ farm_id: f.farmId }).select('id')).map((r) => r.id as number));
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
