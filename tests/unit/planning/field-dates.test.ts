// Each crop has an earliest and a latest field date: entered by the grower (a month-day window,
// e.g. garlic only in autumn), or, without one, from soil temperature — no sowing into weeks colder
// than the crop's base temperature. A date outside them is a warning; the planner never picks one.
import { describe, expect, it } from 'vitest';
import {
	PlanningInputError,
	derivePlanting,
	emergenceDays,
	planSuccessions,
	weeksBetween,
	defaultEarliestFieldDate,
	soilForEmergence,
	EMERGENCE_TABLES,
	type EmergenceTable,
	type Variety
} from '../../../src/lib/planning/index';
import { makeTempLookup } from '../../../src/lib/planning/weekly-temps';
import { inMonthDayWindow, monthDayValue } from '../../../src/lib/planning/sowing-window';
import { toDayNumber } from '../../../src/lib/planning/day-number';
import { demoEngineFarm, DEMO_CROPS, DEMO_VARIETIES, toEngineVariety } from '../../../db/seeds/demo-farm';
import { farm42, targetsFor, variety } from './fixtures';

// Source: Knott's Handbook for Vegetable Growers after Harrington & Minges (1954), also Oregon State
// Extension (REFERENCES.md): parsnip days to emergence by soil °F.
const PARSNIP_EMERGENCE: EmergenceTable = [
	[32, 172],
	[41, 57],
	[50, 27],
	[59, 19],
	[68, 14],
	[77, 15]
];
// Source: REFERENCES.md (Illinois Extension, Kansas State MF-315): parsnip ≈ 100+ days; 130 here. A
// cool-season crop: degree days and soil counted from 40 °F (Oklahoma State GDD notes).
const parsnip = variety({ crop: 'parsnip', daysToMaturity: 130, harvestWindowDays: 28, baseTempF: 40 });
const demoFarm = { ...demoEngineFarm() };
const row = (v: Variety, fieldDate: string) => ({
	method: v.method,
	fieldDate,
	lengthFt: 10,
	rows: v.rows,
	inRowSpacingIn: v.inRowSpacingIn,
	seedsPerSpot: v.seedsPerSpot
});
// The demo's invented weekly normal: 47 − 25·cos(2π(week − 4)/52) °F.
const demoMean = (week: number) => Math.round((47 - 25 * Math.cos((2 * Math.PI * (week - 4)) / 52)) * 10) / 10;

describe('no sowing into soil too cold for the crop', () => {
	it('parsnip sown 7 January warns: the week is far below 40 °F, where a seed takes months to come up', () => {
		// 7 Jan 2027 is in ISO week 1: 47 − 25·cos(2π·(−3)/52) = 47 − 25 × 0.935 = 23.6 °F.
		expect(demoMean(1)).toBeCloseTo(23.6, 1);
		// At 32 °F soil a parsnip seed takes 172 days to emerge; below that the table gives nothing.
		expect(emergenceDays(PARSNIP_EMERGENCE, 32)).toBe(172);
		expect(emergenceDays(PARSNIP_EMERGENCE, 23.6)).toBeNull();
		const d = derivePlanting(row(parsnip, '2027-01-07'), parsnip, demoFarm, { explain: false });
		const w = d.warnings.find((x) => x.code === 'too_cold_to_sow');
		expect(w?.message).toContain('23.6 °F');
		// Its emergence table brings it up within 28 days from 41 + (57 − 28) ÷ (57 − 27) × 9 = 49.7 °F.
		expect(w?.message).toContain('49.7 °F');
	});

	it('the planner never sows parsnip into a winter week for a May harvest: it moves the sowing', () => {
		const plan = planSuccessions({ variety: parsnip, targets: targetsFor(['2027-W20'], 50), farm: demoFarm });
		// 130 days back from Mon 17 May 2027 would be early January (and earlier still, as short days
		// count for less): too cold. Whatever the plan picks is a week at 40 °F or more, never January.
		expect(plan.successions.length).toBeGreaterThan(0);
		for (const s of plan.successions) {
			expect(demoMean(isoWeekNumber(s.fieldDate))).toBeGreaterThanOrEqual(40);
			expect(s.fieldDate.slice(5, 7)).not.toBe('01');
			expect(s.warnings.map((x) => x.code)).not.toContain('too_cold_to_sow');
		}
	});

	it('with the ground workable only from 1 April, the May parsnip week is unreachable, and the warning says why', () => {
		const plan = planSuccessions({
			variety: parsnip,
			targets: targetsFor(['2027-W20'], 50),
			farm: demoFarm,
			options: { earliestFieldDate: '2027-03-01' }
		});
		expect(plan.successions).toEqual([]);
		const w = plan.warnings.find((x) => x.code === 'unreachable_week');
		expect(w?.weeks).toEqual(['2027-W20']);
		expect(w?.message).toContain('49.7 °F its seed needs to come up within 28 days');
	});

	it('the same parsnip for an October harvest is sown in spring once the weeks reach 40 °F', () => {
		const plan = planSuccessions({ variety: parsnip, targets: targetsFor(['2027-W41'], 50), farm: demoFarm });
		expect(plan.successions).toHaveLength(1);
		const s = plan.successions[0];
		expect(demoMean(isoWeekNumber(s.fieldDate))).toBeGreaterThanOrEqual(40);
		expect(s.warnings.map((x) => x.code)).not.toContain('too_cold_to_sow');
	});
});

