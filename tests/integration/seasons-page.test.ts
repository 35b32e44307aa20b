// The seasons page: create an empty season, copy one into the next year, rename, archive; each
// season shows its year, its planting count, and whether its plan is older than its demand.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, html, signedIn } from '../helpers/http';
import { closeTestDb, count, testDb, uniqueEmail } from '../helpers/db';
import { demo } from '../helpers/env';
import { confirmedSignUp } from '../helpers/signup';

afterAll(closeTestDb);

let owner: Client;
let farmId: number;
beforeAll(async () => {
	owner = new Client();
	const email = uniqueEmail('seasons');
	await confirmedSignUp(owner, {
		name: 'Season Keeper',
		email,
		password: 'long-enough-pass',
		farmName: 'Seasons Farm (invented)',
		latitude: '42',
		lastSpringFrost: '2027-05-10',
		firstFallFrost: '2027-10-05'
	});
	const u = await testDb()('users').where({ email }).first('id');
	farmId = (await testDb()('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
});

async function seasonOf(year: number) {
	return testDb()('seasons').where({ farm_id: farmId, year }).first();
}

describe('seasons page', () => {
	it('says there is no season yet, and creates an empty one', async () => {
		expect(await html(await owner.get('/seasons'))).toContain('No season yet.');
		const res = await owner.postForm('/seasons?/create', { year: '2027', name: '2027 season' });
		expect(res.status).toBe(303);
		const s = await seasonOf(2027);
		expect(res.headers.get('location')).toBe(`/seasons/${s.id}`);
		expect(s.starts_on).toBe('2027-01-01');
		expect(s.ends_on).toBe('2027-12-31');
		expect(await count('plantings', { season_id: s.id })).toBe(0);
	});

	it('names the field of a bad season and writes nothing', async () => {
		const before = await count('seasons', { farm_id: farmId });
		for (const [fields, id, message, status] of [
			[{ year: '27', name: 'x' }, 'season-year-error', 'Year must be at least 2000.', 400],
			[{ year: '2028', name: '' }, 'season-name-error', 'Season name is required.', 400],
			[{ year: '2027', name: 'Again' }, 'season-year-error', 'This farm already has a 2027 season.', 409]
		] as const) {
			const res = await owner.postForm('/seasons?/create', fields);
			expect(res.status).toBe(status);
			const page = await html(res);
			expect(page).toContain(`id="${id}"`);
			expect(page).toContain(message);
		}
		expect(await count('seasons', { farm_id: farmId })).toBe(before);
	});

	it('copies a season into the next year with its plantings (the existing copy)', async () => {
		const s = await seasonOf(2027);
		await testDb()('blocks').insert({ farm_id: farmId, name: 'Copy block', position: 1 });
		const block = await testDb()('blocks').where({ farm_id: farmId, name: 'Copy block' }).first('id');
		await testDb()('beds').insert({
			farm_id: farmId,
			block_id: block.id,
			name: 'C1',
			length_ft: 100,
			width_in: 30,
			position: 1
		});
		await testDb()('crops').insert({
			farm_id: farmId,
			name: 'Radish',
			family: 'Brassicaceae',
			harvest_unit: 'bunch',
			frost_tolerance: 'hardy'
		});
		const crop = await testDb()('crops').where({ farm_id: farmId, name: 'Radish' }).first('id');
		const [varietyId] = await testDb()('varieties').insert({
			farm_id: farmId,
			crop_id: crop.id,
			name: 'Radish, round',
			method: 'direct',
			days_to_maturity: 25,
			harvest_window_days: 7,
			yield_per_bed_foot: 4,
			rows_per_bed: 4,
			in_row_spacing_in: 1,
			germination_rate: 0.85,
			seeds_per_gram: 88
		});
		await testDb()('plantings').insert(
			[0, 1].map((i) => ({
				farm_id: farmId,
				season_id: s.id,
				variety_id: varietyId,
				length_ft: 20,
				rows: 4,
				in_row_spacing_in: 1,
				method: 'direct',
				field_date: `2027-04-0${5 + i}`,
				first_harvest: '2027-05-03',
				last_harvest: '2027-05-09'
			}))
		);
		const res = await owner.postForm('/seasons?/copy', { from: String(s.id) });
		expect(res.status).toBe(303);
		const next = await seasonOf(2028);
		expect(res.headers.get('location')).toBe(`/seasons/${next.id}`);
		expect(await count('plantings', { season_id: next.id })).toBe(2);
		// A second copy would mix two plans in 2028: refused at the field, nothing written.
		const again = await owner.postForm('/seasons?/copy', { from: String(s.id) });
		expect(again.status).toBe(409);
		expect(await html(again)).toContain('already has a 2028 season');
		expect(await count('seasons', { farm_id: farmId })).toBe(2);
	});

	it('shows each season with its year and planting count', async () => {
		const page = await html(await owner.get('/seasons'));
		expect(page).toMatch(/2027 · 2 plantings/);
		expect(page).toMatch(/2028 · 2 plantings/);
	});

	it('renames a season; an empty name is named and changes nothing', async () => {
		const s = await seasonOf(2027);
		const res = await owner.postForm('/seasons?/rename', { id: String(s.id), name: 'Home farm 2027' });
		expect(res.status).toBe(200);
		expect((await seasonOf(2027)).name).toBe('Home farm 2027');
		const bad = await owner.postForm('/seasons?/rename', { id: String(s.id), name: '   ' });
		expect(bad.status).toBe(400);
		expect(await html(bad)).toContain(`id="rename-${s.id}-error"`);
		expect((await seasonOf(2027)).name).toBe('Home farm 2027');
	});

	it('archives a season out of the season list and brings it back', async () => {
		const s = await seasonOf(2028);
		expect((await owner.postForm('/seasons?/archive', { id: String(s.id) })).status).toBe(303);
		expect((await seasonOf(2028)).archived_at).not.toBeNull();
		const page = await html(await owner.get('/seasons'));
		expect(page).toContain('Archived seasons');
		// Still readable: archiving hides, it does not delete.
		expect((await owner.get(`/seasons/${s.id}`)).status).toBe(200);
		expect((await owner.postForm('/seasons?/restore', { id: String(s.id) })).status).toBe(303);
		expect((await seasonOf(2028)).archived_at).toBeNull();
	});

	it('flags a plan older than its demand, and clears the flag when a plan is applied', async () => {
		const s = await seasonOf(2027);
		const radish = await testDb()('crops').where({ farm_id: farmId, name: 'Radish' }).first('id');
		// A plan applied to the demand as it stands (none yet): up to date.
		expect((await owner.json(`/api/seasons/${s.id}/plan/apply`, 'POST', {})).status).toBe(200);
		let page = await html(await owner.get('/seasons'));
		expect(page).not.toContain('data-testid="plan-stale"');
		// Demand changes through the demand API: a share size and what goes in its box.
		const add = await owner.json(`/api/seasons/${s.id}/demand/share-sizes`, 'POST', {
			name: 'Full',
			members: 10,
			firstWeek: '2027-W24',
			lastWeek: '2027-W30',
			price: '0'
		});
		expect(add.status).toBeLessThan(300);
		const share = await testDb()('share_sizes').where({ season_id: s.id, name: 'Full' }).first('id');
		const cells = await owner.json(`/api/seasons/${s.id}/demand/cells`, 'PATCH', {
			grid: `share:${share.id}`,
			cells: [{ crop: radish.id, week: '2027-W25', quantity: 1, unit: 'bunch' }]
		});
		expect(cells.status).toBe(200);
		expect((await seasonOf(2027)).demand_changed_at).not.toBeNull();
		page = await html(await owner.get('/seasons'));
		expect(page).toContain('data-testid="plan-stale"');

		expect((await owner.json(`/api/seasons/${s.id}/plan/apply`, 'POST', {})).status).toBe(200);
		page = await html(await owner.get('/seasons'));
		const card = page.slice(page.indexOf('Home farm 2027'), page.indexOf('Home farm 2027') + 1500);
		expect(card).not.toContain('plan-stale');
		expect(card).toContain('Plan up to date with demand.');
	});

	it('lets only the owner change seasons (403), others read the page', async () => {
		const crew = await signedIn(demo.crew, demo.password);
		const page = await html(await crew.get('/seasons'));
		expect(page).toContain('Seasons');
		expect(page).not.toContain('?/create');
		const before = await count('seasons');
		expect((await crew.postForm('/seasons?/create', { year: '2040', name: 'Crew season' })).status).toBe(403);
		const share = await signedIn(demo.share, demo.password);
		const demoSeason = await testDb()('seasons as s')
			.join('farm_members as m', 'm.farm_id', 's.farm_id')
			.join('users as u', 'u.id', 'm.user_id')
			.where('u.email', demo.share)
			.first('s.id', 's.name');
		expect(
			(await share.postForm('/seasons?/rename', { id: String(demoSeason.id), name: 'Share renamed' })).status
		).toBe(403);
		expect((await share.postForm('/seasons?/archive', { id: String(demoSeason.id) })).status).toBe(403);
		expect(await count('seasons')).toBe(before);
		expect((await testDb()('seasons').where({ id: demoSeason.id }).first('name')).name).toBe(demoSeason.name);
	});

	it("answers 404 when the owner of another farm renames or archives this farm's season", async () => {
		const s = await seasonOf(2027);
		const stranger = await signedIn(demo.owner, demo.password);
		expect((await stranger.postForm('/seasons?/rename', { id: String(s.id), name: 'Taken' })).status).toBe(404);
		expect((await stranger.postForm('/seasons?/archive', { id: String(s.id) })).status).toBe(404);
		expect((await seasonOf(2027)).name).toBe('Home farm 2027');
		expect((await seasonOf(2027)).archived_at).toBeNull();
	});
});
