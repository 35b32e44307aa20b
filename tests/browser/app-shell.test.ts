// The app as each demo user sees it in headless Chromium: their navigation, a 403 for a
// page that is not theirs, and the invite flow from the owner's form to the invitee's sign-up.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launch, signIn, type BrowserSession } from '../helpers/browser';
import { demo } from '../helpers/env';
import { firstLink, waitForMail } from '../helpers/mail';
import { uniqueEmail } from '../helpers/db';

let browser: BrowserSession;
beforeAll(async () => {
	browser = await launch();
});
afterAll(() => browser.close());

async function navLabels(email: string): Promise<string[]> {
	const page = await browser.context.newPage();
	await signIn(page, email, demo.password);
	const labels = await page.getByRole('navigation', { name: 'Main' }).getByRole('link').allInnerTexts();
	await page.close();
	await browser.context.clearCookies();
	return labels.map((l) => l.trim());
}

describe('navigation by role', () => {
	it('the owner sees every part, settings and team included', async () => {
		const labels = await navLabels(demo.owner);
		expect(labels).toEqual(
			expect.arrayContaining(['This week', 'Seasons', 'Crop library', 'Farm & beds', 'Team', 'Mail (dev)'])
		);
	});
	it('the crew lead sees the plan but not settings or team', async () => {
		const labels = await navLabels(demo.crew);
		expect(labels).toContain('This week');
		expect(labels).not.toContain('Farm & beds');
		expect(labels).not.toContain('Team');
	});
	it('the share manager sees the plan but not settings or team', async () => {
		const labels = await navLabels(demo.share);
		expect(labels).toContain('Seasons');
		expect(labels).not.toContain('Farm & beds');
		expect(labels).not.toContain('Mail (dev)');
	});
});

describe('pages that are not yours', () => {
	it('a crew lead opening the owner-only settings page gets 403', async () => {
		const page = await browser.context.newPage();
		await signIn(page, demo.crew, demo.password);
		const response = await page.goto('/settings');
		expect(response?.status()).toBe(403);
		await expect(page.getByTestId('error-message').innerText()).resolves.toContain("Only the farm's owner may do this");
		await page.close();
		await browser.context.clearCookies();
	});
	it('a signed-out request to an API route gets 401', async () => {
		const response = await browser.context.request.get('/api/me');
		expect(response.status()).toBe(401);
	});
});

describe('invite by e-mail', () => {
	it('the owner invites a crew lead; the invitee signs up through the mailed link with that role', async () => {
		const email = uniqueEmail('browser-invite');
		const page = await browser.context.newPage();
		await signIn(page, demo.owner, demo.password);
		await page.goto('/team');
		await page.getByLabel('E-mail').fill(email);
		await page.locator('#field-role').selectOption('crew_lead');
		await page.getByRole('button', { name: 'Send invite' }).click();
		await expect(page.getByRole('status').innerText()).resolves.toContain(`Invite sent to ${email}`);

		// The owner can also find it on the developer mail page.
		await page.goto('/dev/mail');
		await expect(page.getByTestId('mail').first().innerText()).resolves.toContain(email);
		await page.close();
		await browser.context.clearCookies();

		const link = firstLink(await waitForMail(email), '/invite/');
		const invitee = await browser.context.newPage();
		await invitee.goto(link);
		await invitee.getByLabel('Your name').fill('Invited Crew Lead');
		await invitee.getByLabel('Choose a password').fill('invited-pass-22');
		await Promise.all([
			invitee.waitForURL((u) => u.pathname === '/'),
			invitee.getByRole('button', { name: 'Join the farm' }).click()
		]);
		await expect(invitee.getByTestId('role').innerText()).resolves.toBe('Crew lead');
		await invitee.close();
		await browser.context.clearCookies();
	});
});

describe('forms show errors at the field', () => {
	it('sign-up with an empty farm name and a script tag in the name names both fields', async () => {
		const page = await browser.context.newPage();
		await page.goto('/signup');
		await page.getByLabel('Your name').fill('<script>x</script>');
		await page.getByLabel('E-mail').fill(uniqueEmail('form'));
		await page.getByLabel('Password').fill('long-enough-pass');
		await page.getByLabel('Latitude').fill('44');
		await page.getByLabel('Last spring frost').fill('2027-05-10');
		await page.getByLabel('First fall frost').fill('2027-10-05');
		await page.getByRole('button', { name: 'Create farm' }).click();
		await expect(page.locator('#field-name-error').innerText()).resolves.toContain('may not contain < or >');
		await expect(page.locator('#field-farmName-error').innerText()).resolves.toBe('Farm name is required.');
		await expect(page.locator('#field-name').getAttribute('aria-invalid')).resolves.toBe('true');
		await page.close();
	});
});
