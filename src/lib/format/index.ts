// Every number, quantity, length, sum of money and time the screens, sheets and files show goes
// through here, so a farm's unit system, currency and time zone apply everywhere alike.
// The database keeps its canonical units (lb, ft, in, °F, cents); conversion happens only for
// display and input. Constants: NIST Handbook 44, Appendix C (see $lib/planning/units).
import { CM_PER_IN, G_PER_OZ, KG_PER_LB, M_PER_FT, fToC, cToF } from '$lib/planning/units';

export type UnitSystem = 'imperial' | 'metric';

/** What a farm chose for display; every page gets it from the signed-in layout. */
export interface DisplayPrefs {
	unitSystem: UnitSystem;
	/** ISO 4217 code, e.g. USD, EUR, CAD. */
	currency: string;
	/** IANA zone, e.g. America/New_York. */
	timeZone: string;
	/** BCP 47 tag for how the farm writes numeric dates (en-US 6/24/2028, en-GB 24/06/2028). */
	dateLocale: string;
}

export const defaultPrefs: DisplayPrefs = {
	unitSystem: 'imperial',
	currency: 'USD',
	timeZone: 'UTC',
	dateLocale: 'en-US'
};

// The app's language is English; numbers use its grouping ("4,635"), whatever the browser says,
// so server-rendered and browser-rendered figures agree.
const LOCALE = 'en-US';
const numberFormats = new Map<string, Intl.NumberFormat>();
function nf(max: number, min = 0): Intl.NumberFormat {
	const key = `${min}-${max}`;
	let f = numberFormats.get(key);
	if (!f)
		numberFormats.set(
			key,
			(f = new Intl.NumberFormat(LOCALE, { maximumFractionDigits: max, minimumFractionDigits: min }))
		);
	return f;
}

/** A plain figure with thousands separators: 4635 → "4,635"; at most `digits` decimals. */
export function formatNumber(n: number, digits = 2): string {
	if (!Number.isFinite(n)) return '–';
	return nf(digits).format(Object.is(Math.round(n * 10 ** digits) / 10 ** digits, -0) ? 0 : n);
}

/** Decimals that suit a figure's size: 0.37, 4.6, 46, 4,635. */
export function autoDigits(n: number): number {
	const a = Math.abs(n);
	return a >= 100 ? 0 : a >= 10 ? 1 : 2;
}

// ---- Harvest quantities ----------------------------------------------------------------------

/** Harvest units in the database. Only weight converts; bunches, heads and pieces are counts. */
export type HarvestUnit = 'lb' | 'bunch' | 'head' | 'each' | string;

const countWords: Record<string, [string, string]> = {
	bunch: ['bunch', 'bunches'],
	head: ['head', 'heads'],
	each: ['each', 'each']
};

/** The unit label a farm sees for a harvest unit: lb → kg on a metric farm. */
export function unitLabel(unit: HarvestUnit, system: UnitSystem, count = 2): string {
	if (unit === 'lb') return system === 'metric' ? 'kg' : 'lb';
	const words = countWords[unit];
	return words ? (Math.abs(count) === 1 ? words[0] : words[1]) : unit;
}

/** A stored harvest quantity (in its canonical unit) in the farm's unit. */
export function toDisplayQuantity(value: number, unit: HarvestUnit, system: UnitSystem): number {
	return unit === 'lb' && system === 'metric' ? value * KG_PER_LB : value;
}

/** A typed quantity in the farm's unit back to the canonical unit. */
export function fromDisplayQuantity(value: number, unit: HarvestUnit, system: UnitSystem): number {
	return unit === 'lb' && system === 'metric' ? value / KG_PER_LB : value;
}

/** A stored quantity as a form field shows it in the farm's unit: "0.25" lb, or "0.113" kg (`digits` at most). */
export function typedQuantity(stored: number, unit: HarvestUnit, system: UnitSystem, digits = 3): string {
	return String(Number(toDisplayQuantity(stored, unit, system).toFixed(digits)));
}

/** A typed quantity as the database keeps it: canonical unit, to the hundredth. */
export function storedQuantity(value: number, unit: HarvestUnit, system: UnitSystem): number {
	return Math.round(fromDisplayQuantity(value, unit, system) * 100) / 100;
}

/** "4,635 lb", "2,102.4 kg", "1 bunch", "12 bunches". */
export function formatQuantity(value: number, unit: HarvestUnit, system: UnitSystem, digits?: number): string {
	const v = toDisplayQuantity(value, unit, system);
	const text = formatNumber(v, digits ?? autoDigits(v));
	return `${text} ${unitLabel(unit, system, Number(text.replace(/,/g, '')))}`;
}

