// The growth clock: degree days and short days counted forwards from the field date (the grid),
// and the same clock walked backwards by the planner, so both give one set of dates.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	addDays,
	dayLengthHours,
	derivePlanting,
	planSuccessions,
	weeksBetween,
	type Variety
} from '../../../src/lib/planning/index';
import { demoEngineFarm, DEMO_CROPS, DEMO_VARIETIES, toEngineVariety } from '../../../db/seeds/demo-farm';
import { farm42, targetsFor, variety } from './fixtures';

const demoVariety = (name: string): Variety => {
	const v = DEMO_VARIETIES.find((x) => x.name === name)!;
	return toEngineVariety(
		v,
		DEMO_CROPS.find((c) => c.name === v.crop)!
	);
};
const rowOf = (v: Variety, fieldDate: string) => ({
	method: v.method,
	fieldDate,
	lengthFt: 10,
	rows: v.rows,
	inRowSpacingIn: v.inRowSpacingIn,
	seedsPerSpot: v.seedsPerSpot
});

// The rate the test expects per day, written out here rather than taken from the engine:
// 1 at 12 h of day and longer, 0.5 at 10 h, 0.3 at 9.2 h and shorter (common practice, no published
// source: growth slows markedly under about 10 h of day and crops maturing then take about two weeks
// longer; Coleman 2009, from memory). Day length by the CBM model (Forsythe et al. 1995).
function rate(latitude: number, date: string): number {
	const dl = dayLengthHours(latitude, date);
	return Math.min(1, Math.max(0.3, 1 - (12 - dl) / 4));
}

/** The first harvest of a field date: the day its day-length-weighted days from the field date reach `days`. */
function harvestForward(latitude: number, field: string, days: number): string {
	let acc = 0;
	let d = field;
	while (acc < days - 1e-9) {
		acc += rate(latitude, d);
		d = addDays(d, 1);
	}
	return d;
}

/**
 * The planner's field date for a first harvest on Monday `harvest`: walking back, the latest day
 * whose weighted days up to the day before reach `days`; where that one would be ready a day or two
 * before the Monday (shortening days make the clock skip), the next day, ready on or just after it.
 */
function fieldDateBack(latitude: number, harvest: string, days: number): string {
	let acc = 0;
	let d = harvest;
	while (acc < days - 1e-9) {
		d = addDays(d, -1);
		acc += rate(latitude, d);
	}
	return harvestForward(latitude, d, days) < harvest ? addDays(d, 1) : d;
}

describe('degree days walk forwards from the field date', () => {
	it('summer squash set out Sat 20 May is picked in July, not the next February', () => {
		const squash = demoVariety('Gold Baton');
		const farm = demoEngineFarm();
		// 2028-05-20 is a Saturday (ISO 8601 calendar).
		const d = derivePlanting(rowOf(squash, '2028-05-20'), squash, farm, { explain: false });
		expect(d.dtm.source).toBe('gdd');
		// Demo normals (invented): week mean = 47 − 25·cos(2π(week − 4)/52), base 50 °F. Summing
		// max(0, mean − 50) per day from 20 May (W20: 61.9 → 11.9 a day, 2 days; W21 … W27) reaches
		// 750 °F·days in the week of 10 July; the engine's exact day:
		let acc = 0;
		let day = '2028-05-20';
		const mean = (week: number) => Math.round((47 - 25 * Math.cos((2 * Math.PI * (week - 4)) / 52)) * 10) / 10;
		const isoWeekOf = (date: string) => {
			const t = new Date(`${date}T00:00:00Z`);
			const th = new Date(t);
			th.setUTCDate(t.getUTCDate() + 3 - ((t.getUTCDay() + 6) % 7));
			const jan4 = new Date(Date.UTC(th.getUTCFullYear(), 0, 4));
			return 1 + Math.round(((th.getTime() - jan4.getTime()) / 864e5 - 3 + ((jan4.getUTCDay() + 6) % 7)) / 7);
		};
		while (acc < 750) {
			acc += Math.max(0, mean(isoWeekOf(day)) - 50);
			day = addDays(day, 1);
		}
		expect(d.firstHarvest).toBe(day);
		expect(d.firstHarvest.slice(0, 7)).toBe('2028-07');
	});

	it('a frost-tender degree-day crop set out in autumn is not carried through the winter', () => {
		const squash = demoVariety('Gold Baton');
		const d = derivePlanting(rowOf(squash, '2027-10-20'), squash, demoEngineFarm(), { explain: false });
		// Four weeks or more under 50 °F lie ahead: it cannot ripen; the calendar figure stands, with a warning.
		expect(d.dtm.source).toBe('gdd_cold');
		expect(d.warnings.map((w) => w.code)).toContain('gdd_not_met');
	});
});

