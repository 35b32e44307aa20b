/**
 * Forecast benchmark: an invented bench farm with 60 crops and 5,000 plantings harvesting over
 * 40 ISO weeks (plus shares, box contents and market demand), created through /signup and the
 * database, and removed again at the end.
 *
 * - forecast.server_ms: GET /api/seasons/{id}/forecast over the 40 weeks, timed from the client
 *   (request to parsed body), in the shape the forecast page asks for (shape=series). With
 *   BENCH_FORECAST_VERBOSE set, the rows shape is timed as well, for comparison.
 * - forecast.chart_ms: headless Chromium, from the response in hand to the chart in the DOM
 *   (the page's data-render-ms), reloaded through the page's load as on
 *   the window regaining focus (`invalidate('app:plan')`).
 * - forecast.floor_ms: the same weekly sums in a plain loop over the same plantings, in memory.
 * - forecast.server_ratio: server_ms ÷ floor_ms.
 * Each is the median of several runs after a warm-up. Needs what scripts/bench.sh sets up.
 */
import { pathToFileURL } from 'node:url';
import { addDays, weekStart, weeksBetween } from '../src/lib/planning/index';
import { Client } from '../tests/helpers/http';
import { confirmedSignUp } from '../tests/helpers/signup';
import { closeTestDb, testDb, uniqueEmail } from '../tests/helpers/db';
import { launch, signIn } from '../tests/helpers/browser';
import { median, prng } from './bench-stats';

const CROPS = 60;
const PLANTINGS = 5_000;
const YEAR = 2031;
const FROM = `${YEAR}-W10`;
const TO = `${YEAR}-W49`;
const PASSWORD = 'bench-forecast-pass';

interface BenchPlanting {
	crop: number;
	first: number; // day index from the Monday of FROM
	last: number;
	perDay: number;
}

interface BenchFarm {
	email: string;
	userId: string;
	farmId: number;
	seasonId: number;
	plantings: BenchPlanting[];
}

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
const UNITS = ['lb', 'bunch', 'head', 'each'];