/** A stored figure as shown: times `factor` (metric units per stored unit) on a metric farm, as it is on an imperial one. */
function toMetric(factor: number): (stored: number, system: UnitSystem) => number {
	return (stored, system) => (system === 'metric' ? stored * factor : stored);
}
/** A shown figure back as stored: the other way of toMetric. */
function fromMetric(factor: number): (value: number, system: UnitSystem) => number {
	return (value, system) => (system === 'metric' ? value / factor : value);
}

// ---- Lengths -----------------------------------------------------------------------------------

/** Bed lengths and ranges: feet, or metres on a metric farm. */
export function lengthUnit(system: UnitSystem): string {
	return system === 'metric' ? 'm' : 'ft';
}
export const toDisplayFeet = toMetric(M_PER_FT);
export const fromDisplayFeet = fromMetric(M_PER_FT);
/** "1,200 ft" or "365.76 m". */
export function formatFeet(ft: number, system: UnitSystem, digits?: number): string {
	const v = toDisplayFeet(ft, system);
	return `${formatNumber(v, digits ?? (system === 'metric' ? autoDigits(v) : 1))} ${lengthUnit(system)}`;
}
/** Where a planting sits in its bed: "0–50 ft (50 ft)" or "0–15.24 m (15.24 m)". */
export function formatBedRange(startFt: number, lengthFt: number, system: UnitSystem): string {
	const at = (ft: number) => formatNumber(toDisplayFeet(ft, system), 2);
	return `${at(startFt)}–${at(startFt + lengthFt)} ${lengthUnit(system)} (${formatFeet(lengthFt, system)})`;
}
/** A stored length as an input shows it: feet, or metres to the centimetre. */
export function lengthInputValue(ft: number, system: UnitSystem): string {
	return system === 'metric' ? String(Number((ft * M_PER_FT).toFixed(2))) : String(ft);
}
/** A stored bed width as an input shows it: inches, or whole centimetres. */
export function widthInputValue(inches: number, system: UnitSystem): string {
	return system === 'metric' ? String(Math.round(inches * CM_PER_IN)) : String(inches);
}
/** "bed-feet" or "bed-metres", for totals of bed length. */
export function bedLengthWord(system: UnitSystem): string {
	return system === 'metric' ? 'bed-metres' : 'bed-feet';
}

/** Spacing in a row and bed widths: inches, or centimetres on a metric farm. */
export function spacingUnit(system: UnitSystem): string {
	return system === 'metric' ? 'cm' : 'in';
}
export const toDisplayInches = toMetric(CM_PER_IN);
export const fromDisplayInches = fromMetric(CM_PER_IN);
export function formatInches(inches: number, system: UnitSystem): string {
	const v = toDisplayInches(inches, system);
	return `${formatNumber(v, system === 'metric' ? 1 : 2)} ${spacingUnit(system)}`;
}

/** Yield per bed length: lb/ft, or kg/m on a metric farm (counts per metre for counted crops). */
export function perLengthLabel(unit: HarvestUnit, system: UnitSystem): string {
	return `${unitLabel(unit, system)}/${lengthUnit(system)}`;
}
export function toDisplayPerFoot(perFoot: number, unit: HarvestUnit, system: UnitSystem): number {
	return system === 'metric' ? toDisplayQuantity(perFoot, unit, system) / M_PER_FT : perFoot;
}

/** "0.75 lb/ft", "1.12 kg/m", "8 bunches/ft". */
export function formatPerLength(perFoot: number, unit: HarvestUnit, system: UnitSystem): string {
	const v = toDisplayPerFoot(perFoot, unit, system);
	return `${formatNumber(v, autoDigits(v))} ${perLengthLabel(unit, system)}`;
}

// ---- Temperatures ------------------------------------------------------------------------------

export function temperatureUnit(system: UnitSystem): string {
	return system === 'metric' ? '°C' : '°F';
}
export function toDisplayTemp(f: number, system: UnitSystem): number {
	return system === 'metric' ? fToC(f) : f;
}
export function fromDisplayTemp(value: number, system: UnitSystem): number {
	return system === 'metric' ? cToF(value) : value;
}
export function formatTemp(f: number, system: UnitSystem): string {
	return `${formatNumber(toDisplayTemp(f, system), 0)} ${temperatureUnit(system)}`;
}

// ---- Seed ----------------------------------------------------------------------------------------

/**
 * Seed weight: grams on a metric farm, ounces on an imperial one (catalogues on either side sell
 * and count seed that way). The database keeps grams and seeds per gram.
 */
