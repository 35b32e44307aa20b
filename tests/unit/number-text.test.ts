// Numbers written as text, the way spreadsheets in different locales write them.
// Source: ECMA-402 Intl.NumberFormat (CLDR locale data) writes the reference texts below, so the
// separators checked are the ones real locales use, not ones we chose.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { detectDecimal, markEvidence, parseNumberText } from '$lib/schemas/number-text';
import { numberField } from '$lib/schemas/common';

const locales = { 'en-US': '.', 'de-DE': ',', 'fr-FR': ',', 'en-IN': '.', 'de-CH': '.' } as const;

describe('a file written in one locale reads back as the numbers it shows', () => {
	for (const [locale, mark] of Object.entries(locales)) {
		it(`${locale}: the decimal mark is found from the file, every value reads back exactly`, () => {
			fc.assert(
				fc.property(fc.array(fc.integer({ min: 0, max: 99_999_999 }), { minLength: 1, maxLength: 30 }), (cents) => {
					const nf = new Intl.NumberFormat(locale, {
						minimumFractionDigits: 2,
						maximumFractionDigits: 2,
						useGrouping: true
					});
					const texts = [...cents.map((c) => nf.format(c / 100)), nf.format(1.5)];
					expect(detectDecimal(texts)).toBe(mark);
					texts.forEach((t, i) => {
						const want = i < cents.length ? cents[i] / 100 : 1.5;
						expect(parseNumberText(t, mark as '.' | ',')).toEqual({ kind: 'number', value: want });
					});
				}),
				{ numRuns: 50 }
			);
		});
	}
});

describe('single values', () => {
	it('reads what can be read only one way, and names both readings of what cannot', () => {
		expect(parseNumberText('1,500.00')).toEqual({ kind: 'number', value: 1500 });
		expect(parseNumberText('1.500,5')).toEqual({ kind: 'number', value: 1500.5 });
		expect(parseNumberText('1,5')).toEqual({ kind: 'number', value: 1.5 });
		expect(parseNumberText('0,500')).toEqual({ kind: 'number', value: 0.5 });
		expect(parseNumberText('1,000,000')).toEqual({ kind: 'number', value: 1_000_000 });
		expect(parseNumberText('$0.90')).toEqual({ kind: 'number', value: 0.9 });
		expect(parseNumberText('-$1,234.50')).toEqual({ kind: 'number', value: -1234.5 });
		expect(parseNumberText('1\u202f000')).toEqual({ kind: 'number', value: 1000 });
		expect(parseNumberText('1,000')).toEqual({ kind: 'ambiguous', readings: [1000, 1] });
		expect(parseNumberText('1.000')).toEqual({ kind: 'ambiguous', readings: [1, 1000] });
		expect(parseNumberText('1,000', '.')).toEqual({ kind: 'number', value: 1000 });
		expect(parseNumberText('1,000', ',')).toEqual({ kind: 'number', value: 1 });
		expect(parseNumberText('1,0000', '.')).toEqual({ kind: 'invalid' });
		expect(parseNumberText('12abc')).toEqual({ kind: 'invalid' });
		expect(markEvidence('1,895')).toBeNull();
		expect(detectDecimal(['1,895', '35.00'])).toBe('.');
		expect(detectDecimal(['1.5', '2,5'])).toBe('mixed');
		expect(detectDecimal(['1,000', '42'])).toBeNull();
	});

	it('a form field refuses "1,000" naming both readings, rather than storing 1', () => {
		const out = numberField('Seeds per packet', 1, 1e7).safeParse('1,000');
		expect(out.success).toBe(false);
		expect(out.error!.issues[0].message).toMatch(/could be 1,000 or 1/);
		expect(numberField('Length', 0, 1e4).parse('2,5')).toBe(2.5);
		expect(numberField('Length', 0, 1e4).parse('1,000.0')).toBe(1000);
	});
});
