// The farm's unit system everywhere: a metric copy of the demo farm shows no imperial unit label
// on any page, in any file it downloads or in the e-mail it sends, as every role; the (imperial)
// demo farm shows no metric one. Pages come from the access table, so a new page is read here
// without anyone remembering to add it.
//
// Every role reads the metric farm's pages, since a role's own view of a page (read-only cells, its
// own buttons) is drawn by code of its own. The imperial farm is the demo every other browser test
// already walks as each role, so here it is read as the owner only. Files are built on the server
// the same whatever member asks, so each farm's files are fetched once, by its owner.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import ExcelJS from 'exceljs';
import { launch, signIn, type BrowserSession, type Page } from '../helpers/browser';
import { closeTestDb, testDb } from '../helpers/db';
import { demo } from '../helpers/env';
import { waitForMailWith } from '../helpers/mail';
import { foreignUnits, type UnitSystem } from '../helpers/units';
import { accessTable, type Who } from '../integration/access-table';
import { makeAccessFixture, type AccessFixture } from '../integration/access-fixture';
import { demoUsers, ensureDemoFarm, removeDemoFarm } from '../../db/seeds/demo-farm';

const METRIC = { tag: 'metric', unitSystem: 'metric' as const };
const metricUsers = demoUsers(METRIC);

type Member = { who: Exclude<Who, 'anon' | 'other'>; email: string };
const farms: { system: UnitSystem; readers: Member[] }[] = [
	{
		system: 'metric',
		readers: [
			{ who: 'owner', email: metricUsers[0].email },
			{ who: 'crew', email: metricUsers[1].email },
			{ who: 'share', email: metricUsers[2].email }
		]
	},
	{ system: 'imperial', readers: [{ who: 'owner', email: demo.owner }] }
];

let browser: BrowserSession;
const fixtures = new Map<UnitSystem, AccessFixture>();

beforeAll(async () => {
	await ensureDemoFarm(testDb(), { reset: true, variant: METRIC });
	browser = await launch({ viewport: { width: 1280, height: 800 } });
	fixtures.set('metric', await makeAccessFixture(metricUsers[0].email));
	fixtures.set('imperial', await makeAccessFixture(demo.owner));
}, 120_000);
afterAll(async () => {
	for (const f of fixtures.values()) await f.cleanup();
	await removeDemoFarm(testDb(), METRIC);
	await closeTestDb();
	await browser?.close();
});

it('tells the labels of one system from the other', () => {
	// The checker itself must be able to fail: one label of each kind, and plain words that are not units.
	expect(foreignUnits('Length (ft)\nYield 4.5 lb\n30 in wide\n55 °F', 'metric')).toHaveLength(4);
	expect(foreignUnits('Length (m)\nYield 2 kg\n76 cm wide\n4,635 g\n13 °C', 'imperial')).toHaveLength(5);
	expect(foreignUnits('Sown in week 21, in bed 3 of the Home block; 12 bunches', 'metric')).toEqual([]);
	expect(foreignUnits('Go to the mail; 12 heads, 3 trays of 128 cells', 'imperial')).toEqual([]);
});

/** Every text a visitor reads: the rendered text, SVG chart labels, and labels given as attributes. */
async function visibleWords(page: Page): Promise<string> {
	return page.evaluate(() => {
		// The farm's own choice of unit system lists both systems by design.
		const choice = [...document.querySelectorAll<HTMLElement>('[data-unit-choice]')];
		for (const el of choice) el.style.display = 'none';
		const parts = [document.body.innerText];
		for (const el of choice) el.style.display = '';
		for (const el of document.querySelectorAll('svg text')) parts.push(el.textContent ?? '');
		for (const el of document.querySelectorAll('[aria-label], [title], [placeholder]')) {
			if (el.closest('[data-unit-choice]')) continue;
			for (const a of ['aria-label', 'title', 'placeholder']) {
				const v = el.getAttribute(a);
				if (v) parts.push(v);
			}
		}
		return parts.join('\n');
	});
}

/** Every cell of every sheet of a workbook, one line a cell. */
async function workbookText(body: Buffer): Promise<string> {
	const wb = new ExcelJS.Workbook();
	await wb.xlsx.load(body as unknown as ArrayBuffer);
	const lines: string[] = [];
	wb.eachSheet((sheet) => {
		lines.push(sheet.name);
		sheet.eachRow((row) =>
			row.eachCell((cell) => {
				const v = cell.value;
				if (v !== null && v !== undefined) lines.push(typeof v === 'object' ? JSON.stringify(v) : String(v));
				if (cell.note) lines.push(typeof cell.note === 'string' ? cell.note : JSON.stringify(cell.note));
			})
		);
	});
	return lines.join('\n');
}

