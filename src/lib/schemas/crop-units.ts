// The crop library's forms in a farm's own units: temperatures, spacing, yield per bed length,
// seeds and price per seed weight, and price per harvest unit are typed and shown as the farm
// works (°C, cm, kg per metre, grams on a metric farm; seeds per ounce on an imperial one) and kept
// in the canonical units the field table states. Constants: NIST Handbook 44, Appendix C.
import { cropFields, schemaOf, varietyFields, withSowRule, withTrayRule, type FieldSpec, type Measure } from './crop';
import {
	formatTemp,
	fromDisplayInches,
	fromDisplayTemp,
	lengthUnit,
	seedWeightUnit,
	spacingUnit,
	temperatureUnit,
	toDisplayInches,
	toDisplayPerFoot,
	toDisplayTemp,
	unitLabel as quantityUnit,
	type UnitSystem
} from '$lib/format';
import { G_PER_OZ, KG_PER_LB } from '$lib/planning/units';

/** The farm whose units a form is typed in, and the crop's harvest unit and the farm's currency. */
export interface UnitContext {
	system: UnitSystem;
	harvestUnit: string;
	currency: string;
}

interface Conversion {
	unit: string;
	label?: string;
	from: (stored: number) => number;
	to: (typed: number) => number;
}

function conversion(measure: Measure, ctx: UnitContext): Conversion {
	const { system, harvestUnit, currency } = ctx;
	const metric = system === 'metric';
	const per = quantityUnit(harvestUnit, system, 1);
	switch (measure) {
		case 'temperature':
			return {
				unit: temperatureUnit(system),
				from: (f) => toDisplayTemp(f, system),
				to: (t) => fromDisplayTemp(t, system)
			};
		case 'spacing':
			return {
				unit: spacingUnit(system),
				from: (i) => toDisplayInches(i, system),
				to: (t) => fromDisplayInches(t, system)
			};
		case 'yieldPerLength': {
			const k = toDisplayPerFoot(1, harvestUnit, system);
			return {
				unit: `${quantityUnit(harvestUnit, system)} per bed-${lengthUnit(system)}`,
				from: (v) => v * k,
				to: (t) => t / k
			};
		}
		case 'seedsPerWeight':
			return metric
				? { unit: 'seeds/g', from: (v) => v, to: (t) => t }
				: { unit: 'seeds/oz', label: 'Seeds per ounce', from: (v) => v * G_PER_OZ, to: (t) => t / G_PER_OZ };
		case 'pricePerSeedWeight': {
			const k = metric ? 1 : G_PER_OZ;
			return { unit: `${currency} per ${seedWeightUnit(system)}`, from: (v) => v * k, to: (t) => t / k };
		}
		case 'pricePerUnit': {
			const k = metric && harvestUnit === 'lb' ? 1 / KG_PER_LB : 1;
			return { unit: `${currency} per ${per}`, from: (v) => v * k, to: (t) => t / k };
		}
	}
}

/** A bound in the farm's units, rounded to three significant figures inward so it stays valid. */
function bound(stored: number, conv: (n: number) => number, up: boolean): number {
	const v = conv(stored);
	if (v === 0) return 0;
	const p = 10 ** (Math.floor(Math.log10(Math.abs(v))) - 2);
	return (up ? Math.ceil(v / p - 1e-9) : Math.floor(v / p + 1e-9)) * p;
}

/** A field table for one farm: units, labels, help and bounds as typed there, with the conversions. */
export function measuredFields<T extends Record<string, FieldSpec>>(fields: T, ctx: UnitContext): T {
	const words = (text: string): string =>
		text
			.replace(/\{temp:(-?\d+)\}/g, (_, f: string) => formatTemp(Number(f), ctx.system))
			.replace('{length}', ctx.system === 'metric' ? 'metre' : 'foot')
			.replace('{weight}', ctx.system === 'metric' ? 'gram' : 'ounce');
	const out: Record<string, FieldSpec> = {};
	for (const [k, spec] of Object.entries(fields)) {
		if (spec.kind === 'choice' && k === 'harvestUnit') {
			// The unit keeps its stored value (lb); the farm reads it as it weighs (kg on a metric farm).
			const options = spec.options.map((o) => ({ ...o, label: quantityUnit(o.value, ctx.system, 1) }));
			out[k] = { ...spec, options, help: words(spec.help) };
			continue;
		}
		if (spec.kind !== 'number') {
			out[k] = { ...spec, help: words(spec.help) };
			continue;
		}
		if (!spec.measure) {
			out[k] = { ...spec, help: words(spec.help) };
			continue;
		}
		const c = conversion(spec.measure, ctx);
		const round = (n: number) => Number(n.toFixed(6));
		out[k] = {
			...spec,
			label: c.label ?? spec.label,
			unit: c.unit,
			help: words(spec.help),
			min: round(bound(spec.min, c.from, true)),
			max: round(bound(spec.max, c.from, false)),
			toStored: c.to,
			fromStored: c.from
		};
	}
	return out as T;
}

/** The crop and variety forms as this farm types them; what they give back is in canonical units. */
export const cropSchemaFor = (ctx: UnitContext) => withSowRule(schemaOf(measuredFields(cropFields, ctx)));
export const varietySchemaFor = (ctx: UnitContext) => withTrayRule(schemaOf(measuredFields(varietyFields, ctx)));
