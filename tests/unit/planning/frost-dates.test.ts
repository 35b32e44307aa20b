// Frost dates are climate normals (month and day, at a stated probability): each planting is
// checked against them in its own year, and tender crops go out a set number of days after the
// last spring frost.
import { describe, expect, it } from 'vitest';
import { derivePlanting, planSuccessions, weeksBetween } from '../../../src/lib/planning/index';
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

	it('a 2028 bean still picking on 10 Oct 2028 is after that year’s first fall frost', () => {
		// 2028-08-01 + 55 = 25 Sep; + 20 = 15 Oct > 5 Oct 2028
		const d = derivePlanting(row('2028-08-01'), bean, farm, { explain: false });
		expect(d.lastHarvest).toBe('2028-10-15');
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
