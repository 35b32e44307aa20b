/**
 * The order a season plan lists its plantings in: by field date, then key.
 * Placement hands pieces over already in field-date order (placed, then unplaced,
 * each in the order it placed them), so a merge and a sort of each day's few
 * plantings by key give the same order as one sort of the whole list, for much
 * less work on a season of thousands.
 */
interface Dated {
	key: string;
	fieldDate: string;
}

function byDateThenKey(a: Dated, b: Dated): number {
	return a.fieldDate < b.fieldDate ? -1 : a.fieldDate > b.fieldDate ? 1 : a.key < b.key ? -1 : 1;
}

function byKey(a: Dated, b: Dated): number {
	return a.key < b.key ? -1 : 1;
}

function inDateOrder(xs: Dated[]): boolean {
	for (let i = 1; i < xs.length; i++) if (xs[i - 1].fieldDate > xs[i].fieldDate) return false;
	return true;
}

/** `first` and `second` merged and sorted by field date, then key (keys are unique). */
export function inPlanOrder<T extends Dated>(first: T[], second: T[]): T[] {
	if (!inDateOrder(first) || !inDateOrder(second)) return [...first, ...second].sort(byDateThenKey);
	const out: T[] = [];
	let i = 0;
	let j = 0;
	while (i < first.length || j < second.length) {
		out.push(j >= second.length || (i < first.length && first[i].fieldDate <= second[j].fieldDate) ? first[i++] : second[j++]);
	}
	for (let a = 0; a < out.length; ) {
		let b = a + 1;
		while (b < out.length && out[b].fieldDate === out[a].fieldDate) b++;
		if (b - a > 1) {
			const day = out.slice(a, b).sort(byKey);
			for (let k = 0; k < day.length; k++) out[a + k] = day[k];
		}
		a = b;
	}
	return out;
}
