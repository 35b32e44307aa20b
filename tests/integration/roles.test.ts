// Roles and tenancy are enforced on the server: no session gets 401 (API) or a redirect
// to sign-in (pages); a wrong role gets 403; another farm's rows stay out of reach.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, signedIn, html } from '../helpers/http';
import { closeTestDb, testDb, uniqueEmail } from '../helpers/db';
import { demo } from '../helpers/env';
import { confirmedSignUp } from '../helpers/signup';

afterAll(closeTestDb);

let demoSeasonId: number;
beforeAll(async () => {
	const owner = await testDb()('users').where({ email: demo.owner }).first('id');
	const m = await testDb()('farm_members').where({ user_id: owner.id }).first('farm_id');
	demoSeasonId = (await testDb()('seasons').where({ farm_id: m.farm_id }).orderBy('year', 'desc').first('id')).id;
});

describe('without a session', () => {
	for (const path of ['/api/me', `/api/seasons/1/plantings`]) {
		it(`GET ${path} answers 401`, async () => {
			const res = await new Client().get(path);
			expect(res.status).toBe(401);
			expect((await res.json()).message).toMatch(/Sign in first/);
		});
	}
	for (const path of ['/', '/settings', '/team', '/seasons', '/crops']) {
		it(`page ${path} redirects to sign-in`, async () => {
			const res = await new Client().get(path);
			expect(res.status).toBe(303);
			expect(res.headers.get('location')).toBe(`/signin?next=${encodeURIComponent(path)}`);
		});
	}
	it('a form action cannot be posted either', async () => {
		const res = await new Client().postForm('/settings?/farm', { name: 'Hijacked' });
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toMatch(/^\/signin/);
	});
});

describe('owner-only pages and actions', () => {
	for (const who of [demo.crew, demo.share]) {
		for (const path of ['/settings', '/team', '/dev/mail']) {
			it(`${who} gets 403 on ${path}`, async () => {
				const res = await (await signedIn(who, demo.password)).get(path);
				expect(res.status).toBe(403);
				expect(await html(res)).toContain("Only the farm's owner may do this");
			});
		}
		it(`${who} cannot post the farm settings form`, async () => {
			const client = await signedIn(who, demo.password);
			const before = await testDb()('farms as f')
				.join('farm_members as m', 'm.farm_id', 'f.id')
				.join('users as u', 'u.id', 'm.user_id')
				.where('u.email', who)
				.first('f.name');
			const res = await client.postForm('/settings?/farm', { name: 'Renamed by the wrong role' });
			expect(res.status).toBe(403);
			const after = await testDb()('farms as f')
				.join('farm_members as m', 'm.farm_id', 'f.id')
				.join('users as u', 'u.id', 'm.user_id')
				.where('u.email', who)
				.first('f.name');
			expect(after.name).toBe(before.name);
		});
	}
	it('the owner opens them', async () => {
		const client = await signedIn(demo.owner, demo.password);
		for (const path of ['/settings', '/team', '/dev/mail']) expect((await client.get(path)).status).toBe(200);
	});
});

describe('tenancy', () => {
	it("a user of another farm never sees the demo farm's season or plantings", async () => {
		const email = uniqueEmail('tenant');
		const other = new Client();
		const res = await confirmedSignUp(other, {
			name: 'Other Grower',
			email,
			password: 'long-enough-pass',
			farmName: 'Other Farm (invented)',
			latitude: '40',
			lastSpringFrost: '2027-04-20',
			firstFallFrost: '2027-10-20'
		});
		expect(res.status).toBe(303);
		expect((await other.get(`/api/seasons/${demoSeasonId}/plantings`)).status).toBe(404);
		expect((await other.get(`/seasons/${demoSeasonId}`)).status).toBe(404);
		const crops = await html(await other.get('/crops'));
		const demoCrop = await testDb()('crops as c')
			.join('seasons as s', 's.farm_id', 'c.farm_id')
			.where('s.id', demoSeasonId)
			.first('c.name');
		expect(crops).not.toContain(`<strong>${demoCrop.name}</strong>`);
		const overview = await html(await other.get('/?week=2027-W30'));
		expect(overview).toContain('Nothing to harvest this week.');

		// The demo owner does see them.
		const owner = await signedIn(demo.owner, demo.password);
		const own = await owner.get(`/api/seasons/${demoSeasonId}/plantings`);
		expect(own.status).toBe(200);
		expect((await own.json()).plantings.length).toBeGreaterThan(0);
	});

	it("an owner cannot edit or delete another farm's bed", async () => {
		const demoBed = await testDb()('beds as b')
			.join('seasons as s', 's.farm_id', 'b.farm_id')
			.where('s.id', demoSeasonId)
			.first('b.id', 'b.name', 'b.block_id');
		const other = new Client();
		await confirmedSignUp(other, {
			name: 'Third Grower',
			email: uniqueEmail('tenant2'),
			password: 'long-enough-pass',
			farmName: 'Third Farm (invented)',
			latitude: '40',
			lastSpringFrost: '2027-04-20',
			firstFallFrost: '2027-10-20'
		});
		const del = await other.postForm('/settings?/deleteBed', { id: demoBed.id });
		expect(del.status).toBe(404);
		const edit = await other.postForm('/settings?/saveBed', {
			id: demoBed.id,
			name: 'Taken',
			blockId: demoBed.block_id,
			lengthFt: 10,
			widthIn: 30,
			position: 0
		});
		expect(edit.status).toBe(400);
		expect(await html(edit)).toContain("Choose one of this farm's blocks.");
		expect((await testDb()('beds').where({ id: demoBed.id }).first('name')).name).toBe(demoBed.name);
	});
});
