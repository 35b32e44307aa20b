import { describe, expect, it } from 'vitest';
import {
	PlanningInputError,
	dayLengthHours,
	daysBetween,
	explainBedFeet,
	explainDates,
	explainPlanting,
	forecast,
	planSuccessions,
	seedsPerOzToPerGram,
	weeksBetween
} from '../../../src/lib/planning/index';
import { farm42, targetsFor, variety } from './fixtures';

const carrot = variety({
	id: 'carrot',
	crop: 'carrot',
	family: 'Apiaceae',
	// Source: University of Illinois Extension vegetable guide: carrot 65–75 days to maturity
	daysToMaturity: 70,
	harvestWindowDays: 14,
	yieldPerBedFoot: 1.5,
	rows: 4,
	// common practice (no published source): two seeds an inch, thinned to one
	inRowSpacingIn: 1,
	seedsPerSpot: 2,
	// common practice (no published source): 60–70 % germination is good for carrots
	germinationRate: 0.65,
	// Source: University of Illinois Extension vegetable guide: 18,000–25,000 seeds/oz → 22,000
	seedsPerGram: seedsPerOzToPerGram(22_000)
});

describe('planSuccessions: carrots, 40 lb a week for 6 weeks', () => {
	const plan = planSuccessions({
		variety: carrot,
		targets: targetsFor(weeksBetween('2026-W27', '2026-W32'), 40),
		farm: farm42,
		options: { bedFootIncrement: 5, margin: 0.1 }
	});

	it('makes one succession per two weeks (each covers the 14 days of its window; the next starts when it ends)', () => {
		// Candidate starts are every week; net sizing leaves the second week of each window to the
		// succession already harvesting then, so a new one starts every second week.
		expect(plan.intervalWeeks).toBe(1);
		expect(plan.successions.map((s) => s.weeks)).toEqual([
			['2026-W27', '2026-W28'],
			['2026-W29', '2026-W30'],
			['2026-W31', '2026-W32']
		]);
		expect(plan.shortfall).toEqual([]);
		expect(plan.warnings).toEqual([]);
	});

	it('sizes each at 60 bed-feet', () => {
		// weekly yield per bed-foot = 1.5 lb ÷ (14 ÷ 7) = 0.75 lb
		// bed-feet = 40 ÷ 0.75 × 1.1 = 58.67 → up to the 5 ft increment = 60; weekly yield 60 × 0.75 = 45 lb
		for (const s of plan.successions) {
			expect(s.bedFeet).toBe(60);
			expect(s.weeklyYield).toBe(45);
			expect(s.totalYield).toBe(90);
		}
	});

	it('works the dates backwards from the Monday of the first week', () => {
		const [first, second] = plan.successions;
		// 2026-W01 starts Mon 29 Dec 2025; W27 = 29 Dec + 26 × 7 = 182 days → Mon 29 Jun 2026
		expect(first.firstHarvest).toBe('2026-06-29');
		// sowing = 29 Jun − 70 days: 28 days back to 1 Jun, 31 more to 1 May, 11 more → 20 Apr
		expect(first.fieldDate).toBe('2026-04-20');
		// last harvest = 29 Jun + 14 − 1 = 12 Jul
		expect(first.lastHarvest).toBe('2026-07-12');
		// common practice (no published source): successions two weeks apart
		expect(daysBetween(first.fieldDate, second.fieldDate)).toBe(14);
		// W29 = Mon 13 Jul − 70 d = 4 May; W31 = Mon 27 Jul − 70 d = 18 May
		expect(plan.successions.map((s) => [s.fieldDate, s.firstHarvest, s.lastHarvest])).toEqual([
			['2026-04-20', '2026-06-29', '2026-07-12'],
			['2026-05-04', '2026-07-13', '2026-07-26'],
			['2026-05-18', '2026-07-27', '2026-08-09']
		]);
		expect(first.traySowDate).toBeUndefined();
	});

	it('works out the seed', () => {
		// spots = 60 ft × 12 in ÷ 1 in = 720 per row × 4 rows = 2,880
		// seeds = ceil(2,880 × 2 ÷ 0.65 × 1.1) = ceil(9,747.69) = 9,748
		// grams = 9,748 ÷ (22,000 ÷ 28.349523125 = 776.0271 per g) = 12.5614 → 12.57 g
		for (const s of plan.successions)
			expect(s.seed).toMatchObject({ spots: 2880, seeds: 9748, grams: 12.57, cells: 0, trays: 0 });
	});

	it('forecasts 45 lb each week against the 40 lb target', () => {
		// 60 ft × 1.5 lb ÷ 14 days × 7 days = 45 lb in every week of every window; 45 − 40 = 5 lb surplus
		const targets = targetsFor(weeksBetween('2026-W27', '2026-W32'), 40).map((t) => ({ ...t, crop: 'carrot' }));
		const rows = forecast(
			plan.successions.map((s) => ({ ...s, crop: 'carrot' })),
			targets
		);
		expect(rows.map((r) => r.week)).toEqual(weeksBetween('2026-W27', '2026-W32'));
		for (const r of rows) {
			expect(r.supply).toBeCloseTo(45, 9);
			expect(r.surplus).toBeCloseTo(5, 9);
			expect(r.shortfall).toBe(0);
		}
	});

	it('explains the figures it reached', () => {
		const s = plan.successions[0];
		const feet = explainBedFeet(s);
		expect(feet.find((x) => x.label === 'bed-feet')).toMatchObject({ value: 60, unit: 'ft' });
		expect(feet.find((x) => x.label === 'bed-feet before rounding')?.value).toBe(58.667);
		const dates = explainDates(s);
		expect(dates[0]).toMatchObject({ label: 'first harvest', value: 'W27 · Mon 29 Jun' });
		expect(dates.find((x) => x.label === 'sowing date')).toMatchObject({
			value: 'W17 · Mon 20 Apr',
			formula: 'first harvest − 70 days'
		});
		const all = explainPlanting(s, carrot);
		expect(all.find((x) => x.label === 'seeds')?.value).toBe(9748);
	});
});

