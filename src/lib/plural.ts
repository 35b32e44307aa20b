// Counted words: "1 tray", "2 trays", "1 seed per spot", "Imported 1 variety". English plural
// categories come from Intl.PluralRules (Unicode CLDR), so 1 is "one" and 0, 1.5 and 2 are "other".
const rules = new Intl.PluralRules('en-US');
const numbers = new Intl.NumberFormat('en-US', { maximumFractionDigits: 2 });

/** The word for a count: `word` for one, `many` (default: word + "s") otherwise. */
export function pluralWord(n: number, word: string, many = `${word}s`): string {
	return rules.select(n) === 'one' ? word : many;
}

/** The count with its word, the count formatted with thousands separators: "1 tray", "4,635 seeds". */
export function plural(n: number, word: string, many?: string): string {
	return `${numbers.format(n)} ${pluralWord(n, word, many)}`;
}
