// The Team page: the owner changes a member's role or removes a member, and that member's sessions on
// the farm end at once; a farm always keeps an owner; an invite is committed before its mail is sent,
// and one the mail server refused shows as not sent with a Resend button.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, html, signedIn } from '../helpers/http';
import { closeTestDb, count, testDb, uniqueEmail } from '../helpers/db';
import { firstLink, waitForMail } from '../helpers/mail';
import { signUpFarm, type NewFarm } from '../helpers/transfer';
import { demo } from '../helpers/env';

afterAll(closeTestDb);

interface Member {
	client: Client;
	email: string;
	userId: string;
}

/** Invites someone to the farm in a role and accepts the invite; the member stays signed in. */
async function addMember(farm: NewFarm, role: string, tag: string): Promise<Member> {
	const email = uniqueEmail(tag);
	const sent = await farm.client.postForm('/team?/invite', { email, role });
	expect(sent.status).toBe(303);
	const link = new URL(firstLink(await waitForMail(email), '/invite/'));
	const client = new Client();
	const joined = await client.postForm(link.pathname, { name: `Member ${tag}`, password: 'member-pass-for-tests' });
	expect(joined.status).toBe(303);
	const user = await testDb()('users').where({ email }).first('id');
	return { client, email, userId: user.id };
}

const sessionsOf = (userId: string): Promise<number> => count('user_sessions', { user_id: userId });

let farm: NewFarm;
let ownerId: string;
beforeAll(async () => {
	farm = await signUpFarm('team');
	ownerId = (await testDb()('users').where({ email: farm.email }).first('id')).id;
});

describe('changing a role', () => {
	it("takes effect at once and ends the member's sessions on this farm", async () => {
		const m = await addMember(farm, 'crew_lead', 'role');
		expect((await m.client.get('/api/me')).status).toBe(200);
		expect(await sessionsOf(m.userId)).toBe(1);
		const res = await farm.client.postForm('/team?/role', { userId: m.userId, role: 'share_manager' });
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toMatch(/^\/team\?changed=/);
		expect((await testDb()('farm_members').where({ farm_id: farm.farmId, user_id: m.userId }).first('role')).role).toBe(
			'share_manager'
		);
		expect(await sessionsOf(m.userId)).toBe(0);
		expect((await m.client.get('/api/me')).status).toBe(401);
		// Signing in again gives the new role.
		const again = await signedIn(m.email, 'member-pass-for-tests');
		expect((await (await again.get('/api/me')).json()).farm.role).toBe('share_manager');
	});

	it('refuses a role that does not exist, naming it, and changes nothing', async () => {
		const m = await addMember(farm, 'crew_lead', 'badrole');
		const res = await farm.client.postForm('/team?/role', { userId: m.userId, role: 'admin' });
		expect(res.status).toBe(400);
		expect(await html(res)).toContain('Choose a role: owner, crew lead or share manager.');
		expect((await testDb()('farm_members').where({ farm_id: farm.farmId, user_id: m.userId }).first('role')).role).toBe(
			'crew_lead'
		);
		expect(await sessionsOf(m.userId)).toBe(1);
	});
});

describe('removing a member', () => {
	it('takes them off the farm and signs them out at once', async () => {
		const m = await addMember(farm, 'share_manager', 'remove');
		const res = await farm.client.postForm('/team?/remove', { userId: m.userId });
		expect(res.status).toBe(303);
		expect(await count('farm_members', { farm_id: farm.farmId, user_id: m.userId })).toBe(0);
		expect(await sessionsOf(m.userId)).toBe(0);
		expect((await m.client.get('/api/me')).status).toBe(401);
		// Their account stays; it is simply on no farm now.
		expect(await count('users', { id: m.userId })).toBe(1);
		const page = await farm.client.get('/team?removed=Member%20remove');
		expect(await html(page)).toContain('is no longer on this farm and was signed out.');
	});

	it("leaves a member's sessions on another farm alone", async () => {
		const other = await signUpFarm('team-other');
		const m = await addMember(farm, 'crew_lead', 'twofarms');
		// The same person joins a second farm through its invite (proving the account's password).
		const sent = await other.client.postForm('/team?/invite', { email: m.email, role: 'crew_lead' });
		expect(sent.status).toBe(303);
		const link = new URL(firstLink(await waitForMail(m.email), '/invite/'));
		const elsewhere = new Client();
		expect(
			(await elsewhere.postForm(link.pathname, { name: 'Member twofarms', password: 'member-pass-for-tests' })).status
		).toBe(303);
		expect((await (await elsewhere.get('/api/me')).json()).farm.id).toBe(other.farmId);

		expect((await farm.client.postForm('/team?/remove', { userId: m.userId })).status).toBe(303);
		expect((await m.client.get('/api/me')).status).toBe(401);
		expect((await elsewhere.get('/api/me')).status).toBe(200);
	});

	it('answers 404 for someone who is not on this farm, and touches nothing', async () => {
		const crew = await testDb()('users').where({ email: demo.crew }).first('id');
		const before = await count('farm_members');
		const res = await farm.client.postForm('/team?/remove', { userId: crew.id });
		expect(res.status).toBe(404);
		expect(await count('farm_members')).toBe(before);
		expect((await farm.client.postForm('/team?/role', { userId: crew.id, role: 'owner' })).status).toBe(404);
	});

	it('only the owner may change the team', async () => {
		const m = await addMember(farm, 'crew_lead', 'notowner');
		expect((await m.client.postForm('/team?/remove', { userId: ownerId })).status).toBe(403);
		expect((await m.client.postForm('/team?/role', { userId: m.userId, role: 'owner' })).status).toBe(403);
		expect((await testDb()('farm_members').where({ farm_id: farm.farmId, user_id: m.userId }).first('role')).role).toBe(
			'crew_lead'
		);
		expect((await new Client().postForm('/team?/remove', { userId: ownerId })).status).toBe(303);
		expect(await count('farm_members', { farm_id: farm.farmId, user_id: ownerId })).toBe(1);
	});
});