describe("the grower's field dates", () => {
	const garlic = (): Variety => {
		const v = DEMO_VARIETIES.find((x) => x.name === 'Hardneck Blush')!;
		return toEngineVariety(
			v,
			DEMO_CROPS.find((c) => c.name === v.crop)!
		);
	};

	it('a 2028 garlic plan at 42.5° N sows only in the autumn window, never through the winter', () => {
		const v = garlic();
		expect([v.sowFrom, v.sowTo]).toEqual(['10-01', '12-15']);
		// Boxes take garlic W30–W44 of 2028 (demo-like figures).
		const plan = planSuccessions({
			variety: v,
			targets: targetsFor(weeksBetween('2028-W30', '2028-W44'), 20),
			farm: demoFarm
		});
		expect(plan.successions.length).toBeGreaterThan(0);
		for (const s of plan.successions) {
			expect(inMonthDayWindow(toDayNumber(s.fieldDate), monthDayValue('10-01', 'x'), monthDayValue('12-15', 'x'))).toBe(
				true
			);
			expect(s.fieldDate.slice(0, 4)).toBe('2027');
		}
	});

	it('without a window, the soil rule alone keeps garlic out of the frozen months', () => {
		const { sowFrom: _f, sowTo: _t, ...v } = garlic();
		const plan = planSuccessions({
			variety: v,
			targets: targetsFor(weeksBetween('2028-W28', '2028-W44'), 20),
			farm: demoFarm
		});
		for (const s of plan.successions) expect(demoMean(isoWeekNumber(s.fieldDate))).toBeGreaterThanOrEqual(40);
	});

	it('the grid warns for a field date outside the window', () => {
		const v = garlic();
		const d = derivePlanting(row(v, '2028-03-01'), v, demoFarm, { explain: false });
		expect(d.warnings.find((x) => x.code === 'outside_sowing_window')?.message).toContain('10-01 to 12-15');
		const ok = derivePlanting(row(v, '2027-10-20'), v, demoFarm, { explain: false });
		expect(ok.warnings.map((x) => x.code)).not.toContain('outside_sowing_window');
	});

	it('a window may run over the new year; a bad or half window is refused, naming the field', () => {
		const from = monthDayValue('10-01', 'f');
		const to = monthDayValue('03-15', 't');
		expect(inMonthDayWindow(toDayNumber('2028-01-10'), from, to)).toBe(true);
		expect(inMonthDayWindow(toDayNumber('2028-04-01'), from, to)).toBe(false);
		const run = (over: Partial<Variety>) => () =>
			planSuccessions({ variety: { ...variety({}), ...over }, targets: targetsFor(['2027-W30'], 1), farm: farm42 });
		expect(run({ sowFrom: '10-01' })).toThrow(/variety\.sowTo/);
		expect(run({ sowFrom: '13-01', sowTo: '12-01' })).toThrow(PlanningInputError);
		expect(run({ sowFrom: '13-01', sowTo: '12-01' })).toThrow(/variety\.sowFrom/);
		expect(run({ sowFrom: '02-30', sowTo: '12-01' })).toThrow(/variety\.sowFrom/);
	});
});

