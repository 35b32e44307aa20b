/**
 * Input validation for the planning engine. Every public entry point checks its
 * plain-data input and throws a PlanningInputError naming the offending field,
 * so a form or API route can show the message beside that field.
 */
export class PlanningInputError extends Error {
	readonly field: string;

	constructor(field: string, message: string) {
		super(`${field}: ${message}`);
		this.name = 'PlanningInputError';
		this.field = field;
	}
}

/** The name of field `name` of item `index` of a list: `plantings[3].fieldDate`. */
export function itemField(list: string, index: number, name: string): string {
	return `${list}[${index}].${name}`;
}

/*
 * The *Item checks below name the field only when the check fails: loops over
 * thousands of targets or plantings would otherwise build a name string per item
 * for nothing, and that garbage was a measurable share of a season plan's time.
 */

/** requirePositive for a field of a list item. */
export function requirePositiveItem(list: string, index: number, name: string, value: unknown): number {
	if (typeof value === 'number' && Number.isFinite(value) && value > 0) return value;
	return requirePositive(itemField(list, index, name), value);
}

/** requireNonNegative for a field of a list item. */
export function requireNonNegativeItem(list: string, index: number, name: string, value: unknown): number {
	if (typeof value === 'number' && Number.isFinite(value) && value >= 0) return value;
	return requireNonNegative(itemField(list, index, name), value);
}

export function requireFinite(field: string, value: unknown): number {
	if (typeof value !== 'number' || !Number.isFinite(value)) {
		throw new PlanningInputError(field, `must be a finite number (got ${String(value)})`);
	}
	return value;
}

export function requirePositive(field: string, value: unknown): number {
	const n = requireFinite(field, value);
	if (n <= 0) throw new PlanningInputError(field, `must be greater than 0 (got ${n})`);
	return n;
}

export function requireNonNegative(field: string, value: unknown): number {
	const n = requireFinite(field, value);
	if (n < 0) throw new PlanningInputError(field, `must be 0 or more (got ${n})`);
	return n;
}

export function requirePositiveInteger(field: string, value: unknown): number {
	const n = requirePositive(field, value);
	if (!Number.isInteger(n)) throw new PlanningInputError(field, `must be a whole number (got ${n})`);
	return n;
}

export function requireNonNegativeInteger(field: string, value: unknown): number {
	const n = requireNonNegative(field, value);
	if (!Number.isInteger(n)) throw new PlanningInputError(field, `must be a whole number (got ${n})`);
	return n;
}

/** A rate in (0, 1], e.g. germination. */
export function requireRate(field: string, value: unknown): number {
	const n = requireFinite(field, value);
	if (n <= 0 || n > 1) {
		throw new PlanningInputError(field, `must be a fraction in (0, 1], e.g. 0.85 for 85 % (got ${n})`);
	}
	return n;
}

export function requireLatitude(field: string, value: unknown): number {
	const n = requireFinite(field, value);
	if (n < -90 || n > 90) throw new PlanningInputError(field, `must be between -90 and 90 degrees (got ${n})`);
	return n;
}
