// The owner edits the farm and its beds; every bad field is named and nothing is written.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, html } from '../helpers/http';
import { closeTestDb, count, testDb, uniqueEmail } from '../helpers/db';
import { confirmedSignUp } from '../helpers/signup';

afterAll(closeTestDb);

let owner: Client;
let farmId: number;
beforeAll(async () => {
	owner = new Client();
	const email = uniqueEmail('settings');
	await confirmedSignUp(owner, {
		name: 'Bed Keeper',
		email,
		password: 'long-enough-pass',
		farmName: 'Settings Farm (invented)',
		latitude: '43',
		lastSpringFrost: '2027-05-01',
		firstFallFrost: '2027-10-10'
	});
	const u = await testDb()('users').where({ email }).first('id');
	farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
});

const farmFields = {
	name: 'Settings Farm (invented)',
	timeZone: 'America/Chicago',
	latitude: '43.1',
	unitSystem: 'imperial',
	lastSpringFrost: '2027-05-03',
	firstFallFrost: '2027-10-12',
	bedFootIncrement: '10',
	turnaroundDays: '5'
};

describe('farm settings', () => {
	it('saves the farm', async () => {
		const res = await owner.postForm('/settings?/farm', farmFields);
		expect(res.status).toBe(200);
		const farm = await testDb()('farms').where({ id: farmId }).first();
		expect(farm.time_zone).toBe('America/Chicago');
		expect(farm.last_spring_frost).toBe('2027-05-03');
		expect(farm.bed_foot_increment).toBe(10);
	});

	it('saves the frost probability, the days tender crops wait after frost and the rotation look-back', async () => {
		const farm0 = await testDb()('farms').where({ id: farmId }).first();
		// A new farm starts at 50 %, 7 days (common practice: 1–2 weeks after the average last frost) and 3 years.
		expect([farm0.frost_probability_pct, farm0.tender_days_after_frost, farm0.rotation_years]).toEqual([50, 7, 3]);
		const res = await owner.postForm('/settings?/farm', {
			...farmFields,
			frostProbabilityPct: '30',
			tenderDaysAfterFrost: '14',
			rotationYears: '4'
		});
		expect(res.status).toBe(200);
		const farm = await testDb()('farms').where({ id: farmId }).first();
		expect([farm.frost_probability_pct, farm.tender_days_after_frost, farm.rotation_years]).toEqual([30, 14, 4]);
		// The settings page shows them back.
		const page = await html(await owner.get('/settings'));
		expect(page).toMatch(/name="tenderDaysAfterFrost"[^>]*value="14"|value="14"[^>]*name="tenderDaysAfterFrost"/);
	});

	it('saves the date style, and a form without one keeps it', async () => {
		expect((await owner.postForm('/settings?/farm', { ...farmFields, dateLocale: 'de-DE' })).status).toBe(200);
		expect((await testDb()('farms').where({ id: farmId }).first('date_locale')).date_locale).toBe('de-DE');
		expect((await owner.postForm('/settings?/farm', farmFields)).status).toBe(200);
		expect((await testDb()('farms').where({ id: farmId }).first('date_locale')).date_locale).toBe('de-DE');
	});

	const bad: [Record<string, string>, string, string][] = [
		[{ name: '' }, 'name', 'Farm name is required.'],
		[{ timeZone: 'Mars/Olympus' }, 'timeZone', 'Time zone must be an IANA name'],
		[{ latitude: '91' }, 'latitude', 'Latitude must be at most 66.'],
		[{ firstFallFrost: '2027-04-01' }, 'firstFallFrost', 'First fall frost must come after the last spring frost.'],
		[{ bedFootIncrement: '2.5' }, 'bedFootIncrement', 'Bed-foot increment must be a whole number.'],
		[{ name: '<b>bold</b>' }, 'name', 'Farm name may not contain'],
		[{ dateLocale: 'en_US; drop' }, 'dateLocale', 'Date style must be a locale tag'],
		[{ dateLocale: 'x'.repeat(40) }, 'dateLocale', 'Date style must be a locale tag'],
		[{ frostProbabilityPct: '95' }, 'frostProbabilityPct', 'Frost date probability must be at most 90.'],
		[
			{ tenderDaysAfterFrost: '-1' },
			'tenderDaysAfterFrost',
			'Tender crops out after the last frost must be at least 0.'
		],
		[
			{ tenderDaysAfterFrost: 'soon' },
			'tenderDaysAfterFrost',
			'Tender crops out after the last frost must be a number.'
		],
		[{ rotationYears: '2.5' }, 'rotationYears', 'Rotation look-back must be a whole number.'],
		[{ rotationYears: '0' }, 'rotationYears', 'Rotation look-back must be at least 1.']
	];
	for (const [change, field, message] of bad) {
		it(`names ${field} for ${JSON.stringify(change)} and keeps the farm as it was`, async () => {
			const before = await testDb()('farms').where({ id: farmId }).first();
			const res = await owner.postForm('/settings?/farm', { ...farmFields, ...change });
			expect(res.status).toBe(400);
			const page = await html(res);
			expect(page).toContain(`id="field-${field}-error"`);
			expect(page).toContain(message);
			expect(await testDb()('farms').where({ id: farmId }).first()).toEqual(before);
		});
	}
});

describe('blocks and beds', () => {
	it('adds a block and a bed, edits it, refuses a duplicate name and a bad length, removes it', async () => {
		expect((await owner.postForm('/settings?/addBlock', { name: 'East' })).status).toBe(303);
		const block = await testDb()('blocks').where({ farm_id: farmId, name: 'East' }).first('id');
		const add = await owner.postForm('/settings?/saveBed', {
			name: 'E1',
			blockId: block.id,
			lengthFt: '100',
			widthIn: '30',
			position: '1'
		});
		expect(add.status).toBe(303);
		const bed = await testDb()('beds').where({ farm_id: farmId, name: 'E1' }).first();
		expect(Number(bed.length_ft)).toBe(100);

		const edit = await owner.postForm('/settings?/saveBed', {
			id: bed.id,
			name: 'E1',
			blockId: block.id,
			lengthFt: '80',
			widthIn: '30',
			position: '1'
		});
		expect(edit.status).toBe(303);
		expect(Number((await testDb()('beds').where({ id: bed.id }).first('length_ft')).length_ft)).toBe(80);

		const dup = await owner.postForm('/settings?/saveBed', {
			name: 'E1',
			blockId: block.id,
			lengthFt: '50',
			widthIn: '30',
			position: '2'
		});
		expect(dup.status).toBe(400);
		expect(await html(dup)).toContain('A bed named "E1" already exists on this farm.');
		const badLength = await owner.postForm('/settings?/saveBed', {
			name: 'E2',
			blockId: block.id,
			lengthFt: 'long',
			widthIn: '30',
			position: '2'
		});
		expect(badLength.status).toBe(400);
		expect(await html(badLength)).toContain('Length (ft) must be a number.');
		expect(await count('beds', { farm_id: farmId })).toBe(1);

		expect((await owner.postForm('/settings?/deleteBed', { id: bed.id })).status).toBe(303);
		expect(await count('beds', { farm_id: farmId })).toBe(0);
	});
});
