// Prices are kept in whole cents; the page shows them as money and edits them as dollars.
const money = new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD' });

export function formatCents(cents: number): string {
	return money.format(cents / 100);
}

export function centsToInput(cents: number): string {
	return `${Math.floor(cents / 100)}.${String(cents % 100).padStart(2, '0')}`;
}

export function formatQuantity(n: number): string {
	return n.toLocaleString('en-US', { maximumFractionDigits: 2 });
}
