/**
 * Bed timeline benchmark: an invented bench farm of 200 beds (4 blocks × 50, 100 ft each)
 * and 5,000 plantings (25 per bed: 5 strips of 20 ft × 5 slots in time), made via /signup
 * and knex, removed again afterwards. Median of several runs in one process:
 * - timeline.layout_5000_ms: layoutTimeline() alone, the plain TS module the page runs;
 * - timeline.page_5000_ms: headless Chromium, navigation to all 5,000 bars in the DOM;
 * - timeline.free_space_api_ms: GET /api/seasons/{id}/free-space over the 200 beds.
 * Assumes what scripts/bench.sh sets up (FC_BASE_URL of a running app on the test DB).
 */
import { addDays } from '../src/lib/planning/index';
import { layoutTimeline } from '../src/lib/components/timeline/layout';
import type { TimelinePlanting } from '../src/lib/timeline-types';
import { Client } from '../tests/helpers/http';
import { confirmedSignUp } from '../tests/helpers/signup';
import { closeTestDb, testDb, uniqueEmail } from '../tests/helpers/db';
import { launch, signIn } from '../tests/helpers/browser';

const FAMILIES = [
	'Apiaceae',
	'Amaranthaceae',
	'Brassicaceae',
	'Asteraceae',
	'Solanaceae',
	'Cucurbitaceae',
	'Fabaceae',
	'Amaryllidaceae'
];
const BLOCKS = 4;
const BEDS_PER_BLOCK = 50;
const STRIPS = 5;
const SLOTS = 5;

function median(xs: number[]): number {
	const s = [...xs].sort((a, b) => a - b);
	return Math.round(s[Math.floor(s.length / 2)] * 10) / 10;
}

/** Slot k of a strip: 40 days in the ground, 49 days apart, from 1 Mar 2027 (no overlaps). */
function slotDates(k: number): { field: string; last: string } {
	const field = addDays('2027-03-01', k * 49);
	return { field, last: addDays(field, 40) };
}

function benchLayout(): number {
	const beds = Array.from({ length: BLOCKS * BEDS_PER_BLOCK }, (_, i) => ({
		id: i + 1,
		blockId: Math.floor(i / BEDS_PER_BLOCK) + 1,
		name: `B${i + 1}`,
		lengthFt: 100
	}));
	const plantings: TimelinePlanting[] = [];
	for (const bed of beds)
		for (let s = 0; s < STRIPS; s++)
			for (let k = 0; k < SLOTS; k++) {
				const { field, last } = slotDates(k);
				plantings.push({
					id: plantings.length + 1,
					seasonId: 1,
					crop: 'Bench crop',
					variety: 'Bench',
					family: FAMILIES[plantings.length % FAMILIES.length],
					bedId: bed.id,
					startFt: s * 20,
					lengthFt: 20,
					method: 'transplant',
					traySowDate: addDays(field, -28),
					fieldDate: field,
					firstHarvest: addDays(field, 26),
					lastHarvest: last,
					status: 'planned'
				});
			}
	const blocks = Array.from({ length: BLOCKS }, (_, i) => ({ id: i + 1, name: `Block ${i + 1}`, position: i + 1 }));
	const times: number[] = [];
	for (let run = 0; run < 9; run++) {
		const t0 = performance.now();
		layoutTimeline({ seasonId: 1, from: '2027-01-01', to: '2027-12-31', blocks, beds, plantings, flags: {} });
		if (run >= 2) times.push(performance.now() - t0); // two warm-up runs
	}
	return median(times);
}

