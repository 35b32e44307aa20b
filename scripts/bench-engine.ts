/**
 * Planning-engine benchmark: plan a season (successions for every variety
 * against 30 weekly targets) and place it into beds, at base size (60
 * varieties, 200 beds of 100 ft) and at 10× (600 varieties, 2,000 beds).
 * Inputs are invented and generated deterministically. Prints the median of
 * several timed runs after warm-up, in one process, the two sizes in turns.
 *
 *   npx tsx scripts/bench-engine.ts
 */
import { pathToFileURL } from 'node:url';
import {
	type Bed,
	type Farm,
	type SeasonPlanInput,
	type SeasonVariety,
	addWeeks,
	planSeason,
	weeksBetween
} from '../src/lib/planning/index';
import { median, prng } from './bench-stats';

const FAMILIES = [
	'Apiaceae',
	'Amaranthaceae',
	'Brassicaceae',
	'Asteraceae',
	'Alliaceae',
	'Fabaceae',
	'Solanaceae',
	'Cucurbitaceae'
];

type Season = SeasonPlanInput;

export function makeSeason(varietyCount: number, bedCount: number, seed = 42): Season {
	const rnd = prng(seed);
	const pick = <T>(xs: T[]): T => xs[Math.floor(rnd() * xs.length)];
	const int = (lo: number, hi: number): number => lo + Math.floor(rnd() * (hi - lo + 1));
	const weeklyMeanTempF: Record<string, number> = {};
	for (const w of weeksBetween('2025-W40', '2026-W52')) {
		const n = Number(w.slice(6));
		// an invented 42° N normal: cold in January, about 72 °F in late July
		weeklyMeanTempF[w] = 47 - 25 * Math.cos(((n - 3) / 52) * 2 * Math.PI);
	}
	const farm: Farm = { lastSpringFrost: '2026-05-10', firstFallFrost: '2026-10-05', latitude: 42, weeklyMeanTempF };
	const varieties = Array.from({ length: varietyCount }, (_, i) => {
		const transplant = rnd() < 0.4;
		const useGdd = rnd() < 0.25;
		const variety: SeasonVariety = {
			id: `v${i}`,
			// Each variety carries its own crop's targets, so every variety is planned.
			cropId: `c${i}`,
			crop: `crop${i % Math.max(1, Math.floor(varietyCount / 2))}`,
			family: pick(FAMILIES),
			method: transplant ? 'transplant' : 'direct',
			daysToMaturity: int(25, 100),
			daysInTray: transplant ? int(21, 42) : undefined,
			cellsPerTray: transplant ? pick([72, 128, 200]) : undefined,
			harvestWindowDays: pick([7, 10, 14, 21, 28, 35]),
			yieldPerBedFoot: 0.5 + rnd() * 2,
			rows: pick([1, 2, 3, 4]),
			inRowSpacingIn: pick([1, 2, 4, 6, 12, 18]),
			seedsPerSpot: pick([1, 1, 2, 3]),
			germinationRate: 0.6 + rnd() * 0.35,
			seedsPerGram: pick([30, 250, 700, 900]),
			frostTender: rnd() < 0.3,
			heatLimitF: rnd() < 0.3 ? 70 : undefined,
			baseTempF: useGdd ? 40 : undefined,
			gddToMaturity: useGdd ? int(600, 1400) : undefined,
			seedPriceCentsPerGram: int(5, 80)
		};
		const first = addWeeks('2026-W18', int(0, 4));
		const targets = Array.from({ length: 30 }, (_, k) => ({
			crop: variety.cropId,
			week: addWeeks(first, k),
			quantity: int(5, 30)
		}));
		return { variety, targets };
	});
	const beds: Bed[] = Array.from({ length: bedCount }, (_, i) => ({ id: `bed${i}`, lengthFt: 100 }));
	const previousFamilyByBed: Record<string, string[]> = {};
	for (const b of beds) previousFamilyByBed[b.id] = [pick(FAMILIES)];
	return {
		farm,
		beds,
		previousFamilyByBed,
		varieties: varieties.map((v) => v.variety),
		targets: varieties.flatMap((v) => v.targets),
		options: { bedFootIncrement: 5, margin: 0.1, turnaroundDays: 7 }
	};
}

/** The same call the server's plan preview makes: successions, placement and seed per piece. */
function planOnce(season: Season): { placed: number; unplaced: number } {
	const plan = planSeason(season);
	const unplaced = plan.plantings.filter((p) => p.bedId === null).length;
	return { placed: plan.plantings.length - unplaced, unplaced };
}

function timed(season: Season): number {
	const t0 = performance.now();
	planOnce(season);
	return performance.now() - t0;
}

/**
 * Both sizes are timed in turns, after warming each up: 21 rounds of five base plans and one
 * 10× plan. This machine is a shared host whose speed drifts from second to second, and
 * timing one size after the other let a fast or slow spell fall on one of them only; in
 * turns, both see the same spells. The figures are the medians of each size's times.
 */
export async function runEngineBench(): Promise<Record<string, number>> {
	const round = (x: number): number => Math.round(x * 100) / 100;
	const base = makeSeason(60, 200);
	const x10 = makeSeason(600, 2000);
	// Warm-up in turns too, long enough that the compiler has settled for both sizes.
	for (let r = 0; r < 8; r++) {
		for (let i = 0; i < 5; i++) planOnce(base);
		planOnce(x10);
	}
	const baseTimes: number[] = [];
	const x10Times: number[] = [];
	for (let r = 0; r < 21; r++) {
		for (let i = 0; i < 5; i++) baseTimes.push(timed(base));
		x10Times.push(timed(x10));
	}
	const baseMs = median(baseTimes);
	const x10Ms = median(x10Times);
	return {
		'engine.plan.base_ms': round(baseMs),
		'engine.plan.x10_ms': round(x10Ms),
		'engine.plan.scale_ratio': round(x10Ms / baseMs)
	};
}

const isMain = process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href;
if (isMain) {
	if (process.env.BENCH_ENGINE_VERBOSE) {
		for (const [v, b] of [
			[60, 200],
			[600, 2000]
		]) {
			const s = planOnce(makeSeason(v, b));
			console.error(`# ${v} varieties, ${b} beds: ${s.placed} placed pieces, ${s.unplaced} unplaced`);
		}
	}
	void runEngineBench().then((results) => {
		for (const [k, v] of Object.entries(results)) console.log(`${k}: ${v}`);
	});
}