export function seedWeightUnit(system: UnitSystem): 'g' | 'oz' {
	return system === 'metric' ? 'g' : 'oz';
}
export function toDisplaySeedWeight(grams: number, system: UnitSystem): number {
	return system === 'metric' ? grams : grams / G_PER_OZ;
}
export function fromDisplaySeedWeight(value: number, system: UnitSystem): number {
	return system === 'metric' ? value : value * G_PER_OZ;
}
/** Decimals for a seed weight: small ounces need three (0.004 oz is about 100 lettuce seeds). */
export function seedWeightDigits(value: number): number {
	const a = Math.abs(value);
	return a >= 100 ? 0 : a >= 10 ? 1 : a >= 0.1 ? 2 : 3;
}
/** "4,635 g" or "0.35 oz". */
export function formatSeedWeight(grams: number, system: UnitSystem): string {
	const v = toDisplaySeedWeight(grams, system);
	return `${formatNumber(v, seedWeightDigits(v))} ${seedWeightUnit(system)}`;
}
/** Seeds per gram (stored) as seeds per the farm's seed-weight unit. */
export function toDisplaySeedsPerWeight(perGram: number, system: UnitSystem): number {
	return system === 'metric' ? perGram : perGram * G_PER_OZ;
}
export function fromDisplaySeedsPerWeight(value: number, system: UnitSystem): number {
	return system === 'metric' ? value : value / G_PER_OZ;
}
/** A price per gram (stored in cents) as a price per the farm's seed-weight unit, in cents. */
export function toDisplayPricePerSeedWeight(centsPerGram: number, system: UnitSystem): number {
	return system === 'metric' ? centsPerGram : centsPerGram * G_PER_OZ;
}

/** "1 tray", "12 trays": a count with its word in the right number. */
export function plural(n: number, one: string, many = `${one}s`): string {
	return `${formatNumber(n, 2)} ${Math.abs(n) === 1 ? one : many}`;
}

// ---- Money -------------------------------------------------------------------------------------

const moneyFormats = new Map<string, Intl.NumberFormat>();
/** Cents (the database's unit) in the farm's currency: 123456 → "$1,234.56", "€1,234.56". */
export function formatMoney(cents: number, currency: string): string {
	let f = moneyFormats.get(currency);
	if (!f) {
		try {
			f = new Intl.NumberFormat(LOCALE, { style: 'currency', currency });
		} catch {
			f = new Intl.NumberFormat(LOCALE, { style: 'currency', currency: 'USD' });
		}
		moneyFormats.set(currency, f);
	}
	return f.format(cents / 100);
}

/** Currencies the settings offer (ISO 4217). Any valid code works; these are the common ones. */
/** Date styles the farm settings offer: locale tags whose numeric dates growers write and paste. */
export const dateLocales = [
	'en-US',
	'en-CA',
	'en-GB',
	'en-IE',
	'en-AU',
	'en-NZ',
	'fr-FR',
	'fr-CA',
	'de-DE',
	'nl-NL',
	'es-ES',
	'es-MX',
	'it-IT',
	'da-DK',
	'nb-NO',
	'sv-SE',
	'ja-JP'
] as const;

/** 24 June 2028 as `tag` writes it in numbers, e.g. "6/24/2028" (en-US) or "24.6.2028" (de-DE). */
export function dateSample(tag: string): string {
	return new Intl.DateTimeFormat(tag, { timeZone: 'UTC', year: 'numeric', month: 'numeric', day: 'numeric' }).format(
		new Date(Date.UTC(2028, 5, 24))
	);
}

export const currencies = ['USD', 'CAD', 'EUR', 'GBP', 'AUD', 'NZD', 'CHF', 'SEK', 'NOK', 'DKK', 'MXN', 'JPY'] as const;

// ---- Time --------------------------------------------------------------------------------------

const dateTimeParts: Intl.DateTimeFormatOptions = {
	weekday: 'short',
	day: 'numeric',
	month: 'short',
	year: 'numeric',
	hour: '2-digit',
	minute: '2-digit',
	hour12: false
};

/** A moment (ISO timestamp or Date) in the farm's time zone: "Thu 3 Dec 2026, 09:14". */
export function formatDateTime(at: string | Date, timeZone: string): string {
	const d = typeof at === 'string' ? new Date(at) : at;
	if (Number.isNaN(d.getTime())) return '–';
	try {
		return new Intl.DateTimeFormat('en-GB', { ...dateTimeParts, timeZone }).format(d);
	} catch {
		return new Intl.DateTimeFormat('en-GB', { ...dateTimeParts, timeZone: 'UTC' }).format(d) + ' UTC';
	}
}

/** A calendar date ('YYYY-MM-DD', no time zone): "Mon 14 Jun". */
export function formatDay(date: string, withYear = false): string {
	const d = new Date(`${date}T12:00:00Z`);
	if (Number.isNaN(d.getTime())) return date;
	return new Intl.DateTimeFormat('en-GB', {
		timeZone: 'UTC',
		weekday: 'short',
		day: 'numeric',
		month: 'short',
		...(withYear ? { year: 'numeric' } : {})
	}).format(d);
}
