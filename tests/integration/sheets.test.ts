// The weekly crew sheets: what the page lists for a week, who may mark tasks done (and what that
// writes), bad weeks, tenancy, and the sheets by e-mail read back with exceljs and SheetJS.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import * as XLSX from 'xlsx';
import { Client, html } from '../helpers/http';
import { closeTestDb, testDb, uniqueEmail } from '../helpers/db';
import { waitForMail } from '../helpers/mail';
import { expected, makeSheetFarm, WEEK, type SheetFarm } from './sheets-fixture';
import { confirmedSignUp } from '../helpers/signup';

// Source: NIST Handbook 44, Appendix C: 1 ounce (avoirdupois) = 28.349 523 125 g exactly.
const G_PER_OZ = 28.349523125;

afterAll(closeTestDb);

let f: SheetFarm;
let sheetPath: string;
beforeAll(async () => {
	f = await makeSheetFarm();
	sheetPath = `/seasons/${f.seasonId}/week/${WEEK}`;
});

function ofFarmToday(timeZone: string): string {
	return new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(
		new Date()
	);
}

describe('the sheet of a week', () => {
	it('lists each task kind with the figures worked out by hand', async () => {
		const res = await f.crew.get(sheetPath);
		expect(res.status).toBe(200);
		// HTML whitespace is one space to a reader, however the template wraps its text.
		const page = (await html(res)).replace(/\s+/g, ' ');
		expect(page).toContain('Crew sheets · 2027-W21');
		// Mon 24 May – Sun 30 May 2027 is ISO week 21 (2027-01-04 is W01 Monday; + 20 weeks = 24 May).
		expect(page).toContain('W21 · Mon 24 May');
		expect(page).toContain('W21 · Sun 30 May');
		expect(page).toContain(`${expected.trayCells} cells · ${expected.trayTrays} trays of 72 cells`);
		// The fixture farm is imperial: seed weight in ounces (NIST Handbook 44: 1 oz = 28.349 523 125 g);
		// under a tenth of an ounce three decimals, else two. 12.57 g = 0.4434 oz.
		const oz = (g: number): string => {
			const x = g / 28.349523125;
			return String(Number(x.toFixed(x >= 0.1 ? 2 : 3)));
		};
		expect(page).toContain(`${oz(expected.trayGrams)} oz seed`);
		expect(page).toContain('9,748 seeds · 0.44 oz seed');
		expect(page).toContain(`${expected.transplantPlants} plants · 3 rows · 12 in apart`);
		expect(page).toMatch(new RegExp(`about <strong>${expected.harvestWeekLb} lb</strong> this week`));
		expect(page).toContain(`Test box ${expected.boxLb} lb (10 members × 1.5 lb)`);
		expect(page).toContain(`Market ${expected.marketLb} lb`);
		// Grouped by bed in walking order: E1 (position 1) before E2 (position 2) in the field sections.
		expect(page).toContain('East · bed E1');
		expect(page).toContain('East · bed E2');
		// Cautions that defer to the label and local rules.
		expect(page).toMatch(/Treated seed.*gloves.*food and feed.*seed label and local rules/);
		expect(page).toMatch(/Food safety.*local food-safety rules/);
		expect(page).toMatch(/Heat: .*cool hours.*water and shade/);
	});
	it('/week redirects to the current ISO week of the farm clock, within the season, or the next week with work', async () => {
		const res = await f.crew.get(`/seasons/${f.seasonId}/week`);
		expect(res.status).toBe(307);
		const today = ofFarmToday('America/Chicago');
		// The fixture season is 2027; before it starts, the sheets open on its first week: 2027-01-01 is a
		// Friday, so it belongs to ISO week 2026-W53 (ISO 8601; REFERENCES.md "ISO weeks on the 2026/27 edge").
		// That week has no work, so they open on the next week that has some, saying so: the fixture's
		// first task is a field date on Mon 15 Mar 2027, ISO week 2027-W11 (4 Jan is W01's Monday; + 70 days).
		if (today < '2027-01-01') {
			const to = res.headers.get('location');
			expect(to).toBe(`/seasons/${f.seasonId}/week/2027-W11?quiet=2026-W53`);
			const page = (await html(await f.crew.get(to!))).replace(/\s+/g, ' ');
			expect(page).toContain('Nothing to sow, plant or harvest in 2026-W53: this is the next week with work.');
			expect(page).toContain('Crew sheets · 2027-W11');
		} else expect(res.headers.get('location')).toMatch(new RegExp(`^/seasons/${f.seasonId}/week/\\d{4}-W\\d{2}`));
	});
	it('"This week" links to the week\'s crew sheets and harvest log, and to the next work when the week is empty', async () => {
		const page = (await html(await f.crew.get('/?week=2027-W21'))).replace(/\s+/g, ' ');
		expect(page).toContain(`href="/seasons/${f.seasonId}/week/2027-W21"`);
		expect(page).toContain(`href="/seasons/${f.seasonId}/harvests"`);
		// A winter week before the season: nothing to do, so it points at the first week with work
		// (field date Mon 15 Mar 2027, ISO 2027-W11, as above).
		const winter = (await html(await f.crew.get('/?week=2026-W49'))).replace(/\s+/g, ' ');
		expect(winter).toContain('Nothing to sow, plant or harvest this week. Next work:');
		expect(winter).toContain(`href="/seasons/${f.seasonId}/week/2027-W11"`);
	});
	it('answers 400 for a malformed or non-existent week and 404 for a week outside the season', async () => {
		for (const bad of ['2027-21', 'week-21', '2027-W54', '2027-W53', '2027-W00']) {
			// 2027 has 52 ISO weeks (only 2026 and 2032 have 53 around it: REFERENCES.md).
			const res = await f.crew.get(`/seasons/${f.seasonId}/week/${bad}`);
			expect(res.status, bad).toBe(400);
		}
		expect((await f.crew.get(`/seasons/${f.seasonId}/week/2028-W10`)).status).toBe(404);
		expect((await f.crew.get(`/seasons/${f.seasonId}/week/2026-W40`)).status).toBe(404);
	});
	it("another farm's season is a 404", async () => {
		const other = new Client();
		await confirmedSignUp(other, {
			name: 'Other',
			email: uniqueEmail('sheet-other'),
			password: 'sheet-test-password',
			farmName: 'Other (invented)',
			latitude: '40',
			lastSpringFrost: '2027-04-20',
			firstFallFrost: '2027-10-20'
		});
		expect((await other.get(sheetPath)).status).toBe(404);
		expect((await other.get(`${sheetPath}/sheets.xlsx`)).status).toBe(404);
	});
	it("the heat note follows the farm's normal mean for the week, on the page and in the mail", async () => {
		// Invented normals for ISO week 21. The thresholds (no note under 60 °F, a firm one from 75 °F)
		// are common practice (no published source); the note defers to local heat-safety rules.
		const setNormal = async (meanF: number | null): Promise<void> => {
			await testDb()('farm_weekly_temps').where({ farm_id: f.farmId, week_number: 21 }).delete();
			if (meanF !== null)
				await testDb()('farm_weekly_temps').insert({ farm_id: f.farmId, week_number: 21, mean_temp_f: meanF });
		};
		try {
			await setNormal(77);
			let page = await html(await f.crew.get(sheetPath));
			expect(page).toMatch(/Heat: this week&#39;s normal mean is 77 °F|Heat: this week's normal mean is 77 °F/);
			expect(page).toMatch(/signs of heat illness; follow your local heat-safety rules/);
			const to = uniqueEmail('sheet-heat');
			expect((await f.crew.postForm(`${sheetPath}?/email`, { extra: to })).status).toBe(303);
			expect((await waitForMail(to)).text).toContain("Caution: Heat: this week's normal mean is 77 °F");

			await setNormal(52);
			page = await html(await f.crew.get(sheetPath));
			expect(page).not.toMatch(/Heat:/);
			// The other cautions stay whatever the weather.
			expect(page).toMatch(/Treated seed.*gloves/);
			expect(page).toMatch(/Food safety/);

			await setNormal(66);
			page = await html(await f.crew.get(sheetPath));
			expect(page).toMatch(/Heat: .*cool hours.*water and shade/);
			expect(page).not.toMatch(/normal mean is/);
		} finally {
			await setNormal(null);
		}
	});
});

describe('marking tasks done', () => {
	const done = (
		client: Client,
		plantingId: number,
		kind: string,
		date: string,
		extra: Record<string, string | number> = {}
	) => client.postForm(`${sheetPath}?/done`, { plantingId, kind, date, ...extra });

	it('the crew lead marks a direct sowing done: status sown, actual date set, version bumped', async () => {
		const before = await testDb()('plantings').where({ id: f.p.directCarrot }).first('version', 'status');
		const res = await done(f.crew, f.p.directCarrot, 'direct_sow', '2026-11-30', {
			version: before.version,
			note: 'soil dry, watered in'
		});
		expect(res.status).toBe(303);
		const after = await testDb()('plantings').where({ id: f.p.directCarrot }).first();
		expect(before.status).toBe('planned');
		expect(after.status).toBe('sown');
		expect(after.actual_field_date).toBe('2026-11-30');
		expect(after.version).toBe(before.version + 1);
		expect(after.notes).toContain('soil dry, watered in');
	});
	it('the owner marks a transplanting and a harvest start; a stale version is refused with 409', async () => {
		const t = await testDb()('plantings').where({ id: f.p.transplantLettuce }).first('version');
		expect(
			(await done(f.owner, f.p.transplantLettuce, 'transplant', '2026-12-01', { version: t.version })).status
		).toBe(303);
		const lettuce = await testDb()('plantings').where({ id: f.p.transplantLettuce }).first();
		expect([lettuce.status, lettuce.actual_field_date]).toEqual(['transplanted', '2026-12-01']);

		const stale = await done(f.owner, f.p.harvestCarrot, 'harvest', '2026-12-01', { version: 999 });
		expect(stale.status).toBe(409);
		expect((await testDb()('plantings').where({ id: f.p.harvestCarrot }).first('status')).status).toBe('sown');
		expect((await done(f.owner, f.p.harvestCarrot, 'harvest', '2026-12-01')).status).toBe(303);
		const carrot = await testDb()('plantings').where({ id: f.p.harvestCarrot }).first();
		expect([carrot.status, carrot.actual_first_harvest]).toEqual(['harvesting', '2026-12-01']);
	});
	it('finishing a harvest sets finished and the last harvest date', async () => {
		expect((await done(f.crew, f.p.harvestCarrot, 'finish', '2026-12-01')).status).toBe(303);
		const carrot = await testDb()('plantings').where({ id: f.p.harvestCarrot }).first();
		expect([carrot.status, carrot.actual_first_harvest, carrot.actual_last_harvest]).toEqual([
			'finished',
			'2026-12-01',
			'2026-12-01'
		]);
	});
	it('a tray sowing marks the planting sown with the actual tray date', async () => {
		expect((await done(f.crew, f.p.trayLettuce, 'tray_sow', '2026-11-29')).status).toBe(303);
		const p = await testDb()('plantings').where({ id: f.p.trayLettuce }).first();
		expect([p.status, p.actual_tray_sow_date, p.actual_field_date]).toEqual(['sown', '2026-11-29', null]);
	});
	it('bad input is a 400 naming the field, and nothing is written', async () => {
		const before = await testDb()('plantings').where({ id: f.p.trayLettuce }).first('version');
		const res = await done(f.crew, f.p.trayLettuce, 'tray_sow', '2027-02-30');
		expect(res.status).toBe(400);
		expect(await html(res)).toContain('Actual date is not a real calendar date.');
		const wrongKind = await done(f.crew, f.p.trayLettuce, 'direct_sow', '2026-11-29');
		expect(wrongKind.status).toBe(400);
		expect(await html(wrongKind)).toContain('This planting is transplanted; that task does not apply.');
		expect((await done(f.crew, f.p.trayLettuce, 'plough', '2026-11-29')).status).toBe(400);
		const future = await done(f.crew, f.p.trayLettuce, 'tray_sow', '2099-01-01');
		expect(future.status).toBe(400);
		expect(await html(future)).toContain('Actual date cannot be after today');
		expect((await testDb()('plantings').where({ id: f.p.trayLettuce }).first('version')).version).toBe(before.version);
	});
	it('the share manager reads the sheet but gets 403 on marking done', async () => {
		const page = await html(await f.share.get(sheetPath));
		expect(page).toContain('Crew sheets · 2027-W21');
		expect(page).not.toContain('action="?/done"');
		const before = await testDb()('plantings').where({ id: f.p.directCarrot }).first('version');
		const res = await done(f.share, f.p.directCarrot, 'direct_sow', '2026-11-30');
		expect(res.status).toBe(403);
		expect((await testDb()('plantings').where({ id: f.p.directCarrot }).first('version')).version).toBe(before.version);
	});
	it('without a session the action is refused (sign-in redirect for a form, 401 for the API style)', async () => {
		const res = await done(new Client(), f.p.directCarrot, 'direct_sow', '2026-11-30');
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toMatch(/^\/signin/);
		// The fetch that use:enhance makes gets the same refusal as a redirect result, never a write.
		const enhanced = await new Client().request(`${sheetPath}?/done`, {
			method: 'POST',
			body: new URLSearchParams({ plantingId: String(f.p.directCarrot), kind: 'direct_sow', date: '2026-11-30' }),
			headers: {
				origin: process.env.FC_BASE_URL!,
				accept: 'application/json',
				'x-sveltekit-action': 'true',
				'content-type': 'application/x-www-form-urlencoded'
			}
		});
		expect(JSON.parse(await enhanced.text()).type).toBe('redirect');
	});
	it('a wrong tick is taken back in one step, on record; a second undo, or one after an edit, is refused', async () => {
		// A planting of its own (a copy of the W21 carrot sowing), removed again at the end.
		const { id: _id, ...copy } = await testDb()('plantings').where({ id: f.p.directCarrot }).first();
		void _id;
		const [pid] = await testDb()('plantings').insert({
			...copy,
			start_ft: 90,
			length_ft: 5,
			status: 'planned',
			actual_field_date: null,
			notes: null,
			version: 1
		});
		try {
			expect((await done(f.crew, pid, 'direct_sow', '2026-11-30', { note: 'wrong bed' })).status).toBe(303);
			const mark = await testDb()('task_marks').where({ planting_id: pid }).first();
			const page = await html(await f.crew.get(sheetPath));
			expect(page).toContain(`data-testid="undo-${pid}"`);
			expect(page).toContain(`name="markId" value="${mark.id}"`);
			// The share manager may not take it back; nor may another farm (its id is not theirs).
			expect((await f.share.postForm(`${sheetPath}?/undo`, { markId: mark.id })).status).toBe(403);
			expect((await f.crew.postForm(`${sheetPath}?/undo`, { markId: 'x' })).status).toBe(400);

			expect((await f.crew.postForm(`${sheetPath}?/undo`, { markId: mark.id })).status).toBe(303);
			const back = await testDb()('plantings').where({ id: pid }).first();
			expect([back.status, back.actual_field_date, back.notes, back.version]).toEqual(['planned', null, null, 3]);
			const kept = await testDb()('task_marks').where({ id: mark.id }).first();
			expect(kept.undone_at).not.toBeNull();
			expect(kept.undone_by).toBe(kept.marked_by);
			expect((await f.crew.postForm(`${sheetPath}?/undo`, { markId: mark.id })).status).toBe(409);

			// Ticked again, then edited in the grid: the tick can no longer be taken back.
			expect((await done(f.owner, pid, 'direct_sow', '2026-12-01')).status).toBe(303);
			const again = await testDb()('task_marks').where({ planting_id: pid }).orderBy('id', 'desc').first();
			await testDb()('plantings').where({ id: pid }).increment('version', 1);
			const res = await f.owner.postForm(`${sheetPath}?/undo`, { markId: again.id });
			expect(res.status).toBe(409);
			expect((await testDb()('plantings').where({ id: pid }).first('status')).status).toBe('sown');
		} finally {
			await testDb()('plantings').where({ id: pid }).delete();
		}
	});
	it("another farm's planting is a 404, and the demo farm's rows are untouched", async () => {
		const demoPlanting = await testDb()('plantings').whereNot({ farm_id: f.farmId }).first('id', 'version', 'status');
		const res = await done(f.crew, demoPlanting.id, 'direct_sow', '2026-11-30');
		expect(res.status).toBe(404);
		const after = await testDb()('plantings').where({ id: demoPlanting.id }).first('version', 'status');
		expect(after).toEqual({ version: demoPlanting.version, status: demoPlanting.status });
	});
});

describe('the sheets by e-mail', () => {
	it('the crew lead sends them; the mail has an HTML body and an .xlsx both readers open', async () => {
		const to = uniqueEmail('sheet-mail');
		const res = await f.crew.postForm(`${sheetPath}?/email`, { extra: to });
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe(`${sheetPath}?sent=1`);
		const mail = await waitForMail(to);
		expect(mail.subject).toContain('Crew sheets 2027-W21');
		// The week is named once, not again before each day.
		expect(mail.subject).toMatch(/^Crew sheets 2027-W21 \(Mon 24 May – Sun 30 May\) · /);
		expect(mail.html).toContain('<strong>Carrot</strong> · Test Nantes');
		// The test farm is imperial: seed in ounces. 12.57 g ÷ 28.349523125 g/oz = 0.4434 oz, shown "0.44 oz".
		// Source: NIST Handbook 44, Appendix C (1 oz = 28.349 523 125 g).
		expect(mail.html).toContain('0.44 oz seed');
		expect(mail.attachments).toHaveLength(1);
		const file = Buffer.from(mail.attachments[0].contentBase64, 'base64');
		expect(mail.attachments[0].filename).toBe('crew-sheets-2027-W21.xlsx');

		const wb = new ExcelJS.Workbook();
		await wb.xlsx.load(file as unknown as ArrayBuffer);
		// The harvest was finished above, so the week has no harvest task: no Harvest sheet, and the
		// first sheet says so.
		expect(wb.worksheets.map((w) => w.name)).toEqual(['Tray sowing', 'Direct sowing', 'Transplanting']);
		expect(wb.worksheets[0].headerFooter.oddFooter).toContain('Nothing this week for Harvest: no sheet for it.');
		// Printed: every page headed with the kind, the week and the farm; fill-in cells ruled.
		expect(wb.worksheets[1].headerFooter.oddHeader).toMatch(/Direct sowing.* · 2027-W21&C.+/);
		const direct = wb.getWorksheet('Direct sowing')!;
		expect(direct.views[0]).toMatchObject({ state: 'frozen', ySplit: 1 });
		const headers = (direct.getRow(1).values as unknown[]).slice(1);
		expect(headers).toEqual(
			expect.arrayContaining([
				'From (ft)',
				'To (ft)',
				'In-row spacing (in)',
				'Seed (oz)',
				'Seeds',
				'Actual date',
				'Notes'
			])
		);
		const col = (h: string) => headers.indexOf(h) + 1;
		const row = direct.getRow(2);
		expect(row.getCell(col('Crop')).value).toBe('Carrot');
		expect(row.getCell(col('Seeds')).value).toBe(expected.directSeeds);
		expect(row.getCell(col('Seed (oz)')).value).toBeCloseTo(expected.directGrams / G_PER_OZ, 10);
		// A real date: 25 May 2027, and the actual sowing date marked above (30 Nov 2026).
		expect(row.getCell(col('Sow on')).value).toEqual(new Date('2027-05-25T00:00:00Z'));
		expect(row.getCell(col('Actual date')).value).toEqual(new Date('2026-11-30T00:00:00Z'));

		// The second, independent reader.
		const sj = XLSX.read(file, { type: 'buffer', cellDates: true });
		expect(sj.SheetNames).toEqual(['Tray sowing', 'Direct sowing', 'Transplanting']);
		const tray = XLSX.utils.sheet_to_json<Record<string, unknown>>(sj.Sheets['Tray sowing']);
		expect(tray).toHaveLength(1);
		expect(tray[0]).toMatchObject({
			Crop: 'Lettuce',
			Variety: 'Test Butterhead',
			Cells: expected.trayCells,
			Trays: expected.trayTrays
		});
		expect(tray[0]['Seed (oz)']).toBeCloseTo(expected.trayGrams / G_PER_OZ, 10);
		const transplant = XLSX.utils.sheet_to_json<Record<string, unknown>>(sj.Sheets['Transplanting']);
		expect(transplant[0]).toMatchObject({
			'Block · bed': 'East · bed E1',
			'From (ft)': 10,
			'To (ft)': 60,
			Plants: expected.transplantPlants
		});
		expect(direct.getRow(2).getCell(col('Notes')).border?.bottom?.style).toBe('thin');
	});
	it('sends to the farm crew leads and owners when asked', async () => {
		const res = await f.owner.postForm(`${sheetPath}?/email`, { team: 'on', extra: '' });
		expect(res.status).toBe(303);
		// Two people qualify: the owner and the crew lead (the share manager does not).
		expect(res.headers.get('location')).toBe(`${sheetPath}?sent=2`);
		const mail = await waitForMail(f.emails.crew);
		expect(mail.attachments[0].filename).toBe('crew-sheets-2027-W21.xlsx');
	});
	it('a bad address is a 400 that names it; no recipients at all is a 400 too', async () => {
		const res = await f.crew.postForm(`${sheetPath}?/email`, { extra: 'ok@example.com, not-an-address' });
		expect(res.status).toBe(400);
		expect(await html(res)).toContain('not-an-address: Enter a valid e-mail address');
		const none = await f.crew.postForm(`${sheetPath}?/email`, { extra: '' });
		expect(none.status).toBe(400);
		expect(await html(none)).toContain('Choose the crew or type at least one address.');
	});
	it('the share manager may not send them', async () => {
		expect((await f.share.postForm(`${sheetPath}?/email`, { extra: uniqueEmail('nope') })).status).toBe(403);
	});
});