export async function createBenchFarm(): Promise<BenchFarm> {
	const email = uniqueEmail('bench-forecast');
	const client = new Client();
	const res = await confirmedSignUp(client, {
		name: 'Bench Planner (invented)',
		email,
		password: PASSWORD,
		farmName: 'Bench Farm (invented, removed after the bench)',
		latitude: '42',
		lastSpringFrost: `${YEAR}-05-10`,
		firstFallFrost: `${YEAR}-10-05`
	});
	if (res.status !== 303) throw new Error(`bench signup answered ${res.status}`);
	const db = testDb();
	const user = await db('users').where({ email }).first('id');
	const farmId = (await db('farm_members').where({ user_id: user.id }).first('farm_id')).farm_id as number;
	const rnd = prng(7);
	await db('crops').insert(
		Array.from({ length: CROPS }, (_, i) => ({
			farm_id: farmId,
			name: `Bench crop ${i + 1}`,
			family: FAMILIES[i % FAMILIES.length],
			harvest_unit: UNITS[i % UNITS.length],
			frost_tolerance: 'hardy',
			base_temp_f: 40
		}))
	);
	const cropIds: number[] = (await db('crops').where({ farm_id: farmId }).orderBy('id').select('id')).map((c) => c.id);
	const yields = cropIds.map(() => 1 + rnd() * 2);
	await db('varieties').insert(
		cropIds.map((id, i) => ({
			farm_id: farmId,
			crop_id: id,
			name: 'Bench variety',
			method: 'direct',
			days_to_maturity: 50,
			harvest_window_days: 21,
			yield_per_bed_foot: Math.round(yields[i] * 1000) / 1000,
			rows_per_bed: 2,
			in_row_spacing_in: 4,
			germination_rate: 0.8,
			seeds_per_gram: 500
		}))
	);
	const varietyIds: number[] = (await db('varieties').where({ farm_id: farmId }).orderBy('crop_id').select('id')).map(
		(v) => v.id
	);
	const [seasonId] = await db('seasons').insert({
		farm_id: farmId,
		year: YEAR,
		name: `${YEAR} bench season`,
		starts_on: `${YEAR}-01-01`,
		ends_on: `${YEAR}-12-31`
	});

	const monday0 = weekStart(FROM);
	const span = 40 * 7;
	const plantings: BenchPlanting[] = [];
	const rows = [];
	for (let i = 0; i < PLANTINGS; i++) {
		const c = i % CROPS;
		const first = Math.floor(rnd() * span);
		const last = Math.min(span - 1, first + 6 + Math.floor(rnd() * 22));
		const lengthFt = 10 + Math.floor(rnd() * 19) * 5;
		const yieldPerFoot = Math.round(yields[c] * 1000) / 1000;
		plantings.push({ crop: c, first, last, perDay: (lengthFt * yieldPerFoot) / (last - first + 1) });
		rows.push({
			farm_id: farmId,
			season_id: seasonId,
			variety_id: varietyIds[c],
			start_ft: 0,
			length_ft: lengthFt,
			rows: 2,
			in_row_spacing_in: 4,
			method: 'direct',
			field_date: addDays(monday0, first - 50),
			first_harvest: addDays(monday0, first),
			last_harvest: addDays(monday0, last),
			status: 'planned'
		});
	}
	for (let i = 0; i < rows.length; i += 500) await db('plantings').insert(rows.slice(i, i + 500));

	const weeks = weeksBetween(FROM, TO);
	const shares = [
		await db('share_sizes').insert({
			farm_id: farmId,
			season_id: seasonId,
			name: 'Bench full',
			members: 80,
			first_week: FROM,
			last_week: TO
		}),
		await db('share_sizes').insert({
			farm_id: farmId,
			season_id: seasonId,
			name: 'Bench half',
			members: 50,
			first_week: FROM,
			last_week: TO
		})
	].map((r) => r[0]);
	const items = [];
	for (const [s, share] of shares.entries())
		for (const [w, week] of weeks.entries())
			for (let k = 0; k < 8; k++) {
				const c = (w * 7 + k * 5 + s) % CROPS;
				items.push({ share_size_id: share, week, crop_id: cropIds[c], quantity: 1, unit: UNITS[c % UNITS.length] });
			}
	for (let i = 0; i < items.length; i += 500) await db('box_items').insert(items.slice(i, i + 500));
	const channel = weeks.flatMap((week) =>
		cropIds.map((id) => ({
			farm_id: farmId,
			season_id: seasonId,
			channel: 'market',
			crop_id: id,
			week,
			quantity: 5 + Math.floor(rnd() * 20)
		}))
	);
	for (let i = 0; i < channel.length; i += 500) await db('channel_demand').insert(channel.slice(i, i + 500));
	return { email, userId: user.id, farmId, seasonId, plantings };
}

export async function removeBenchFarm(b: BenchFarm): Promise<void> {
	const db = testDb();
	// Plantings first: their varieties are RESTRICT, so the farm's cascade cannot take them in one go.
	await db('plantings').where({ farm_id: b.farmId }).delete();
	await db('box_swaps').where({ farm_id: b.farmId }).delete();
	await db('farms').where({ id: b.farmId }).delete();
	await db('users').where({ id: b.userId }).delete();
}

/** The floor: the same weekly sums per crop in a plain loop over typed arrays. */
function plainSums(plantings: BenchPlanting[]): Float64Array {
	const sums = new Float64Array(CROPS * 40);
	for (const p of plantings) {
		for (let w = Math.floor(p.first / 7); w * 7 <= p.last; w++) {
			const days = Math.min(p.last, w * 7 + 6) - Math.max(p.first, w * 7) + 1;
			sums[p.crop * 40 + w] += days * p.perDay;
		}
	}
	return sums;
}