describe('planSuccessions: transplants', () => {
	it('sets tray sowing before the transplant date, one succession a week', () => {
		const lettuce = variety({
			method: 'transplant',
			daysToMaturity: 45,
			daysInTray: 28,
			harvestWindowDays: 7,
			yieldPerBedFoot: 2,
			rows: 3,
			inRowSpacingIn: 12,
			germinationRate: 0.9,
			cellsPerTray: 128,
			seedsPerGram: seedsPerOzToPerGram(25_000)
		});
		const plan = planSuccessions({
			variety: lettuce,
			targets: targetsFor(['2026-W20', '2026-W21', '2026-W22'], 100),
			farm: farm42,
			options: { bedFootIncrement: 5, margin: 0.1, seedMargin: 0.1 }
		});
		expect(plan.successions).toHaveLength(3);
		const s = plan.successions[0];
		// W20 = Mon 11 May 2026; transplant = 11 May − 45 d = 27 Mar; tray = 27 Mar − 28 d = 27 Feb (Feb 2026 has 28 days)
		expect(s).toMatchObject({
			firstHarvest: '2026-05-11',
			fieldDate: '2026-03-27',
			traySowDate: '2026-02-27',
			lastHarvest: '2026-05-17'
		});
		// weekly yield per ft = 2 ÷ (7 ÷ 7) = 2; bed-feet = 100 ÷ 2 × 1.1 = 55 (exactly, despite 55.000000000000007 in floating point)
		expect(s.bedFeet).toBe(55);
		// plants = 55 × 3 = 165; cells = ceil(165 ÷ 0.9 × 1.1) = ceil(201.67) = 202; trays = ceil(202 ÷ 128) = 2
		expect(s.seed).toMatchObject({ plants: 165, cells: 202, trays: 2, seeds: 202 });
		expect(explainDates(s).find((x) => x.label === 'tray sowing')?.formula).toBe('transplant date − 28 days in tray');
	});
});

