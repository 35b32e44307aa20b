// Taking a few named values out of a larger record: a joined row's fields for a narrower shape.

/** The values of `names` out of a larger record. */
export function pick<T extends object, K extends keyof T>(from: T, names: readonly K[]): Pick<T, K> {
	const out = {} as Pick<T, K>;
	for (const k of names) out[k] = from[k];
	return out;
}
