// The crew sheets in headless Chromium: printed to PDF on A4 and Letter (one page per task kind,
// navigation and forms left off the paper), and a task marked done from a phone-sized screen.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launch, signIn, type BrowserSession } from '../helpers/browser';
import { closeTestDb, testDb } from '../helpers/db';
import { makeSheetFarm, PASSWORD, WEEK, type SheetFarm } from '../integration/sheets-fixture';

let f: SheetFarm;
let path: string;
beforeAll(async () => {
	f = await makeSheetFarm();
	path = `/seasons/${f.seasonId}/week/${WEEK}`;
});
afterAll(closeTestDb);

/** Pages of a PDF: each page object says "/Type /Page" (the page tree says "/Pages"). */
function pdfPages(pdf: Buffer): number {
	return (pdf.toString('latin1').match(/\/Type\s*\/Page(?![a-z])/g) ?? []).length;
}

/** Width and height in points of the first page. */
function mediaBox(pdf: Buffer): [number, number] {
	const m = /\/MediaBox\s*\[\s*([\d.]+)\s+([\d.]+)\s+([\d.]+)\s+([\d.]+)\s*\]/.exec(pdf.toString('latin1'));
	if (!m) throw new Error('no MediaBox in the PDF');
	return [Number(m[3]) - Number(m[1]), Number(m[4]) - Number(m[2])];
}

describe('printing the sheets', () => {
	let browser: BrowserSession;
	beforeAll(async () => {
		browser = await launch();
	});
	afterAll(() => browser.close());

	it('prints one page per task kind on A4 and on Letter, without navigation or forms', async () => {
		const page = await browser.context.newPage();
		await signIn(page, f.emails.crew, PASSWORD);
		await page.goto(path);
		await expect(page.getByTestId('sheet-heading').innerText()).resolves.toBe('Crew sheets · 2027-W21');
		await expect(page.getByRole('button', { name: 'Print' }).isVisible()).resolves.toBe(true);

		await page.emulateMedia({ media: 'print' });
		// On paper: no main navigation, no season tabs, no done or e-mail forms; blank lines instead.
		await expect(page.getByRole('navigation', { name: 'Main' }).isVisible()).resolves.toBe(false);
		await expect(page.getByRole('button', { name: 'Print' }).isVisible()).resolves.toBe(false);
		await expect(page.getByRole('button', { name: /^Sown — Carrot/ }).isVisible()).resolves.toBe(false);
		await expect(page.getByRole('button', { name: 'Send sheets' }).isVisible()).resolves.toBe(false);
		await expect(page.locator('.print-only').first().isVisible()).resolves.toBe(true);
		// Black and white: section text is printed black.
		await expect(page.getByTestId('section-harvest').evaluate((el) => getComputedStyle(el).color)).resolves.toBe(
			'rgb(0, 0, 0)'
		);

		// The fixture has one task of each kind in W21 (tray, direct, transplant, harvest): four short
		// sections, each starting on a new page, so exactly four pages on either paper size.
		const a4 = await page.pdf({ format: 'A4' });
		const letter = await page.pdf({ format: 'Letter' });
		expect(pdfPages(a4)).toBe(4);
		expect(pdfPages(letter)).toBe(4);
		// The two paper sizes differ: A4 is 595 × 842 pt, Letter 612 × 792 pt (ISO 216; ANSI/ASME Y14.1).
		const [aw, ah] = mediaBox(a4);
		const [lw, lh] = mediaBox(letter);
		expect(Math.abs(aw - 595)).toBeLessThan(2);
		expect(Math.abs(ah - 842)).toBeLessThan(2);
		expect(Math.abs(lw - 612)).toBeLessThan(2);
		expect(Math.abs(lh - 792)).toBeLessThan(2);
		await page.close();
		await browser.context.clearCookies();
	});

	it('a busy week of the demo season: every printed page names its task kind and week, and empty kinds print no page', async () => {
		// 2027-W34 of the invented demo farm: late-summer harvests across many beds run over several pages.
		const demoSeason = (
			await testDb()('seasons as s')
				.join('farms as f', 'f.id', 's.farm_id')
				.where('s.year', 2027)
				.orderBy('s.id')
				.first('s.id')
		).id;
		const page = await browser.context.newPage();
		await signIn(page, 'crew@demo.furrowcast.test', 'demo-harvest-2027');
		await page.goto(`/seasons/${demoSeason}/week/2027-W34`);
		await page.emulateMedia({ media: 'print' });
		const counts = await page.locator('[data-testid^="section-"]').evaluateAll((els) =>
			els.map((el) => ({
				kind: el.getAttribute('data-testid')!.slice(8),
				title: el.querySelector('h2')!.textContent!.split('·')[0].trim(),
				empty: el.classList.contains('empty')
			}))
		);
		const pdf = await page.pdf({ format: 'Letter' });
		await page.close();
		await browser.context.clearCookies();
		const pages = pdfText(pdf);
		expect(pages.length).toBeGreaterThan(counts.filter((c) => !c.empty).length);
		// Source: pdftotext (poppler-utils) reads the printed PDF, page by page.
		const titles = counts.filter((c) => !c.empty).map((c) => `${c.title} · 2027-W34`);
		for (const [i, text] of pages.entries()) {
			expect(
				titles.some((t) => text.includes(t)),
				`page ${i + 1} names its kind and week:\n${text.slice(0, 300)}`
			).toBe(true);
		}
		// Each busy kind starts a page of its own; a kind with no tasks takes none and page 1 says so.
		for (const c of counts) {
			const printed = pages.filter((t) => t.includes(`${c.title} · 2027-W34`)).length;
			if (c.empty) expect(printed).toBe(0);
			else expect(printed).toBeGreaterThan(0);
		}
		const empty = counts.filter((c) => c.empty).map((c) => c.title);
		if (empty.length) expect(pages[0]).toContain(`Nothing this week for ${empty.join(', ')}`);
		// The harvest sheet has a blank for the quantity picked.
		// (pdftotext may set the header's two words on two lines of a narrow column.)
		expect(pages.some((t) => /Picked\s[\s\S]{0,200}\(qty\)/.test(t))).toBe(true);
	});
});

