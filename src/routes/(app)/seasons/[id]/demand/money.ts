// Prices are kept in whole cents; the share form edits them as a decimal amount.
export function centsToInput(cents: number): string {
	return `${Math.floor(cents / 100)}.${String(cents % 100).padStart(2, '0')}`;
}