async function timeServer(b: BenchFarm, runs: number, shape: 'series' | 'rows' = 'series'): Promise<number> {
	const client = new Client();
	const res = await client.postForm('/signin', { email: b.email, password: PASSWORD });
	if (res.status !== 303) throw new Error(`bench sign-in answered ${res.status}`);
	const url = `/api/seasons/${b.seasonId}/forecast?from=${FROM}&to=${TO}&shape=${shape}`;
	const times: number[] = [];
	for (let i = 0; i < runs + 2; i++) {
		const t0 = performance.now();
		const r = await client.get(url);
		const body = await r.json();
		const t = performance.now() - t0;
		const per =
			shape === 'series' ? body.series?.length : new Set(body.rows?.map((x: { crop: string }) => x.crop)).size;
		if (r.status !== 200 || body.crops.length !== CROPS || per !== CROPS)
			throw new Error(`bench forecast answered ${r.status} with ${body.crops?.length} crops, ${per} with figures`);
		if (i >= 2) times.push(t);
		if (process.env.BENCH_FORECAST_VERBOSE)
			console.error(
				`# ${shape}: ${t.toFixed(1)} ms, ${(JSON.stringify(body).length / 1024).toFixed(0)} KiB, server-timing: ${r.headers.get('server-timing')}`
			);
	}
	return median(times);
}

async function timeChart(b: BenchFarm, runs: number): Promise<number> {
	const browser = await launch({ viewport: { width: 1400, height: 1000 } });
	try {
		const page = await browser.context.newPage();
		await signIn(page, b.email, PASSWORD);
		await page.goto(`/seasons/${b.seasonId}/forecast?from=${FROM}&to=${TO}`);
		const times: number[] = [];
		for (let i = 0; i < runs + 1; i++) {
			if (i > 0) await page.evaluate(() => window.dispatchEvent(new Event('focus')));
			// Wait for this run's response and its render figure.
			await page.waitForFunction(
				(n) => {
					const el = document.querySelector('[data-testid="forecast-page"]');
					return (
						Number(el?.getAttribute('data-fetches')) > n &&
						el?.getAttribute('data-render-ms') !== null &&
						el?.querySelectorAll('[data-testid="forecast-layer"]').length === 60
					);
				},
				i,
				{ timeout: 60_000 }
			);
			await page.waitForTimeout(50);
			const ms = Number(await page.getByTestId('forecast-page').getAttribute('data-render-ms'));
			if (i > 0) times.push(ms);
		}
		return median(times);
	} finally {
		await browser.close();
	}
}

export async function runForecastBench(): Promise<Record<string, number>> {
	const round = (x: number): number => Math.round(x * 100) / 100;
	const bench = await createBenchFarm();
	try {
		const serverMs = await timeServer(bench, 11);
		if (process.env.BENCH_FORECAST_VERBOSE)
			console.error(`# rows shape, median: ${(await timeServer(bench, 11, 'rows')).toFixed(1)} ms`);
		const chartMs = await timeChart(bench, 7);
		for (let i = 0; i < 5; i++) plainSums(bench.plantings);
		const floor: number[] = [];
		for (let i = 0; i < 21; i++) {
			const t0 = performance.now();
			plainSums(bench.plantings);
			floor.push(performance.now() - t0);
		}
		const floorMs = median(floor);
		return {
			'forecast.server_ms': round(serverMs),
			'forecast.chart_ms': round(chartMs),
			'forecast.floor_ms': round(floorMs),
			'forecast.server_ratio': round(serverMs / floorMs)
		};
	} finally {
		await removeBenchFarm(bench);
		await closeTestDb();
	}
}

const isMain = process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href;
if (isMain) {
	void runForecastBench().then((results) => {
		for (const [k, v] of Object.entries(results)) console.log(`${k}: ${v}`);
	});
}
