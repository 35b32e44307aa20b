// Numbers written as text, the way spreadsheets and people write them: "1,000", "1,500.00",
// "1.234,5", "1 000", "$0.90", "85 %". A comma or a point may be the decimal mark or the
// thousands separator depending on where the file was made, so the mark is decided per file
// (see detectDecimal) and a value that could be read two ways is refused, never guessed.

export type DecimalMark = '.' | ',';

export type NumberText =
	| { kind: 'number'; value: number }
	/** Separators that fit both readings ("1,000": one thousand, or one). */
	| { kind: 'ambiguous'; readings: [number, number] }
	| { kind: 'invalid' };

/** Marks a locale puts between thousands that are never a decimal mark: spaces (plain, no-break,
 * narrow no-break, thin) and apostrophes (Swiss). */
const groupSpace = /[ \u00a0\u202f\u2009'\u2019]/g;

/**
 * What a text says about the decimal mark: '.' or ',' when it can only be read one way, null
 * when it has no separator or fits both ("1,000", "1.000").
 */
export function markEvidence(text: string): DecimalMark | null {
	const t = text.trim().replace(/^[+-]/, '').replace(groupSpace, '');
	const dot = t.indexOf('.');
	const comma = t.indexOf(',');
	if (dot >= 0 && comma >= 0) return dot > comma ? '.' : ',';
	const mark = dot >= 0 ? '.' : comma >= 0 ? ',' : null;
	if (!mark) return null;
	const parts = t.split(mark);
	// Two or more of the same mark: it separates thousands, so the other one is the decimal mark.
	if (parts.length > 2) return mark === '.' ? ',' : '.';
	// One mark: three digits after it and a non-zero lead of 1–3 digits reads both ways.
	if (/^[1-9]\d{0,2}$/.test(parts[0]) && /^\d{3}$/.test(parts[1])) return null;
	return mark;
}

/** Decides a file's decimal mark from the evidence of all its number cells. */
export function detectDecimal(texts: Iterable<string>): DecimalMark | 'mixed' | null {
	let dot = 0;
	let comma = 0;
	for (const t of texts) {
		const e = markEvidence(t);
		if (e === '.') dot++;
		else if (e === ',') comma++;
	}
	if (dot && comma) return 'mixed';
	return dot ? '.' : comma ? ',' : null;
}

function readWith(t: string, decimal: DecimalMark): number | null {
	const group = decimal === '.' ? ',' : '.';
	const [whole, frac, extra] = t.split(decimal);
	if (extra !== undefined) return null;
	const groups = whole.split(group);
	// Groups: the first of 1–3 digits, the last of 3, those between of 3 (or 2, as in 12,34,567).
	const middle = groups.slice(1, -1);
	if (
		groups.length > 1 &&
		(!/^\d{1,3}$/.test(groups[0]) ||
			!/^\d{3}$/.test(groups[groups.length - 1]) ||
			middle.some((g) => !/^\d{2,3}$/.test(g)))
	)
		return null;
	const digits = groups.join('');
	if (!/^\d*$/.test(digits) || (frac !== undefined && !/^\d+$/.test(frac)) || (digits === '' && frac === undefined))
		return null;
	return Number(`${digits || '0'}${frac !== undefined ? `.${frac}` : ''}`);
}

/**
 * Reads a number written as text. With the file's decimal mark known, a separator is read by
 * it; without one, a value that fits both readings is 'ambiguous'. Leading "$" and a sign are
 * taken; "%" is not (the caller decides what a percent means).
 */
export function parseNumberText(text: string, decimal: DecimalMark | null = null): NumberText {
	let t = text.trim().replace(groupSpace, '');
	let sign = 1;
	if (/^[+-]/.test(t)) {
		sign = t[0] === '-' ? -1 : 1;
		t = t.slice(1);
	}
	t = t.replace(/^\$/, '');
	if (/^[+-]/.test(t)) {
		sign = t[0] === '-' ? -1 : 1;
		t = t.slice(1);
	}
	if (!/^[\d.,]+$/.test(t) || !/\d/.test(t)) {
		// Scientific notation as a spreadsheet writes very large or small numbers.
		if (/^\d+(\.\d+)?[eE][+-]?\d+$/.test(t)) return { kind: 'number', value: sign * Number(t) };
		return { kind: 'invalid' };
	}
	const mark = decimal ?? markEvidence(t);
	if (mark === null) {
		if (!/[.,]/.test(t)) return { kind: 'number', value: sign * Number(t) };
		const a = readWith(t, '.');
		const b = readWith(t, ',');
		if (a === null || b === null) {
			const v = a ?? b;
			return v === null ? { kind: 'invalid' } : { kind: 'number', value: sign * v };
		}
		return a === b ? { kind: 'number', value: sign * a } : { kind: 'ambiguous', readings: [sign * a, sign * b] };
	}
	const v = readWith(t, mark);
	return v === null ? { kind: 'invalid' } : { kind: 'number', value: sign * v };
}