/** Text of each page of a PDF, with Debian's pdftotext (poppler-utils). */
function pdfText(pdf: Buffer): string[] {
	const dir = mkdtempSync(join(tmpdir(), 'fc-print-'));
	const file = join(dir, 'sheets.pdf');
	writeFileSync(file, pdf);
	const text = execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
	return text.split('\f').filter((t) => t.trim() !== '');
}

describe('marking a task done on a phone', () => {
	let phone: BrowserSession;
	beforeAll(async () => {
		phone = await launch({ viewport: { width: 390, height: 844 } });
	});
	afterAll(() => phone.close());

	it('the crew lead taps "Sown" on a 390 × 844 screen; the planting is sown with today as its date', async () => {
		const page = await phone.context.newPage();
		await signIn(page, f.emails.crew, PASSWORD);
		await page.goto(path);
		const button = page.getByRole('button', { name: /^Sown — Carrot Test Nantes/ });
		const box = await button.boundingBox();
		// Large targets for a thumb: at least 44 × 44 CSS px (WCAG 2.1 success criterion 2.5.5).
		expect(box!.height).toBeGreaterThanOrEqual(44);
		expect(box!.width).toBeGreaterThanOrEqual(44);
		// The page fits the phone: nothing pushes it wider than the screen.
		await expect(page.evaluate(() => document.documentElement.scrollWidth)).resolves.toBeLessThanOrEqual(390);

		const today = new Intl.DateTimeFormat('en-CA', {
			timeZone: 'America/Chicago',
			year: 'numeric',
			month: '2-digit',
			day: '2-digit'
		}).format(new Date());
		const row = page.getByTestId(`task-direct_sow-${f.p.directCarrot}`);
		await expect(row.getByLabel('Actual date').inputValue()).resolves.toBe(today);
		await button.click();
		await row.getByTestId('done-on').waitFor();
		const p = await testDb()('plantings')
			.where({ id: f.p.directCarrot })
			.first('status', 'actual_field_date', 'version');
		expect(p).toEqual({ status: 'sown', actual_field_date: today, version: 2 });
		await expect(row.getByTestId('done-on').innerText()).resolves.toContain('status sown');
		await page.close();
	});
	it('the share manager sees the sheet without done buttons', async () => {
		const page = await phone.context.newPage();
		await phone.context.clearCookies();
		await signIn(page, f.emails.share, PASSWORD);
		await page.goto(path);
		await expect(page.getByTestId('sheet-heading').isVisible()).resolves.toBe(true);
		await expect(page.getByRole('button', { name: /^Sown/ }).count()).resolves.toBe(0);
		await page.close();
	});
});