describe('planSuccessions: frost', () => {
	const bean = (frostTender: boolean) =>
		variety({ crop: 'bean', frostTender, daysToMaturity: 55, harvestWindowDays: 14 });
	const targets = targetsFor(['2026-W22', '2026-W30', '2026-W40'], 20);

	it('never puts a tender crop out before the last spring frost, and warns when it harvests after the first fall frost', () => {
		const plan = planSuccessions({ variety: bean(true), targets, farm: farm42 });
		// W22 = 25 May would need a field date of 25 May − 55 d = 31 Mar, before the 10 May last frost:
		// the planner does not sow it then; W22 is reported unreachable and short.
		expect(plan.shortfall.map((s) => s.week)).toEqual(['2026-W22']);
		expect(plan.warnings.map((w) => w.code)).toEqual(['unreachable_week']);
		expect(plan.successions.every((s) => s.fieldDate >= '2026-05-10')).toBe(true);
		const codes = plan.successions.map((s) => s.warnings.map((w) => w.code));
		// W30 = 20 Jul; field 26 May, harvest to 2 Aug: clear of both frosts
		expect(plan.successions[0].fieldDate).toBe('2026-05-26');
		expect(codes[0]).toEqual([]);
		// W40 = 28 Sep; the harvest would run to 28 Sep + 13 = 11 Oct, after the 5 Oct first fall frost,
		// but ends with the last target week (Sun 4 Oct) — and still warns of the frost only if past it.
		expect(plan.successions[1].lastHarvest).toBe('2026-10-04');
	});

	it('does not warn for a frost-hardy crop on the same dates', () => {
		const plan = planSuccessions({ variety: bean(false), targets, farm: farm42 });
		expect(plan.successions.flatMap((s) => s.warnings)).toEqual([]);
	});
});

describe('planSuccessions: short days', () => {
	// common practice (no published source): crops maturing in autumn's short days take about two weeks longer.
	// The engine spreads that over the autumn: a day counts 1 at 12 h of daylight and longer, 0.5 at
	// 10 h, 0.3 at 9.2 h and shorter (see growth-clock.test.ts for the day-by-day arithmetic).
	// A one-week window, so the one target week has one possible start.
	const spinach = variety({ crop: 'spinach', daysToMaturity: 45, harvestWindowDays: 7 });

	it.each([42, 45])('takes about two weeks longer for a crop maturing in mid-November at %i° N', (latitude) => {
		// Source: Forsythe et al. (1995) CBM model — day length on 16 Nov is under 10 h at 42–45° N
		expect(dayLengthHours(latitude, '2026-11-16')).toBeLessThan(10);
		const plan = planSuccessions({
			variety: spinach,
			targets: targetsFor(['2026-W47'], 10),
			farm: { ...farm42, latitude }
		});
		const s = plan.successions[0];
		expect(s.firstHarvest).toBe('2026-11-16');
		const days = daysBetween(s.fieldDate, s.firstHarvest);
		expect(s.basis.dtm).toMatchObject({ source: 'short_day', days, allowanceDays: days - 45 });
		// common practice: "about two weeks" — between 10 and 20 days more than the packet's 45
		expect(days - 45).toBeGreaterThanOrEqual(10);
		expect(days - 45).toBeLessThanOrEqual(20);
		expect(explainDates(s).find((x) => x.label === 'short-day allowance')?.value).toBe(days - 45);
	});

	it('adds nothing in summer, and a higher threshold slows the autumn more', () => {
		const summer = planSuccessions({ variety: spinach, targets: targetsFor(['2026-W27'], 10), farm: farm42 });
		expect(summer.successions[0].basis.dtm).toMatchObject({ source: 'variety', days: 45 });
		// 26 Oct at 42° N: about 10.66 h; the 45 days before it run from 11.9 h down to 10.7 h
		const oct = (shortDayThresholdHours?: number) =>
			planSuccessions({
				variety: spinach,
				targets: targetsFor(['2026-W44'], 10),
				farm: farm42,
				options: { shortDayThresholdHours }
			}).successions[0].basis.dtm.days;
		expect(oct()).toBeGreaterThan(45);
		expect(oct(11)).toBeGreaterThan(oct());
		expect(oct(8)).toBe(45);
	});
});

