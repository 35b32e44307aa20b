// Unit labels of the other system, found in a page's or a file's text. A metric farm must see
// no foot, pound, inch, ounce or °F; an imperial farm no metre, kilogram, centimetre, gram or °C.
// Which label belongs to which system: NIST Handbook 44, Appendix C (the US customary and the SI
// units of length, mass and temperature). Counts (bunches, heads, seeds, trays) belong to neither.

export type UnitSystem = 'imperial' | 'metric';

/** A number then the unit, or the unit in brackets, per line, or spelled out. */
const IMPERIAL: RegExp[] = [
	/°\s?F\b/,
	/\blbs?\b/,
	/\bft\b/,
	/\bfeet\b/,
	/\bfoot\b/,
	/\binch(es)?\b/,
	/\bpounds?\b/,
	/\boz\b/,
	/\bounces?\b/,
	/\d\s?in\b/,
	/\(in\)/,
	/\/in\b/,
	/\bacres?\b/
];

const METRIC: RegExp[] = [
	/°\s?C\b/,
	/\bkg\b/,
	/\d\s?g\b/,
	/\(g\)/,
	/\/g\b/,
	/\bgrams?\b/,
	/\bkilograms?\b/,
	/\bcm\b/,
	/\d\s?m\b/,
	/\(m\)/,
	/\/m\b/,
	/\bmetres?\b/,
	/\bmeters?\b/,
	/\bbed-metres?\b/,
	/\bhectares?\b/
];

/** Each line of `text` that holds a label of the other system, with what matched. */
export function foreignUnits(text: string, system: UnitSystem): string[] {
	const patterns = system === 'metric' ? IMPERIAL : METRIC;
	const out: string[] = [];
	for (const raw of text.split(/\r?\n/)) {
		const line = raw.trim();
		if (!line) continue;
		const hit = patterns.map((p) => line.match(p)).find((m) => m !== null);
		if (hit) out.push(`"${hit[0]}" in: ${line.length > 160 ? line.slice(0, 160) + '…' : line}`);
	}
	return out;
}
