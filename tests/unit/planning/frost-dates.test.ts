// Frost dates are climate normals (month and day, at a stated probability): each planting is
// checked against them in its own year, and tender crops go out a set number of days after the
// last spring frost.
import { describe, expect, it } from 'vitest';
import { derivePlanting, forecast, planSuccessions, weeksBetween } from '../../../src/lib/planning/index';
import { frostHeatChecks } from '../../../src/lib/planning/season-shift';
import { farm42, targetsFor, variety } from './fixtures';

// Source: Illinois Extension / Kansas State MF-315 (REFERENCES.md): bush snap bean 51–58 days, soil 60 °F minimum.
const bean = variety({ crop: 'bean', daysToMaturity: 55, harvestWindowDays: 21, frostTender: true });
const row = (fieldDate: string) => ({
	method: 'direct' as const,
	fieldDate,
	lengthFt: 10,
	rows: 2,
	inRowSpacingIn: 3,
	seedsPerSpot: 1
});

describe('frost dates are normals applied to each season’s own year', () => {
	// The farm's dates as entered in 2027 (last spring 10 May, first fall 5 Oct).
	const farm = { ...farm42, lastSpringFrost: '2027-05-10', firstFallFrost: '2027-10-05', frostProbabilityPct: 50 };

	it('a 2028 bean sown in June and picked in August is not "after the first fall frost"', () => {
		// 2028-06-12 + 55 days = 6 Aug; + 21 − 1 = 26 Aug: before 5 Oct 2028.
		const d = derivePlanting(row('2028-06-12'), bean, farm, { explain: false });
		expect(d.firstHarvest).toBe('2028-08-06');
		expect(d.warnings.map((w) => w.code)).not.toContain('frost_after_first_fall');
		expect(d.warnings.map((w) => w.code)).not.toContain('frost_before_last_spring');
	});

	it('a 2028 bean sown 1 May is before that year’s last spring frost (10 May 2028), with its probability', () => {
		const d = derivePlanting(row('2028-05-01'), bean, farm, { explain: false });
		const w = d.warnings.find((x) => x.code === 'frost_before_last_spring');
		expect(w?.message).toContain('2028');
		expect(w?.message).toContain('50 % normal');
	});

	it('a 2028 bean whose window runs to 15 Oct 2028 meets that year’s first fall frost', () => {
		// 2028-08-01 + 55 = 25 Sep; + 20 = 15 Oct > 5 Oct 2028: the frost ends its harvest (below)
		const d = derivePlanting(row('2028-08-01'), bean, farm, { explain: false });
		expect(d.lastHarvest).toBe('2028-10-05');
		expect(d.warnings.find((x) => x.code === 'frost_after_first_fall')?.message).toContain('5 Oct');
	});

	it('the season-copy checks agree', () => {
		const w = frostHeatChecks(
			bean,
			{ traySowDate: null, fieldDate: '2028-06-12', firstHarvest: '2028-08-06', lastHarvest: '2028-08-26' },
			farm
		);
		expect(w).toEqual([]);
	});
});

describe('days after the last spring frost for tender crops', () => {
	// common practice (no published source): set tender crops out 1–2 weeks after the average last spring frost.
	const farm = { ...farm42, tenderDaysAfterFrost: 14 };

	it('the planner sows no tender crop before frost + 14 days, in the target year', () => {
		// farm42: last spring frost 10 May (normal); 2027: 10 May + 14 = 24 May 2027.
		const plan = planSuccessions({
			variety: bean,
			targets: targetsFor(weeksBetween('2027-W27', '2027-W33'), 10),
			farm
		});
		expect(plan.successions.length).toBeGreaterThan(0);
		for (const s of plan.successions) expect(s.fieldDate >= '2027-05-24').toBe(true);
		// W27 2027 = Mon 5 Jul; 5 Jul − 55 days = 11 May: too early, so W27 and W28 are unreachable.
		expect(plan.warnings.find((w) => w.code === 'unreachable_week')?.weeks).toContain('2027-W27');
	});

	it('the grid warns for a tender crop set out 5 days after the frost', () => {
		const d = derivePlanting(row('2027-05-15'), bean, farm, { explain: false });
		const w = d.warnings.find((x) => x.code === 'frost_before_last_spring');
		expect(w?.message).toContain('14 days after the last spring frost');
		expect(w?.message).toContain('24 May');
	});

	it('rejects a negative or fractional setting, naming the field', () => {
		const run = (days: number) => () =>
			planSuccessions({
				variety: bean,
				targets: targetsFor(['2027-W30'], 1),
				farm: { ...farm42, tenderDaysAfterFrost: days }
			});
		expect(run(-1)).toThrow(/farm\.tenderDaysAfterFrost/);
		expect(run(1.5)).toThrow(/farm\.tenderDaysAfterFrost/);
	});
});