describe('planSuccessions: degree days', () => {
	const weeks = weeksBetween('2026-W01', '2026-W52');
	const constant = (meanF: number): Record<string, number> => Object.fromEntries(weeks.map((w) => [w, meanF]));

	it('walks back at a constant temperature: 400 GDD at 20 a day is 20 days', () => {
		const v = variety({ baseTempF: 40, gddToMaturity: 400, daysToMaturity: 60 });
		const plan = planSuccessions({
			variety: v,
			targets: targetsFor(['2026-W30'], 10),
			farm: { ...farm42, weeklyMeanTempF: constant(60) }
		});
		// mean 60 °F − base 40 °F = 20 GDD a day; 400 ÷ 20 = 20 days; W30 = Mon 20 Jul → 30 Jun
		expect(plan.successions[0].basis.dtm).toMatchObject({ source: 'gdd', days: 20 });
		expect(plan.successions[0].fieldDate).toBe('2026-06-30');
	});

	it('walks back through weeks of different means', () => {
		const temps = { ...constant(50), '2026-W29': 55 };
		const v = variety({ baseTempF: 40, gddToMaturity: 400, daysToMaturity: 60 });
		const plan = planSuccessions({
			variety: v,
			targets: targetsFor(['2026-W30'], 10),
			farm: { ...farm42, weeklyMeanTempF: temps }
		});
		// 13–19 Jul (W29): 7 days × (55 − 40) = 105; need 295 more at (50 − 40) = 10 a day:
		// 29 days give 290 < 295, the 30th reaches 300 → 7 + 30 = 37 days; 20 Jul − 37 d = 13 Jun
		expect(plan.successions[0].basis.dtm.days).toBe(37);
		expect(plan.successions[0].basis.dtm.gdd?.accumulated).toBe(405);
		expect(plan.successions[0].fieldDate).toBe('2026-06-13');
	});

	it('peas: 1,250 GDD base 40 °F at a steady 65 °F take 50 days', () => {
		// Source: University of Delaware Weekly Crop Update (peas ≈ 1,250 GDD base 40)
		// Source: Oklahoma State University GDD calculator notes (base 40 °F for cool-season crops such as peas)
		// 65 − 40 = 25 a day; 1,250 ÷ 25 = 50 days
		const peas = variety({ crop: 'pea', baseTempF: 40, gddToMaturity: 1250, daysToMaturity: 60 });
		const plan = planSuccessions({
			variety: peas,
			targets: targetsFor(['2026-W26'], 10),
			farm: { ...farm42, weeklyMeanTempF: { W01: 0, ...Object.fromEntries(weeks.map((w) => [w.slice(5), 65])) } }
		});
		expect(plan.successions[0].basis.dtm).toMatchObject({ source: 'gdd', days: 50 });
	});

	it('warns and falls back to calendar days when the requirement is never met or data is missing', () => {
		const v = variety({ baseTempF: 40, gddToMaturity: 400, daysToMaturity: 60 });
		// every week of every year at the base temperature (undated "Www" keys): 0 GDD a day for the whole 365-day walk
		const everyYear40 = Object.fromEntries(
			Array.from({ length: 53 }, (_, i) => [`W${String(i + 1).padStart(2, '0')}`, 40])
		);
		const cold = planSuccessions({
			variety: v,
			targets: targetsFor(['2026-W30'], 10),
			farm: { ...farm42, weeklyMeanTempF: everyYear40 }
		});
		expect(cold.successions[0].basis.dtm).toMatchObject({ source: 'variety', days: 60 });
		expect(cold.successions[0].warnings.map((w) => w.code)).toEqual(['gdd_not_met']);
		const gap = planSuccessions({
			variety: v,
			targets: targetsFor(['2026-W30'], 10),
			farm: { ...farm42, weeklyMeanTempF: { '2026-W29': 60 } }
		});
		expect(gap.successions[0].warnings.map((w) => w.code)).toEqual(['gdd_data_missing']);
	});
});