/** ISO 8601 week number of a date. */
function isoWeekNumber(date: string): number {
	const t = new Date(`${date}T00:00:00Z`);
	const th = new Date(t);
	th.setUTCDate(t.getUTCDate() + 3 - ((t.getUTCDay() + 6) % 7));
	const jan1 = Date.UTC(th.getUTCFullYear(), 0, 1);
	return 1 + Math.floor((th.getTime() - jan1) / 864e5 / 7);
}

describe('a default earliest field date from soil temperature, where the grower gave none', () => {
	// Source: Knott's Handbook for Vegetable Growers after Harrington & Minges (1954), also Oregon
	// State Extension (REFERENCES.md): carrot 41 °F → 51 days to emerge, 50 °F → 17 days.
	// common practice (no published source): sowing waits for soil that brings the seed up within
	// about four weeks (28 days).
	const carrot = variety({ crop: 'Carrot', daysToMaturity: 70, harvestWindowDays: 21, baseTempF: 40 });
	const temps = makeTempLookup(demoFarm.weeklyMeanTempF!);

	it('the engine carries the published table, and 28 days falls at 41 + (51 − 28) ÷ (51 − 17) × 9 = 47.1 °F', () => {
		expect(EMERGENCE_TABLES.carrot).toEqual([
			[41, 51],
			[50, 17],
			[59, 10],
			[68, 7],
			[77, 6],
			[86, 6]
		]);
		expect(soilForEmergence(EMERGENCE_TABLES.carrot, 28)).toBeCloseTo(41 + (23 / 34) * 9, 9);
	});

	it('a direct-sown carrot with no field dates: earliest Mon 3 May 2027, the first week at 47.1 °F or more', () => {
		// The demo's weekly normal: W17 = 47 − 25·cos(2π·13/52) = 47.0 °F (too cold);
		// W18 = 47 − 25·cos(2π·14/52) = 50.0 °F; W18 of 2027 starts Mon 3 May.
		expect(demoMean(17)).toBeCloseTo(47.0, 1);
		expect(demoMean(18)).toBeCloseTo(50.0, 1);
		expect(defaultEarliestFieldDate(carrot, temps, 2027)).toBe('2027-05-03');
		// The grid warns before it, not from it.
		const early = derivePlanting(row(carrot, '2027-04-26'), carrot, demoFarm, { explain: false });
		expect(early.warnings.find((x) => x.code === 'too_cold_to_sow')?.message).toContain('47.1 °F');
		const ok = derivePlanting(row(carrot, '2027-05-03'), carrot, demoFarm, { explain: false });
		expect(ok.warnings.map((x) => x.code)).not.toContain('too_cold_to_sow');
	});

	it('the planner sows no carrot before it: an early-July target is out of reach, a late-July one is sown from 3 May', () => {
		const plan = planSuccessions({
			variety: carrot,
			targets: targetsFor(['2027-W27', '2027-W30'], 20),
			farm: demoFarm
		});
		for (const s of plan.successions) expect(s.fieldDate >= '2027-05-03').toBe(true);
		expect(plan.warnings.find((w) => w.code === 'unreachable_week')?.weeks).toContain('2027-W27');
		expect(plan.successions.length).toBeGreaterThan(0);
	});

	it('a grower’s field dates, or a transplant, are not held to the seed’s soil', () => {
		expect(defaultEarliestFieldDate({ ...carrot, sowFrom: '03-01', sowTo: '08-01' }, temps, 2027)).toBeNull();
		// A transplant falls back to its base temperature (40 °F): the first week at 40 °F or more.
		const set = defaultEarliestFieldDate({ ...carrot, method: 'transplant', daysInTray: 28 }, temps, 2027);
		expect(set).not.toBeNull();
		expect(set! < '2027-05-03').toBe(true);
		expect(demoMean(isoWeekNumber(set!))).toBeGreaterThanOrEqual(40);
	});
});