describe('heat checks cover germination and growth', () => {
	// Source: REFERENCES.md, spinach: soil optimum 70 °F (Illinois Extension / Kansas State MF-315); a
	// heat limit of 75 °F weekly mean is common practice (no published source) for a bolting green.
	const spinach = variety({ crop: 'spinach', daysToMaturity: 45, harvestWindowDays: 14, heatLimitF: 75 });
	// 76 °F weekly means from W30 to W34 2027 (26 Jul – 29 Aug), 60 °F otherwise.
	const temps: Record<string, number> = {};
	for (let w = 1; w <= 52; w++) temps[`2027-W${String(w).padStart(2, '0')}`] = w >= 30 && w <= 34 ? 76 : 60;
	const farm = { ...farm42, weeklyMeanTempF: temps };

	it('spinach sown 29 Jul into 76 °F weeks for a September harvest is warned, naming the hot weeks', () => {
		const d = derivePlanting(row('2027-07-29'), spinach, farm, { explain: false });
		// 29 Jul + 45 days = 12 Sep: the harvest weeks (W36, W37) are cool, so no harvest warning…
		expect(d.firstHarvest).toBe('2027-09-12');
		expect(d.warnings.map((w) => w.code)).not.toContain('heat_in_harvest');
		// …but it comes up and grows through W30–W34 (29 Jul is in W30).
		const w = d.warnings.find((x) => x.code === 'heat_in_growth');
		expect(w?.weeks).toEqual(['2027-W30', '2027-W31', '2027-W32', '2027-W33', '2027-W34']);
	});

	it('the same spinach sown 30 Aug, after the heat, is not', () => {
		const d = derivePlanting(row('2027-08-30'), spinach, farm, { explain: false });
		expect(d.warnings.map((w) => w.code)).not.toContain('heat_in_growth');
	});
});

describe('a frost-tender crop’s harvest ends at the first fall frost', () => {
	// common practice (no published source): a frost kills frost-tender crops (beans, tomatoes,
	// squash, basil), so their picking ends with the first fall frost.
	const farm = { ...farm42, lastSpringFrost: '2027-05-10', firstFallFrost: '2027-10-05', frostProbabilityPct: 50 };

	it('worked example: a bean picked from Mon 25 Sep 2028 stops on Thu 5 Oct, with 11 of its 21 days’ yield', () => {
		const d = derivePlanting(row('2028-08-01'), bean, farm, { explain: false });
		// 1 Aug + 55 days = 25 Sep 2028 (Monday of 2028-W39); its window would run to 25 Sep + 20 = 15 Oct.
		expect(d.firstHarvest).toBe('2028-09-25');
		expect(d.lastHarvest).toBe('2028-10-05');
		// Even picking: 10 ft × 1 per bed-foot × 11 of 21 days = 5.238… → 5.24
		expect(d.expectedYield).toBe(5.24);
		const w = d.warnings.find((x) => x.code === 'frost_after_first_fall');
		expect(w?.message).toContain('ends at the first fall frost');
		expect(w?.message).toContain('10 days more');
		// The forecast over those dates: W39 gets 7 of 21 days (3.333…), W40 Mon 2 – Thu 5 Oct, 4 days
		// (1.905…), and nothing after the frost.
		const rows = forecast(
			[
				{
					crop: 'bean',
					firstHarvest: d.firstHarvest,
					lastHarvest: d.lastHarvest,
					bedFeet: 10,
					yieldPerBedFoot: 1,
					windowDays: bean.harvestWindowDays
				}
			],
			[{ crop: 'bean', week: '2028-W41', quantity: 5 }]
		);
		const supply = Object.fromEntries(rows.map((r) => [r.week, r.supply]));
		expect(supply['2028-W39']).toBeCloseTo((10 * 7) / 21, 9);
		expect(supply['2028-W40']).toBeCloseTo((10 * 4) / 21, 9);
		expect(supply['2028-W41'] ?? 0).toBe(0);
	});

	it('derived again from its stored dates (11 days of harvest), it keeps the same dates, yield and warning', () => {
		const again = derivePlanting({ ...row('2028-08-01'), harvestDays: 11 }, bean, farm, { explain: false });
		expect(again.lastHarvest).toBe('2028-10-05');
		expect(again.expectedYield).toBe(5.24);
		expect(again.warnings.map((x) => x.code)).toContain('frost_after_first_fall');
	});

	it('a hardy crop on the same dates picks its whole window', () => {
		const d = derivePlanting(row('2028-08-01'), { ...bean, frostTender: false }, farm, { explain: false });
		expect(d.lastHarvest).toBe('2028-10-15');
		expect(d.expectedYield).toBe(10);
	});

	it('the planner counts on no tender harvest from the frost’s week on', () => {
		// farm42's first fall frost is Mon 5 Oct 2026, the first day of 2026-W41: the plan's harvests
		// end Sun 4 Oct, W39 and W40 are met, and W41–W42 are reported out of reach.
		const plan = planSuccessions({
			variety: bean,
			targets: weeksBetween('2026-W39', '2026-W42').map((week) => ({ week, quantity: 10 })),
			farm: farm42
		});
		expect(plan.successions.length).toBeGreaterThan(0);
		for (const s of plan.successions) expect(s.lastHarvest <= '2026-10-04').toBe(true);
		expect(plan.shortfall.map((s) => s.week)).toEqual(['2026-W41', '2026-W42']);
		expect(plan.warnings.find((w) => w.code === 'unreachable_week')?.weeks).toEqual(['2026-W41', '2026-W42']);
	});
});