describe('the last owner', () => {
	it('cannot be removed or demoted; with a second owner, one may go', async () => {
		const lone = await signUpFarm('lone-owner');
		const loneId = (await testDb()('users').where({ email: lone.email }).first('id')).id;
		const remove = await lone.client.postForm('/team?/remove', { userId: loneId });
		expect(remove.status).toBe(409);
		expect(await html(remove)).toContain('A farm needs at least one owner');
		const demote = await lone.client.postForm('/team?/role', { userId: loneId, role: 'crew_lead' });
		expect(demote.status).toBe(409);
		expect((await testDb()('farm_members').where({ farm_id: lone.farmId, user_id: loneId }).first('role')).role).toBe(
			'owner'
		);

		const second = await addMember(lone, 'owner', 'second-owner');
		// Both owners demote each other at the same moment: one wins, the farm keeps an owner.
		const [a, b] = await Promise.all([
			lone.client.postForm('/team?/role', { userId: second.userId, role: 'crew_lead' }),
			second.client.postForm('/team?/role', { userId: loneId, role: 'crew_lead' })
		]);
		// The loser answers 409 (last owner), or, when its session was ended first, is sent to sign-in.
		for (const r of [a, b]) expect([303, 409]).toContain(r.status);
		expect(await count('farm_members', { farm_id: lone.farmId, role: 'owner' })).toBe(1);
	});

	it('an owner who removes themselves (not the last) is signed out and sent to sign-in', async () => {
		const f = await signUpFarm('self-remove');
		const other = await addMember(f, 'owner', 'co-owner');
		const meId = (await testDb()('users').where({ email: f.email }).first('id')).id;
		const res = await f.client.postForm('/team?/remove', { userId: meId });
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe('/signin');
		expect((await f.client.get('/api/me')).status).toBe(401);
		expect((await other.client.get('/api/me')).status).toBe(200);
	});
});

describe('invites whose mail fails', () => {
	it('keeps the invite, answers 303 (no 500), marks it not sent and offers Resend', async () => {
		const email = uniqueEmail('undeliverable');
		const res = await farm.client.postForm('/team?/invite', { email, role: 'crew_lead' });
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe(`/team?unsent=${encodeURIComponent(email)}`);
		const row = await testDb()('invites').where({ email }).first('id', 'sent_at');
		expect(row).toBeTruthy();
		expect(row.sent_at).toBeNull();
		const page = await html(await farm.client.get(res.headers.get('location')!));
		expect(page).toContain('the mail server did not take the message');
		const item = page.split('<li').find((chunk) => chunk.includes(`${email} · `));
		expect(item).toBeDefined();
		expect(item).toContain('not sent');
		expect(item).toContain('Resend');
		// Resending to the same refusing address stays not sent, still no 500.
		const again = await farm.client.postForm('/team?/resend', { id: row.id });
		expect(again.status).toBe(303);
		expect(again.headers.get('location')).toMatch(/unsent=/);
	});

	it('Resend mails a fresh link, the old one stops working, and the invite shows as sent', async () => {
		const email = uniqueEmail('resend');
		await farm.client.postForm('/team?/invite', { email, role: 'share_manager' });
		const oldLink = new URL(firstLink(await waitForMail(email), '/invite/'));
		const row = await testDb()('invites').where({ email }).first('id', 'sent_at');
		expect(row.sent_at).not.toBeNull();
		// As if the first mail had failed.
		await testDb()('invites').where({ id: row.id }).update({ sent_at: null });
		const res = await farm.client.postForm('/team?/resend', { id: row.id });
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe(`/team?sent=${encodeURIComponent(email)}`);
		expect((await testDb()('invites').where({ id: row.id }).first('sent_at')).sent_at).not.toBeNull();
		const until = Date.now() + 10_000;
		let newLink = oldLink;
		while (newLink.pathname === oldLink.pathname && Date.now() < until) {
			newLink = new URL(firstLink(await waitForMail(email), '/invite/'));
			if (newLink.pathname === oldLink.pathname) await new Promise((r) => setTimeout(r, 100));
		}
		expect(newLink.pathname).not.toBe(oldLink.pathname);
		expect(await html(await new Client().get(oldLink.pathname))).toContain('This invite link is not valid.');
		expect(
			(await new Client().postForm(newLink.pathname, { name: 'Resent Person', password: 'member-pass-for-tests' }))
				.status
		).toBe(303);
	});

	it("another farm's invite cannot be resent or withdrawn", async () => {
		const other = await signUpFarm('team-foreign');
		const email = uniqueEmail('foreign');
		await other.client.postForm('/team?/invite', { email, role: 'crew_lead' });
		const row = await testDb()('invites').where({ email }).first('id', 'token_hash');
		expect((await farm.client.postForm('/team?/resend', { id: row.id })).status).toBe(404);
		await farm.client.postForm('/team?/revoke', { id: row.id });
		expect((await testDb()('invites').where({ id: row.id }).first('token_hash')).token_hash).toBe(row.token_hash);
		expect((await farm.client.postForm('/team?/resend', { id: 'x' })).status).toBe(400);
	});
});