describe('planSuccessions: heat', () => {
	// common practice (no published source): spinach, radish and cilantro bolt once weeks run above about 65–70 °F
	const temps = { '2026-W24': 68, '2026-W25': 72, '2026-W26': 64 };

	it.each(['spinach', 'radish'])('warns when %s harvests in a week whose mean is above its 70 °F limit', (crop) => {
		const v = variety({ crop, heatLimitF: 70, harvestWindowDays: 14 });
		const plan = planSuccessions({
			variety: v,
			targets: targetsFor(['2026-W24', '2026-W25'], 10),
			farm: { ...farm42, weeklyMeanTempF: temps }
		});
		const heat = plan.successions[0].warnings.filter((w) => w.code === 'heat_in_harvest');
		expect(heat).toHaveLength(1);
		expect(heat[0].weeks).toEqual(['2026-W25']);
	});

	it('cilantro with the published 85 °F limit: quiet at 72 °F, warns at 86 °F', () => {
		// Source: Texas A&M AgriLife, Cilantro in the Garden (bolts above 85 °F) — higher than the common-practice 65–70 °F: sources disagree
		const v = variety({ crop: 'cilantro', heatLimitF: 85, harvestWindowDays: 7 });
		const run = (t: Record<string, number>) =>
			planSuccessions({
				variety: v,
				targets: targetsFor(['2026-W25'], 5),
				farm: { ...farm42, weeklyMeanTempF: t }
			}).successions[0].warnings.map((w) => w.code);
		expect(run(temps)).toEqual([]);
		expect(run({ '2026-W25': 86 })).toEqual(['heat_in_harvest']);
	});
});

