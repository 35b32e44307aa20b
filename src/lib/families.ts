// Crop families keep one colour everywhere (grid, bed timeline, charts): the Okabe–Ito
// colour-blind-safe palette (Okabe & Ito, Color Universal Design, 2008). Colour never stands
// alone: each family also has a short label and an SVG hatch pattern.
export interface FamilyStyle {
	family: string;
	/** Short label printed with the colour, e.g. on bars and legends. */
	short: string;
	colour: string;
	/** Text colour that keeps contrast on `colour`. */
	ink: string;
	/** Hatch for SVG: angle in degrees, or null for solid. */
	hatch: number | null;
}

const palette: FamilyStyle[] = [
	{ family: 'Apiaceae', short: 'Api', colour: '#E69F00', ink: '#000000', hatch: null },
	{ family: 'Amaranthaceae', short: 'Ama', colour: '#D55E00', ink: '#000000', hatch: 45 },
	{ family: 'Brassicaceae', short: 'Bra', colour: '#009E73', ink: '#000000', hatch: null },
	{ family: 'Asteraceae', short: 'Ast', colour: '#56B4E9', ink: '#000000', hatch: null },
	{ family: 'Solanaceae', short: 'Sol', colour: '#CC79A7', ink: '#000000', hatch: null },
	{ family: 'Cucurbitaceae', short: 'Cuc', colour: '#F0E442', ink: '#000000', hatch: -45 },
	{ family: 'Fabaceae', short: 'Fab', colour: '#0072B2', ink: '#ffffff', hatch: null },
	{ family: 'Amaryllidaceae', short: 'Amy', colour: '#000000', ink: '#ffffff', hatch: null },
	{ family: 'Lamiaceae', short: 'Lam', colour: '#56B4E9', ink: '#000000', hatch: 45 },
	{ family: 'Poaceae', short: 'Poa', colour: '#E69F00', ink: '#000000', hatch: -45 }
];

const fallback: Omit<FamilyStyle, 'family' | 'short'> = { colour: '#999999', ink: '#000000', hatch: 90 };
const byName = new Map(palette.map((p) => [p.family.toLowerCase(), p]));

/** The style of a botanical family; unknown families get grey with a vertical hatch. */
export function familyStyle(family: string): FamilyStyle {
	return byName.get(family.trim().toLowerCase()) ?? { family, short: family.slice(0, 3), ...fallback };
}
