// Dates as people and spreadsheets write them: ISO "2028-06-24", or numeric day, month and year in
// the order a locale writes them ("6/24/2028" in en-US, "24/06/2028" in en-GB, "24.06.2028" in
// de-DE). The order comes from Intl (CLDR data), never from a guess; a date whose day and month
// could swap is read the locale's way and said so.

export type DateText = { ok: true; iso: string; note?: string } | { ok: false; message: string };

const MONTHS = [
	'January',
	'February',
	'March',
	'April',
	'May',
	'June',
	'July',
	'August',
	'September',
	'October',
	'November',
	'December'
];

/** 'mdy', 'dmy' or 'ymd': the order of the numeric date fields in the locale's short date. */
export function dateOrder(locale: string): 'mdy' | 'dmy' | 'ymd' {
	try {
		const parts = new Intl.DateTimeFormat(locale, { year: 'numeric', month: 'numeric', day: 'numeric' }).formatToParts(
			new Date(Date.UTC(2028, 5, 24))
		);
		const order = parts
			.filter((p) => p.type === 'day' || p.type === 'month' || p.type === 'year')
			.map((p) => p.type[0])
			.join('');
		return order === 'mdy' || order === 'dmy' || order === 'ymd' ? order : 'ymd';
	} catch {
		return 'ymd';
	}
}

function real(y: number, m: number, d: number): string | null {
	const date = new Date(Date.UTC(y, m - 1, d));
	if (date.getUTCFullYear() !== y || date.getUTCMonth() !== m - 1 || date.getUTCDate() !== d) return null;
	return date.toISOString().slice(0, 10);
}

/** Reads a date as ISO or as `locale` writes it. Two-digit years are 20xx. */
export function readDateText(text: string, locale: string): DateText {
	const t = text.trim();
	const iso = /^(\d{4})-(\d{1,2})-(\d{1,2})$/.exec(t);
	if (iso) {
		const v = real(Number(iso[1]), Number(iso[2]), Number(iso[3]));
		return v ? { ok: true, iso: v } : { ok: false, message: `${t} is not a real calendar date.` };
	}
	const m = /^(\d{1,4})[/.-](\d{1,2})[/.-](\d{1,4})$/.exec(t);
	const order = dateOrder(locale);
	const how = order === 'mdy' ? 'month/day/year' : order === 'dmy' ? 'day/month/year' : 'year/month/day';
	if (!m) return { ok: false, message: `Write the date as YYYY-MM-DD or as ${locale} writes it (${how}).` };
	const [a, b, c] = [Number(m[1]), Number(m[2]), Number(m[3])];
	const year = (n: number): number => (n < 100 ? 2000 + n : n);
	const [y, mo, d] = order === 'mdy' ? [year(c), a, b] : order === 'dmy' ? [year(c), b, a] : [year(a), b, c];
	const v = real(y, mo, d);
	if (!v)
		return { ok: false, message: `${t} is not a real date when read as ${how} (${locale}); write it as YYYY-MM-DD.` };
	// Day and month both 12 or under, and different: the other order is a date too. Say which was read.
	const other = order !== 'ymd' && a <= 12 && b <= 12 && a !== b;
	return other
		? { ok: true, iso: v, note: `read as ${d} ${MONTHS[mo - 1]} ${y} (${how}, as ${locale} writes dates)` }
		: { ok: true, iso: v };
}