describe('planSuccessions: reach, gaps and intervals', () => {
	it('reports weeks that cannot be reached in time and plans the rest', () => {
		const plan = planSuccessions({
			variety: carrot,
			targets: targetsFor(weeksBetween('2026-W24', '2026-W27'), 30),
			farm: farm42,
			options: { earliestFieldDate: '2026-04-01' }
		});
		// W24 = 8 Jun − 70 d = 30 Mar, before 1 Apr: unreachable. W25 = 15 Jun − 70 d = 6 Apr: fine.
		expect(plan.shortfall).toEqual([{ week: '2026-W24', quantity: 30 }]);
		expect(plan.warnings.find((w) => w.code === 'unreachable_week')?.weeks).toEqual(['2026-W24']);
		expect(plan.successions.map((s) => s.weeks)).toEqual([['2026-W25', '2026-W26'], ['2026-W27']]);
		expect(plan.successions[0].fieldDate).toBe('2026-04-06');
	});

	it('counts tray days against "today" for transplants', () => {
		const v = variety({
			method: 'transplant',
			daysToMaturity: 40,
			daysInTray: 30,
			cellsPerTray: 72,
			harvestWindowDays: 7
		});
		// W24 = 8 Jun: transplant 29 Apr, tray 30 Mar — before today (1 Apr). W25: tray 6 Apr.
		const plan = planSuccessions({
			variety: v,
			targets: targetsFor(['2026-W24', '2026-W25'], 10),
			farm: farm42,
			options: { today: '2026-04-01' }
		});
		expect(plan.shortfall.map((s) => s.week)).toEqual(['2026-W24']);
		expect(plan.successions[0].traySowDate).toBe('2026-04-06');
	});

	it('splits rather than leave weeks bare when the interval is longer than the window', () => {
		const v = variety({ harvestWindowDays: 7, yieldPerBedFoot: 1 });
		const plan = planSuccessions({
			variety: v,
			targets: targetsFor(weeksBetween('2026-W20', '2026-W25'), 10),
			farm: farm42,
			options: { intervalWeeks: 3 }
		});
		expect(plan.intervalWeeks).toBe(1);
		expect(plan.warnings.map((w) => w.code)).toEqual(['interval_shortened']);
		expect(plan.successions).toHaveLength(6);
		expect(plan.shortfall).toEqual([]);
	});

	it('sizes a window shorter than a week on what it yields inside the week', () => {
		// radish: 1 bunch per bed-foot over a 5-day window. Bed-feet = 20 ÷ 1 × 1.1 = 22 (sizing on the
		// 7-day rate of 1.4 a week would give 16 ft and only 16 bunches)
		const v = variety({ harvestWindowDays: 5, yieldPerBedFoot: 1 });
		const plan = planSuccessions({ variety: v, targets: targetsFor(['2026-W20', '2026-W21'], 20), farm: farm42 });
		expect(plan.successions.map((s) => s.bedFeet)).toEqual([22, 22]);
		const rows = forecast(
			plan.successions.map((s) => ({ ...s, crop: 'radish' })),
			[]
		);
		expect(rows.map((r) => r.supply)).toEqual([22, 22]);
		expect(explainBedFeet(plan.successions[0]).some((x) => x.formula === 'window covers only 5 days of the week')).toBe(
			true
		);
	});

	it('sums duplicate weeks and sizes each succession on what its weeks still lack', () => {
		const plan = planSuccessions({
			variety: carrot,
			targets: [
				{ week: '2026-W20', quantity: 10 },
				{ week: '2026-W20', quantity: 5 },
				{ week: '2026-W21', quantity: 30 },
				{ week: '2026-W22', quantity: 0 },
				{ week: '2026-W26', quantity: 7.5 }
			],
			farm: farm42,
			options: { margin: 0 }
		});
		expect(plan.successions.map((s) => s.weeks)).toEqual([['2026-W20', '2026-W21'], ['2026-W21'], ['2026-W26']]);
		// 0.75 lb per ft a week (1.5 lb over 14 days). W20: 15 ÷ 0.75 = 20 ft, which also gives W21 15 lb;
		// W21 still lacks 30 − 15 = 15 lb → a second succession of 15 ÷ 0.75 = 20 ft; W26: 7.5 ÷ 0.75 = 10 ft.
		// (Sizing W20's on the busiest week, as a run of two weeks would, takes 40 + 10 = 50 ft too.)
		expect(plan.successions.map((s) => s.bedFeet)).toEqual([20, 20, 10]);
		expect(plan.successions[1].basis.peakWeek).toBe('2026-W21');
	});

	it('parsnips: a long season from a summer sowing', () => {
		// common practice (no published source): parsnips take 110–140 days to mature
		const parsnip = variety({
			crop: 'parsnip',
			daysToMaturity: 120,
			harvestWindowDays: 28,
			germinationRate: 0.65,
			inRowSpacingIn: 2,
			seedsPerSpot: 2
		});
		const plan = planSuccessions({ variety: parsnip, targets: targetsFor(['2026-W44'], 50), farm: farm42 });
		const s = plan.successions[0];
		// W44 = Mon 26 Oct; 26 Oct − 120 d = 28 Jun, less the days the shortening autumn adds
		// (from 12 h of day on 23 Sep at 42° N to 10.66 h on 26 Oct): a few days earlier, before 28 Jun.
		expect(s.fieldDate < '2026-06-28').toBe(true);
		expect(s.fieldDate > '2026-06-14').toBe(true);
		const grow = daysBetween(s.fieldDate, s.firstHarvest);
		expect(grow).toBeGreaterThanOrEqual(110);
		expect(grow).toBeLessThanOrEqual(140);
	});

	it('rejects bad options and varieties, naming the field', () => {
		const run = (over: Parameters<typeof planSuccessions>[0]) => () => planSuccessions(over);
		const base = { variety: carrot, targets: targetsFor(['2026-W20'], 1), farm: farm42 };
		expect(run({ ...base, options: { intervalWeeks: 5 } })).toThrow(/options\.intervalWeeks/);
		expect(run({ ...base, variety: { ...carrot, germinationRate: 0 } })).toThrow(/variety\.germinationRate/);
		expect(run({ ...base, variety: { ...carrot, method: 'transplant' } })).toThrow(/variety\.daysInTray/);
		expect(run({ ...base, targets: [{ week: '2026-W54', quantity: 1 }] })).toThrow(PlanningInputError);
		expect(run({ ...base, targets: [{ week: '2026-W20', quantity: -1 }] })).toThrow(/targets\[0\]\.quantity/);
		expect(run({ ...base, farm: { ...farm42, lastSpringFrost: '10 May' } })).toThrow(/farm\.lastSpringFrost/);
	});
});
