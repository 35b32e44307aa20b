// The Team page as the owner sees it, at desk and phone width: members with their role and Remove,
// open invites with "not sent" and Resend; a role change from the page signs the member out.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { launch, signIn, type BrowserSession } from '../helpers/browser';
import { Client } from '../helpers/http';
import { closeTestDb, testDb, uniqueEmail } from '../helpers/db';
import { firstLink, waitForMail } from '../helpers/mail';
import { signUpFarm, type NewFarm } from '../helpers/transfer';

afterAll(closeTestDb);

let farm: NewFarm;
let member: Client;
let memberEmail: string;
beforeAll(async () => {
	farm = await signUpFarm('team-ui');
	memberEmail = uniqueEmail('crewui');
	await farm.client.postForm('/team?/invite', { email: memberEmail, role: 'crew_lead' });
	const link = new URL(firstLink(await waitForMail(memberEmail), '/invite/'));
	member = new Client();
	await member.postForm(link.pathname, { name: 'Robin Crewlead', password: 'member-pass-for-tests' });
	await farm.client.postForm('/team?/invite', { email: uniqueEmail('undeliverable'), role: 'share_manager' });
});

describe('Team page in Chromium', () => {
	for (const width of [1280, 390]) {
		it(`shows members and invites at ${width} px without sideways scrolling`, async () => {
			const browser: BrowserSession = await launch({ viewport: { width, height: 900 } });
			try {
				const page = await browser.context.newPage();
				await signIn(page, farm.email, 'long-enough-pass');
				await page.goto('/team');
				await expect(page.getByRole('heading', { name: 'People on this farm' }).isVisible()).resolves.toBe(true);
				await expect(page.getByLabel('Role of Robin Crewlead').inputValue()).resolves.toBe('crew_lead');
				await expect(page.getByText('not sent').isVisible()).resolves.toBe(true);
				await expect(
					page
						.getByRole('button', { name: /^Resend/ })
						.first()
						.isVisible()
				).resolves.toBe(true);
				const overflow = await page.evaluate(
					() => document.documentElement.scrollWidth - document.documentElement.clientWidth
				);
				expect(overflow).toBeLessThanOrEqual(0);
				await page.screenshot({
					path: join(process.env.FC_SCREENSHOT_DIR ?? tmpdir(), `team-${width}.png`),
					fullPage: true
				});
			} finally {
				await browser.close();
			}
		});
	}

	it('changing a role from the page signs the member out', async () => {
		const browser = await launch();
		try {
			const page = await browser.context.newPage();
			await signIn(page, farm.email, 'long-enough-pass');
			await page.goto('/team');
			await page.getByLabel('Role of Robin Crewlead').selectOption('share_manager');
			const row = page.locator('li', { has: page.getByLabel('Role of Robin Crewlead') });
			await Promise.all([page.waitForURL(/changed=/), row.getByRole('button', { name: 'Change role' }).click()]);
			await expect(
				page.getByRole('status').filter({ hasText: "Robin Crewlead's role is changed" }).isVisible()
			).resolves.toBe(true);
			const user = await testDb()('users').where({ email: memberEmail }).first('id');
			expect(
				(await testDb()('farm_members').where({ farm_id: farm.farmId, user_id: user.id }).first('role')).role
			).toBe('share_manager');
			expect((await member.get('/api/me')).status).toBe(401);
		} finally {
			await browser.close();
		}
	});
});