async function makeBenchFarm(): Promise<{ email: string; password: string; farmId: number; seasonId: number }> {
	const email = uniqueEmail('bench-timeline');
	const password = 'bench-timeline-pass';
	const res = await confirmedSignUp(new Client(), {
		name: 'Bench',
		email,
		password,
		farmName: 'Bench Rows (invented)',
		latitude: '42',
		lastSpringFrost: '2027-05-10',
		firstFallFrost: '2027-10-05'
	});
	if (res.status !== 303) throw new Error(`bench signup answered ${res.status}`);
	const db = testDb();
	const user = await db('users').where({ email }).first('id');
	const farmId: number = (await db('farm_members').where({ user_id: user.id }).first('farm_id')).farm_id;
	const [seasonId] = await db('seasons').insert({
		farm_id: farmId,
		year: 2027,
		name: '2027 bench season',
		starts_on: '2027-01-01',
		ends_on: '2027-12-31'
	});
	const varietyIds: number[] = [];
	for (const family of FAMILIES) {
		const [cropId] = await db('crops').insert({
			farm_id: farmId,
			name: `Bench ${family}`,
			family,
			harvest_unit: 'lb',
			frost_tolerance: 'hardy'
		});
		const [v] = await db('varieties').insert({
			farm_id: farmId,
			crop_id: cropId,
			name: 'Bench',
			method: 'transplant',
			days_to_maturity: 26,
			days_in_tray: 28,
			harvest_window_days: 14,
			yield_per_bed_foot: 1,
			rows_per_bed: 3,
			in_row_spacing_in: 12,
			germination_rate: 0.9,
			seeds_per_gram: 300
		});
		varietyIds.push(v);
	}
	const rows = [];
	for (let b = 0; b < BLOCKS; b++) {
		const [blockId] = await db('blocks').insert({ farm_id: farmId, name: `Bench block ${b + 1}`, position: b + 1 });
		for (let i = 0; i < BEDS_PER_BLOCK; i++) {
			const [bedId] = await db('beds').insert({
				farm_id: farmId,
				block_id: blockId,
				name: `BB${b + 1}-${i + 1}`,
				length_ft: 100,
				position: i + 1
			});
			for (let s = 0; s < STRIPS; s++)
				for (let k = 0; k < SLOTS; k++) {
					const { field, last } = slotDates(k);
					rows.push({
						farm_id: farmId,
						season_id: seasonId,
						variety_id: varietyIds[rows.length % varietyIds.length],
						bed_id: bedId,
						start_ft: s * 20,
						length_ft: 20,
						rows: 3,
						in_row_spacing_in: 12,
						method: 'transplant',
						tray_sow_date: addDays(field, -28),
						field_date: field,
						first_harvest: addDays(field, 26),
						last_harvest: last
					});
				}
		}
	}
	for (let i = 0; i < rows.length; i += 500) await db('plantings').insert(rows.slice(i, i + 500));
	return { email, password, farmId, seasonId };
}

async function removeBenchFarm(farmId: number, email: string): Promise<void> {
	// Plantings → varieties and beds → blocks are ON DELETE RESTRICT: children first.
	const db = testDb();
	await db('plantings').where({ farm_id: farmId }).delete();
	await db('varieties').where({ farm_id: farmId }).delete();
	await db('beds').where({ farm_id: farmId }).delete();
	await db('blocks').where({ farm_id: farmId }).delete();
	await db('farms').where({ id: farmId }).delete();
	await db('users').where({ email }).delete();
}

export async function runTimelineBench(): Promise<Record<string, number>> {
	const out: Record<string, number> = { 'timeline.layout_5000_ms': benchLayout() };
	const farm = await makeBenchFarm();
	const browser = await launch({ viewport: { width: 1400, height: 900 } });
	try {
		const page = await browser.context.newPage();
		await signIn(page, farm.email, farm.password);
		const pageTimes: number[] = [];
		for (let run = 0; run < 4; run++) {
			const t0 = performance.now();
			await page.goto(`/seasons/${farm.seasonId}/beds`);
			await page.waitForFunction(
				(n) => document.querySelectorAll('[data-testid="bed-bar"]').length >= n,
				BLOCKS * BEDS_PER_BLOCK * STRIPS * SLOTS,
				{ timeout: 60_000 }
			);
			if (run > 0) pageTimes.push(performance.now() - t0); // first run warms the server
		}
		out['timeline.page_5000_ms'] = median(pageTimes);
		const cookies = await browser.context.cookies();
		const client = new Client();
		for (const c of cookies) client.cookies.set(c.name, c.value);
		const apiTimes: number[] = [];
		for (let run = 0; run < 9; run++) {
			const t0 = performance.now();
			const res = await client.get(`/api/seasons/${farm.seasonId}/free-space?from=2027-W20&to=2027-W23&minFt=20`);
			if (res.status !== 200) throw new Error(`free-space answered ${res.status}`);
			await res.json();
			apiTimes.push(performance.now() - t0);
		}
		out['timeline.free_space_api_ms'] = median(apiTimes);
	} finally {
		await browser.close();
		await removeBenchFarm(farm.farmId, farm.email);
		await closeTestDb();
	}
	return out;
}
