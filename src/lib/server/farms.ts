// The farm's own settings (tenant row).
import { db } from './db';

export interface Farm {
	id: number;
	name: string;
	timeZone: string;
	latitude: number;
	unitSystem: 'imperial' | 'metric';
	/** ISO 4217 code; money is stored in its minor unit (cents). */
	currency?: string;
	/** BCP 47 tag for how the farm writes dates (day/month order of pasted dates). */
	dateLocale?: string;
	lastSpringFrost: string;
	firstFallFrost: string;
	bedFootIncrement: number;
	turnaroundDays: number;
	/** The probability the frost dates stand for, percent (they are normals: month and day count). */
	frostProbabilityPct: number;
	/** Days after the last spring frost that frost-tender crops go out. */
	tenderDaysAfterFrost: number;
	/** Years back the rotation check looks for a family on a bed. */
	rotationYears: number;
}

export async function get(farmId: number): Promise<Farm> {
	const r = await db()('farms').where({ id: farmId }).first();
	if (!r) throw new Error(`farm ${farmId} not found`);
	return {
		id: r.id,
		name: r.name,
		timeZone: r.time_zone,
		latitude: Number(r.latitude),
		unitSystem: r.unit_system,
		currency: r.currency ?? 'USD',
		dateLocale: r.date_locale ?? 'en-US',
		lastSpringFrost: r.last_spring_frost,
		firstFallFrost: r.first_fall_frost,
		bedFootIncrement: r.bed_foot_increment,
		turnaroundDays: r.turnaround_days,
		frostProbabilityPct: Number(r.frost_probability_pct ?? 50),
		tenderDaysAfterFrost: Number(r.tender_days_after_frost ?? 7),
		rotationYears: Number(r.rotation_years ?? 3)
	};
}

export async function update(
	farmId: number,
	input: Omit<Farm, 'id' | 'frostProbabilityPct' | 'tenderDaysAfterFrost' | 'rotationYears'> &
		Partial<Pick<Farm, 'frostProbabilityPct' | 'tenderDaysAfterFrost' | 'rotationYears'>>
): Promise<void> {
	await db()('farms')
		.where({ id: farmId })
		.update({
			name: input.name,
			time_zone: input.timeZone,
			latitude: input.latitude,
			unit_system: input.unitSystem,
			...(input.currency ? { currency: input.currency } : {}),
			...(input.dateLocale ? { date_locale: input.dateLocale } : {}),
			last_spring_frost: input.lastSpringFrost,
			first_fall_frost: input.firstFallFrost,
			bed_foot_increment: input.bedFootIncrement,
			turnaround_days: input.turnaroundDays,
			// Optional so older forms and imports keep the farm's choice.
			...(input.frostProbabilityPct !== undefined ? { frost_probability_pct: input.frostProbabilityPct } : {}),
			...(input.tenderDaysAfterFrost !== undefined ? { tender_days_after_frost: input.tenderDaysAfterFrost } : {}),
			...(input.rotationYears !== undefined ? { rotation_years: input.rotationYears } : {})
		});
}

/** Normal weekly mean temperatures keyed by ISO week number (1-53). */
export async function weeklyTemps(farmId: number): Promise<Record<number, number>> {
	const rows: { week_number: number; mean_temp_f: number }[] = await db()('farm_weekly_temps')
		.where({ farm_id: farmId })
		.select('week_number', 'mean_temp_f');
	return Object.fromEntries(rows.map((r) => [r.week_number, Number(r.mean_temp_f)]));
}

/** What the farm chose for display: unit system, currency, time zone and how it writes dates. */
export async function displayPrefs(farmId: number): Promise<import('$lib/format').DisplayPrefs> {
	const r = await db()('farms').where({ id: farmId }).first('unit_system', 'currency', 'time_zone', 'date_locale');
	return {
		unitSystem: r?.unit_system === 'metric' ? 'metric' : 'imperial',
		currency: r?.currency ?? 'USD',
		timeZone: r?.time_zone ?? 'UTC',
		dateLocale: r?.date_locale ?? 'en-US'
	};
}