describe.each(farms)('a $system farm', ({ system, readers }) => {
	async function signedInPage(email: string): Promise<Page> {
		await browser.context.clearCookies();
		const page = await browser.context.newPage();
		await signIn(page, email, demo.password);
		return page;
	}

	it.each(readers)(
		`shows only ${system} units on every page, as $who`,
		async ({ who, email }) => {
			const fixture = fixtures.get(system)!;
			const page = await signedInPage(email);
			const slips: string[] = [];

			const rows = accessTable.filter(
				(r) => r.key.endsWith(' page') && !r.key.startsWith('signout') && r.expect[who] === 200
			);
			const urls = await Promise.all(rows.map((r) => r.url(fixture, who)));
			// The pages of last season, where the harvests were logged, and this week's crew sheets.
			const past = fixture.harvestSeasonId;
			urls.push(`/seasons/${past}/harvests`, `/seasons/${past}/results`, `/seasons/${past}/week/2026-W49`);
			for (const url of urls) {
				const res = await page.goto(url, { waitUntil: 'networkidle' });
				if (!res || res.status() !== 200) {
					slips.push(`${url}: answered ${res?.status()}`);
					continue;
				}
				for (const s of foreignUnits(await visibleWords(page), system)) slips.push(`${url}: ${s}`);
			}
			await page.close();
			expect(urls.length).toBeGreaterThan(12);
			expect(slips).toEqual([]);
		},
		300_000
	);

	it(`shows only ${system} units in every file and e-mail`, async () => {
		const { email } = readers[0];
		const fixture = fixtures.get(system)!;
		const page = await signedInPage(email);
		const slips: string[] = [];
		const past = fixture.harvestSeasonId;
		const season = fixture.seasonId;
		const files = [
			`/api/seasons/${season}/export`,
			`/seasons/${season}/week/2027-W21/sheets.xlsx`,
			`/seasons/${past}/week/2026-W49/sheets.xlsx`,
			`/seasons/${season}/seeds/seed-order.csv`,
			`/api/seasons/${season}/demand/file?format=csv`,
			`/api/seasons/${season}/demand/file?format=xlsx`
		];
		for (const url of files) {
			const res = await page.request.get(url);
			if (res.status() !== 200) {
				slips.push(`${url}: answered ${res.status()}`);
				continue;
			}
			const body = await res.body();
			const text = (res.headers()['content-type'] ?? '').includes('spreadsheetml')
				? await workbookText(body)
				: body.toString('utf8');
			for (const s of foreignUnits(text, system)) slips.push(`${url}: ${s}`);
		}

		// The calendar feed, opened by this member.
		await page.goto('/calendar');
		await page.getByRole('button', { name: /feed link|new link/i }).click();
		const feed = new URL(await page.getByTestId('feed-url').inputValue()).pathname;
		const ics = await page.request.get(feed);
		expect(ics.status()).toBe(200);
		// The feed's own URL is left out: its random token may hold "0g" or "5m".
		const icsText = (await ics.text()).replace(/\r?\n[ \t]/g, '').replace(/^URL:.*$/gm, '');
		for (const s of foreignUnits(icsText, system)) slips.push(`${feed}: ${s}`);

		// The week's sheets by e-mail, sent by the owner.
		const to = `units-${system}@example.test`;
		await page.goto(`/seasons/${past}/week/2026-W49`);
		await page.getByRole('checkbox', { name: /crew leads and owners/ }).uncheck();
		await page.getByLabel('Other addresses').fill(to);
		await page.getByRole('button', { name: 'Send sheets' }).click();
		const mail = await waitForMailWith(to, 'W49');
		for (const s of foreignUnits(`${mail.subject}\n${mail.text}`, system)) slips.push(`e-mail: ${s}`);
		for (const a of mail.attachments.filter((x) => x.contentType.includes('spreadsheetml'))) {
			const text = await workbookText(Buffer.from(a.contentBase64, 'base64'));
			for (const s of foreignUnits(text, system)) slips.push(`e-mail ${a.filename}: ${s}`);
		}

		await page.close();
		expect(slips).toEqual([]);
	}, 300_000);
});
