// Counted words: the plural category comes from Intl.PluralRules (Unicode CLDR plural rules for
// English: "one" for exactly 1, "other" for 0, 2 and fractions).
import { describe, expect, it } from 'vitest';
import { plural, pluralWord } from '../../src/lib/plural';

describe('plural', () => {
	it('says "1 tray", "1 packet", "1 seed per spot" and "2 trays"', () => {
		expect(plural(1, 'tray')).toBe('1 tray');
		expect(plural(2, 'tray')).toBe('2 trays');
		expect(plural(1, 'packet')).toBe('1 packet');
		expect(`${plural(1, 'seed')} per spot`).toBe('1 seed per spot');
		expect(`Imported ${plural(1, 'variety', 'varieties')}`).toBe('Imported 1 variety');
		expect(`Imported ${plural(3, 'variety', 'varieties')}`).toBe('Imported 3 varieties');
	});

	it('treats 0 and fractions as plural, as CLDR English does', () => {
		expect(plural(0, 'bed')).toBe('0 beds');
		expect(plural(1.5, 'lb', 'lb')).toBe('1.5 lb');
		expect(pluralWord(0.5, 'head')).toBe('heads');
		expect(new Intl.PluralRules('en-US').select(1)).toBe('one');
	});

	it('groups thousands', () => {
		expect(plural(4635, 'seed')).toBe('4,635 seeds');
	});
});
