// What a library form's field is (a number with its unit and bounds, a text, a choice) and the zod
// schema built from a table of them, so the form, its hints and the server's messages never disagree.
import { z } from 'zod';
import { monthDaySchema, numberField, plainText } from './common';

/**
 * A figure kept in one canonical unit (°F, inches, lb per foot, seeds and cents per gram, cents per
 * harvest unit) and typed and shown in the farm's own: the field table says which, and
 * `measuredFields` turns it into labels, bounds and conversions for one farm.
 */
export type Measure =
	'temperature' | 'spacing' | 'yieldPerLength' | 'seedsPerWeight' | 'pricePerSeedWeight' | 'pricePerUnit';

export interface NumberSpec {
	kind: 'number';
	label: string;
	/** Shown after the input; `{unit}` stands for the crop's harvest unit. */
	unit: string;
	help: string;
	min: number;
	max: number;
	int?: boolean;
	optional?: boolean;
	/** Stored differently from how it is typed: a percent typed is a fraction kept (÷ 100). */
	scale?: number;
	step?: string;
	/** Dollars kept as whole cents: more than two decimals is refused, never rounded to 0. */
	money?: boolean;
	/** Typed in the farm's units and kept in the canonical one (see `measuredFields`). */
	measure?: Measure;
	/** Filled in by `measuredFields`: a typed value to the stored one, and back. */
	toStored?: (n: number) => number;
	fromStored?: (n: number) => number;
}
export interface TextSpec {
	kind: 'text';
	label: string;
	help: string;
	max: number;
	optional?: boolean;
	/** A day of the year typed as MM-DD (e.g. 10-01). */
	monthDay?: boolean;
}
export interface ChoiceSpec {
	kind: 'choice';
	label: string;
	help: string;
	options: readonly { value: string; label: string }[];
}
export type FieldSpec = NumberSpec | TextSpec | ChoiceSpec;

const blank = (v: unknown): boolean => v === undefined || v === null || (typeof v === 'string' && v.trim() === '');

function numberSchema(s: NumberSpec) {
	const plain = numberField(s.label, s.min, s.max, { int: s.int });
	const base = s.money
		? plain.refine(
				(n) => Math.abs(n * 100 - Math.round(n * 100)) < 1e-6,
				`${s.label} must be in whole cents (at most 2 decimals); a smaller amount cannot be kept.`
			)
		: plain;
	const scaled = s.scale
		? base.transform((n) => n / s.scale!)
		: s.toStored
			? base.transform((n) => s.toStored!(n))
			: base;
	return s.optional ? z.preprocess((v) => (blank(v) ? null : v), scaled.nullable()) : scaled;
}

function fieldSchema(s: FieldSpec) {
	if (s.kind === 'number') return numberSchema(s);
	if (s.kind === 'text' && 'monthDay' in s && s.monthDay)
		return z.preprocess(
			(v) => (blank(v) ? null : typeof v === 'string' ? v.trim() : v),
			monthDaySchema(s.label).nullable()
		);
	if (s.kind === 'text')
		return s.optional
			? z.preprocess((v) => (blank(v) ? null : v), plainText(s.label, s.max).nullable())
			: plainText(s.label, s.max);
	const values = s.options.map((o) => o.value) as [string, ...string[]];
	return z.enum(values, { error: `${s.label}: choose ${values.join(' or ')}.` });
}

type Out<S> = S extends NumberSpec
	? S['optional'] extends true
		? number | null
		: number
	: S extends TextSpec
		? S['optional'] extends true
			? string | null
			: string
		: string;
export type Parsed<T extends Record<string, FieldSpec>> = { [K in keyof T]: Out<T[K]> };

export function schemaOf<T extends Record<string, FieldSpec>>(fields: T) {
	return z.object(
		Object.fromEntries(Object.entries(fields).map(([k, s]) => [k, fieldSchema(s)]))
	) as unknown as z.ZodType<Parsed<T>>;
}

/** A variety form's rule across fields: a direct-sown variety spends no days in a tray. */
export function withTrayRule<T extends z.ZodType<{ method: string; daysInTray: number }>>(schema: T) {
	return schema.refine((v) => v.method === 'transplant' || v.daysInTray === 0, {
		message: 'Days in tray must be 0 for a direct-sown variety.',
		path: ['daysInTray']
	});
}
/** A crop form's rule across fields: both field dates or neither. */
export function withSowRule<T extends z.ZodType<{ sowFrom: string | null; sowTo: string | null }>>(schema: T) {
	return schema.refine((c) => (c.sowFrom === null) === (c.sowTo === null), {
		message: 'Give both the earliest and the latest field date, or neither.',
		path: ['sowTo']
	});
}
