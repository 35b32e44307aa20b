// Real headless Chromium from Debian, driven by playwright-core. Never a downloaded browser.
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { baseUrl } from './env';

export const chromiumFlags = [
	'--headless',
	'--no-sandbox',
	'--disable-gpu',
	'--disable-background-networking',
	'--disable-component-update',
	'--disable-sync',
	'--no-first-run',
	'--disable-quic'
];

export interface BrowserSession {
	context: BrowserContext;
	close(): Promise<void>;
}

/** A fresh Chromium with its own empty user-data folder, removed again on close. */
export async function launch(options: { viewport?: { width: number; height: number } } = {}): Promise<BrowserSession> {
	const userDataDir = mkdtempSync(join(tmpdir(), 'fc-chromium-'));
	const context = await chromium.launchPersistentContext(userDataDir, {
		executablePath: process.env.FC_CHROMIUM ?? '/usr/bin/chromium',
		headless: true,
		args: chromiumFlags,
		baseURL: baseUrl(),
		viewport: options.viewport ?? { width: 1280, height: 900 }
	});
	return {
		context,
		async close() {
			await context.close();
			rmSync(userDataDir, { recursive: true, force: true });
		}
	};
}

export async function signIn(page: Page, email: string, password: string): Promise<void> {
	await page.goto('/signin');
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(password);
	await Promise.all([
		page.waitForURL((url) => !url.pathname.startsWith('/signin')),
		page.getByRole('button', { name: 'Sign in' }).click()
	]);
}

/**
 * After the sign-up form said "check your e-mail": in demo mode (as the tests run) the page links to the
 * sign-up mail; open it, follow the mailed link and press the confirmation's button, landing on /setup.
 */
export async function confirmSignUpByMail(page: Page): Promise<void> {
	// Every wait is bounded, so a sign-up that stalls names its step instead of using up the test's time.
	const step = { timeout: 15_000 };
	await page.getByRole('link', { name: 'Read the sign-up mail here' }).click(step);
	await page.waitForURL('**/signup/mail', step);
	const link = page.locator('a[href*="/signup/confirm/"]').first();
	// The mail leaves just after the answer: look again until it is there (20 s at most).
	const until = Date.now() + 20_000;
	while ((await link.count()) === 0 && Date.now() < until) {
		await page.waitForTimeout(200);
		await page.reload();
	}
	if ((await link.count()) === 0) throw new Error(`no sign-up mail reached ${page.url()} within 20 s`);
	await link.click(step);
	await page.waitForURL('**/signup/confirm/*', step);
	await Promise.all([
		page.waitForURL('**/setup', step),
		page.getByRole('button', { name: 'Create the farm and sign in' }).click(step)
	]);
}

/** Pastes text into the planting grid as a spreadsheet's clipboard would (a paste event with text/plain). */
export async function pasteIntoGrid(page: Page, text: string): Promise<void> {
	await page.getByTestId('grid').evaluate((el, t) => {
		const data = new DataTransfer();
		data.setData('text/plain', t);
		el.dispatchEvent(new ClipboardEvent('paste', { clipboardData: data, bubbles: true, cancelable: true }));
	}, text);
}

export type { Browser, BrowserContext, Page };