describe('the planner and the grid give the same dates', () => {
	const arbVariety = fc.record({
		daysToMaturity: fc.integer({ min: 20, max: 130 }),
		harvestWindowDays: fc.integer({ min: 5, max: 42 }),
		gdd: fc.option(fc.integer({ min: 300, max: 1500 }), { nil: undefined }),
		method: fc.constantFrom<'direct' | 'transplant'>('direct', 'transplant')
	});
	it('every succession: deriving from its field date gives its first and last harvest', () => {
		const temps: Record<string, number> = {};
		for (let w = 1; w <= 53; w++)
			temps[`W${String(w).padStart(2, '0')}`] = 47 - 25 * Math.cos((2 * Math.PI * (w - 4)) / 52);
		fc.assert(
			fc.property(arbVariety, fc.integer({ min: 14, max: 48 }), fc.integer({ min: 30, max: 55 }), (a, week, lat) => {
				const v = variety({
					daysToMaturity: a.daysToMaturity,
					harvestWindowDays: a.harvestWindowDays,
					method: a.method,
					...(a.method === 'transplant' ? { daysInTray: 28, cellsPerTray: 128 } : {}),
					...(a.gdd ? { gddToMaturity: a.gdd, baseTempF: 40 } : {})
				});
				const farm = { ...farm42, latitude: lat, weeklyMeanTempF: temps };
				const weeks = weeksBetween(
					`2027-W${String(week).padStart(2, '0')}`,
					`2027-W${String(week + 3).padStart(2, '0')}`
				);
				const plan = planSuccessions({ variety: v, targets: targetsFor(weeks, 5), farm });
				for (const s of plan.successions) {
					const d = derivePlanting({ ...rowOf(v, s.fieldDate), harvestDays: null }, v, farm, { explain: false });
					expect(d.firstHarvest).toBe(s.firstHarvest);
					// A harvest stopped at the last target week keeps its shorter length when derived again.
					const days = (Date.parse(s.lastHarvest) - Date.parse(s.firstHarvest)) / 864e5 + 1;
					const again = derivePlanting({ ...rowOf(v, s.fieldDate), harvestDays: days }, v, farm, { explain: false });
					expect(again.lastHarvest).toBe(s.lastHarvest);
					// Never a harvest before the field date.
					expect(s.firstHarvest > s.fieldDate).toBe(true);
				}
			}),
			{ numRuns: 150 }
		);
	});
});

describe('autumn slowdown: gradual, and sowing order never inverts', () => {
	const crop45 = variety({ daysToMaturity: 45, harvestWindowDays: 7 });
	const sowFor = (week: string, v: Variety = crop45, latitude = 42) =>
		planSuccessions({ variety: v, targets: targetsFor([week], 10), farm: { ...farm42, latitude } }).successions[0]
			.fieldDate;

	it('at 42° N a 45-day crop for W45, W46 and W47 is sown on three different days, in order', () => {
		const [w45, w46, w47] = ['2026-W45', '2026-W46', '2026-W47'].map((w) => sowFor(w));
		expect(w45 < w46 && w46 < w47).toBe(true);
		// W45 = Mon 2 Nov 2026, W46 = 9 Nov, W47 = 16 Nov: worked back day by day with the rate above.
		expect(w45).toBe(fieldDateBack(42, '2026-11-02', 45));
		expect(w46).toBe(fieldDateBack(42, '2026-11-09', 45));
		expect(w47).toBe(fieldDateBack(42, '2026-11-16', 45));
		// Short days add about two weeks by mid-November (common practice): 16 Nov at 42° N is 9.8 h.
		const extra = (Date.parse('2026-11-16') - Date.parse(w47)) / 864e5 - 45;
		expect(extra).toBeGreaterThanOrEqual(10);
		expect(extra).toBeLessThanOrEqual(18);
	});

	it('adds nothing in summer: 45 days before W27 is 45 calendar days', () => {
		// W27 2026 = Mon 29 Jun; day length over 14 h at 42° N (CBM): every day counts whole.
		expect(sowFor('2026-W27')).toBe('2026-05-15');
	});

	it('a later target week never gets an earlier sowing date (generated crops, weeks and latitudes)', () => {
		fc.assert(
			fc.property(
				fc.integer({ min: 20, max: 130 }),
				fc.integer({ min: 7, max: 28 }),
				fc.integer({ min: 20, max: 52 }),
				fc.integer({ min: 1, max: 4 }),
				fc.integer({ min: 25, max: 58 }),
				(dtm, window, week, gap, latitude) => {
					const v = variety({ daysToMaturity: dtm, harvestWindowDays: window });
					const wk = (n: number) => `2026-W${String(n).padStart(2, '0')}`;
					const later = Math.min(53, week + gap);
					expect(sowFor(wk(later), v, latitude) >= sowFor(wk(week), v, latitude)).toBe(true);
				}
			),
			{ numRuns: 300 }
		);
	});
});
