/**
 * The demo farm: an INVENTED market garden for trying Furrowcast out.
 *
 * Every name, person, variety and figure below is made up for this demo. The figures are
 * only meant to be plausible for a small northeastern US market garden near 42.5° N
 * (last spring frost ~10 May, first fall frost ~5 October); none comes from a real farm,
 * seed catalogue or published dataset, and none should be planted by.
 *
 * `seedDemoFarm` writes it all in one transaction: the farm and its normal weekly
 * temperatures, blocks and beds, the crop library, three users (one per role), a short
 * 2026 season whose late-fall plantings make "this week" (early December 2026) non-empty,
 * and the 2027 season: farm-share sizes, box contents, market and restaurant demand and
 * the plantings that the planning engine lays out against that demand.
 */
import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { hashPassword } from '../../src/lib/server/password';
import { plantingRow } from '../../src/lib/planting-row';
import { engineFarm, plantingSeed, toEngineVariety as engineVariety } from '../../src/lib/engine-inputs';
import type { VarietyView } from '../../src/lib/types';
import { storeSupply } from '../../src/lib/planning/storage';
import { previousFamiliesByBed, seasonPlanOptions } from '../../src/lib/plan-options';
import {
	type Farm,
	type KeptPlanting,
	type SeasonPlan,
	type SeasonVariety,
	type VarietyShare as EngineVarietyShare,
	derivePlanting,
	deriveTargets,
	forecast,
	planSeason
} from '../../src/lib/planning/index';

export type HarvestUnit = 'lb' | 'bunch' | 'head' | 'each';
export type Method = 'direct' | 'transplant';
export type Role = 'owner' | 'crew_lead' | 'share_manager';

// ---------------------------------------------------------------------------------------
// Farm, people, ground
// ---------------------------------------------------------------------------------------

export const DEMO_FARM = {
	name: 'Wrenfield Market Garden (invented demo)',
	time_zone: 'America/New_York',
	latitude: 42.5,
	unit_system: 'imperial',
	last_spring_frost: '2027-05-10',
	first_fall_frost: '2027-10-05',
	bed_foot_increment: 1,
	turnaround_days: 7,
	// Frost dates are 50 % normals; tender crops go out a week after the last spring frost; rotation
	// keeps a family off a bed it held in the last three years.
	frost_probability_pct: 50,
	tender_days_after_frost: 7,
	rotation_years: 3
} as const;

/** One password for all demo accounts, so a visitor can sign in as any role. */
export const DEMO_PASSWORD = 'demo-harvest-2027';

export interface DemoUser {
	email: string;
	name: string;
	role: Role;
}

export const DEMO_USERS: readonly DemoUser[] = [
	{ email: 'owner@demo.furrowcast.test', name: 'Ada Fenwick (demo owner)', role: 'owner' },
	{ email: 'crew@demo.furrowcast.test', name: 'Tomas Hale (demo crew lead)', role: 'crew_lead' },
	{ email: 'share@demo.furrowcast.test', name: 'Priya Lund (demo share manager)', role: 'share_manager' }
];

export const DEMO_OWNER_EMAIL = DEMO_USERS[0].email;

/**
 * A second copy of the demo, beside the first: `tag` keeps its people apart
 * (owner@metric.demo.furrowcast.test) and `unitSystem` sets the farm's units. The tests
 * that read every page and file in metric and in imperial use one.
 */
export interface DemoVariant {
	tag?: string;
	unitSystem?: 'imperial' | 'metric';
}

/** The demo users of a variant: the same people, their addresses under the variant's tag. */
export function demoUsers(variant: DemoVariant = {}): DemoUser[] {
	return DEMO_USERS.map((u) => ({
		...u,
		email: variant.tag ? u.email.replace('@demo.', `@${variant.tag}.demo.`) : u.email
	}));
}

/**
 * Invented normal weekly mean air temperature (°F) for ISO week 1–53: a cosine from
 * 22 °F in week 4 (late January) to 72 °F in week 30 (late July). Smooth on purpose —
 * a real normal is bumpier, but the demo only needs heat checks and degree days to bite.
 */
export function demoWeeklyTempF(week: number): number {
	const t = 47 - 25 * Math.cos((2 * Math.PI * (week - 4)) / 52);
	return Math.round(t * 10) / 10;
}

export const DEMO_WEEKLY_TEMPS: readonly { week_number: number; mean_temp_f: number }[] = Array.from(
	{ length: 53 },
	(_, i) => ({ week_number: i + 1, mean_temp_f: demoWeeklyTempF(i + 1) })
);

export interface DemoBlock {
	name: string;
	/** Bed-name prefix, e.g. "N" → N01, N02… */
	prefix: string;
	beds: number;
}

export const DEMO_BLOCKS: readonly DemoBlock[] = [
	{ name: 'North', prefix: 'N', beds: 14 },
	{ name: 'Middle', prefix: 'M', beds: 13 },
	{ name: 'South', prefix: 'S', beds: 13 }
];

/** Every demo bed is a standard 100 ft × 30 in bed. */
export const DEMO_BED_LENGTH_FT = 100;
export const DEMO_BED_WIDTH_IN = 30;

export interface DemoBed {
	block: string;
	name: string;
	position: number;
}

export const DEMO_BEDS: readonly DemoBed[] = DEMO_BLOCKS.flatMap((b) =>
	Array.from({ length: b.beds }, (_, i) => ({
		block: b.name,
		name: `${b.prefix}${String(i + 1).padStart(2, '0')}`,
		position: i + 1
	}))
);

// ---------------------------------------------------------------------------------------
// Crop library (invented variety names; figures are per bed-foot of a 30-in bed)
// ---------------------------------------------------------------------------------------

export interface DemoCrop {
	name: string;
	family: string;
	harvest_unit: HarvestUnit;
	frost_tolerance: 'tender' | 'hardy';
	/** Weekly mean °F above which the crop bolts or turns bitter; null when heat is no worry. */
	heat_limit_f: number | null;
	/** Degree-day base: 40 °F for cool-season crops, 50 °F for warm-season ones. */
	base_temp_f: number;
	/** How the yield spreads over the harvest window (see src/lib/planning/harvest-curve.ts). */
	harvest_curve: 'flat' | 'ramp' | 'single' | 'cuts';
	harvest_cut_interval_days: number | null;
	/** Storage crops: weeks a harvest keeps, and the share lost each week in store. */
	storage_weeks?: number | null;
	storage_loss_per_week?: number | null;
	/** Earliest and latest field date in the year, "MM-DD" (both or neither). */
	sow_from?: string | null;
	sow_to?: string | null;
}

// Harvest curves (common practice, no published source): fruiting crops are picked in a ramp,
// a peak and a tail; heads, bunched roots, scallions and cilantro are cut once when ready; salad
// mix, spinach, arugula and dill regrow and are cut again two weeks later; kale, chard and basil
// are picked about evenly every week of their window.
export const DEMO_CROPS: readonly DemoCrop[] = [
	{
		name: 'Carrot',
		family: 'Apiaceae',
		harvest_unit: 'lb',
		frost_tolerance: 'hardy',
		heat_limit_f: null,
		base_temp_f: 40,
		harvest_curve: 'single',
		harvest_cut_interval_days: null
	},
	{
		name: 'Beet',
		family: 'Amaranthaceae',
		harvest_unit: 'bunch',
		frost_tolerance: 'hardy',
		heat_limit_f: null,
		base_temp_f: 40,
		harvest_curve: 'single',
		harvest_cut_interval_days: null
	},
	{
		name: 'Radish',
		family: 'Brassicaceae',
		harvest_unit: 'bunch',
		frost_tolerance: 'hardy',
		heat_limit_f: 75,
		base_temp_f: 40,
		harvest_curve: 'single',
		harvest_cut_interval_days: null
	},
	{
		name: 'Head lettuce',
		family: 'Asteraceae',
		harvest_unit: 'head',
		frost_tolerance: 'hardy',
		heat_limit_f: 80,
		base_temp_f: 40,
		harvest_curve: 'single',
		harvest_cut_interval_days: null
	},
	{
		name: 'Salad mix',
		family: 'Asteraceae',
		harvest_unit: 'lb',
		frost_tolerance: 'hardy',
		heat_limit_f: 75,
		base_temp_f: 40,
		harvest_curve: 'cuts',
		harvest_cut_interval_days: 14
	},
	{
		name: 'Spinach',
		family: 'Amaranthaceae',
		harvest_unit: 'lb',
		frost_tolerance: 'hardy',
		heat_limit_f: 72,
		base_temp_f: 40,
		harvest_curve: 'cuts',
		harvest_cut_interval_days: 14
	},
	{
		name: 'Arugula',
		family: 'Brassicaceae',
		harvest_unit: 'lb',
		frost_tolerance: 'hardy',
		heat_limit_f: 72,
		base_temp_f: 40,
		harvest_curve: 'cuts',
		harvest_cut_interval_days: 14
	},
	{
		name: 'Kale',
		family: 'Brassicaceae',
		harvest_unit: 'bunch',
		frost_tolerance: 'hardy',
		heat_limit_f: null,
		base_temp_f: 40,
		harvest_curve: 'flat',
		harvest_cut_interval_days: null
	},
	{
		name: 'Chard',
		family: 'Amaranthaceae',
		harvest_unit: 'bunch',
		frost_tolerance: 'hardy',
		heat_limit_f: null,
		base_temp_f: 40,
		harvest_curve: 'flat',
		harvest_cut_interval_days: null
	},
	{
		name: 'Cilantro',
		family: 'Apiaceae',
		harvest_unit: 'bunch',
		frost_tolerance: 'hardy',
		heat_limit_f: 75,
		base_temp_f: 40,
		harvest_curve: 'single',
		harvest_cut_interval_days: null
	},
	{
		name: 'Dill',
		family: 'Apiaceae',
		harvest_unit: 'bunch',
		frost_tolerance: 'hardy',
		heat_limit_f: null,
		base_temp_f: 40,
		harvest_curve: 'cuts',
		harvest_cut_interval_days: 14
	},
	{
		name: 'Basil',
		family: 'Lamiaceae',
		harvest_unit: 'bunch',
		frost_tolerance: 'tender',
		heat_limit_f: null,
		base_temp_f: 50,
		harvest_curve: 'flat',
		harvest_cut_interval_days: null
	},
	{
		name: 'Scallion',
		family: 'Amaryllidaceae',
		harvest_unit: 'bunch',
		frost_tolerance: 'hardy',
		heat_limit_f: null,
		base_temp_f: 40,
		harvest_curve: 'single',
		harvest_cut_interval_days: null
	},
	{
		name: 'Onion',
		family: 'Amaryllidaceae',
		harvest_unit: 'lb',
		frost_tolerance: 'hardy',
		heat_limit_f: null,
		base_temp_f: 40,
		harvest_curve: 'single',
		harvest_cut_interval_days: null
	},
	{
		name: 'Garlic',
		family: 'Amaryllidaceae',
		harvest_unit: 'head',
		frost_tolerance: 'hardy',
		heat_limit_f: null,
		base_temp_f: 40,
		harvest_curve: 'single',
		harvest_cut_interval_days: null,
		// Cured and kept: dug in July, it feeds the boxes into the autumn (invented demo figures).
		storage_weeks: 24,
		storage_loss_per_week: 0.01,
		// Cloves go in during the autumn, a few weeks before the ground freezes, for a July harvest
		// (common practice, no published source); never in spring.
		sow_from: '10-01',
		sow_to: '12-15'
	},
	{
		name: 'Tomato',
		family: 'Solanaceae',
		harvest_unit: 'lb',
		frost_tolerance: 'tender',
		heat_limit_f: null,
		base_temp_f: 50,
		harvest_curve: 'ramp',
		harvest_cut_interval_days: null
	},
	{
		name: 'Pepper',
		family: 'Solanaceae',
		harvest_unit: 'lb',
		frost_tolerance: 'tender',
		heat_limit_f: null,
		base_temp_f: 50,
		harvest_curve: 'ramp',
		harvest_cut_interval_days: null
	},
	{
		name: 'Cucumber',
		family: 'Cucurbitaceae',
		harvest_unit: 'each',
		frost_tolerance: 'tender',
		heat_limit_f: null,
		base_temp_f: 50,
		harvest_curve: 'ramp',
		harvest_cut_interval_days: null
	},
	{
		name: 'Summer squash',
		family: 'Cucurbitaceae',
		harvest_unit: 'lb',
		frost_tolerance: 'tender',
		heat_limit_f: null,
		base_temp_f: 50,
		harvest_curve: 'ramp',
		harvest_cut_interval_days: null
	},
	{
		name: 'Bush bean',
		family: 'Fabaceae',
		harvest_unit: 'lb',
		frost_tolerance: 'tender',
		heat_limit_f: null,
		base_temp_f: 50,
		harvest_curve: 'ramp',
		harvest_cut_interval_days: null
	}
];

export interface DemoVariety {
	crop: string;
	name: string;
	method: Method;
	/** From sowing (direct) or from transplanting (transplant) to first harvest. */
	days_to_maturity: number;
	days_in_tray: number;
	harvest_window_days: number;
	/** Harvest units per bed-foot over the whole window (all rows of the bed). */
	yield_per_bed_foot: number;
	rows_per_bed: number;
	in_row_spacing_in: number;
	seeds_per_spot: number;
	germination_rate: number;
	seeds_per_gram: number;
	seed_price_cents_per_gram: number;
	seeds_per_packet: number | null;
	cells_per_tray: number;
	margin: number;
	gdd_to_maturity: number | null;
}

type VarietyFigures = Omit<
	DemoVariety,
	'crop' | 'name' | 'method' | 'days_in_tray' | 'cells_per_tray' | 'seeds_per_packet' | 'gdd_to_maturity'
> &
	Partial<Pick<DemoVariety, 'seeds_per_packet' | 'gdd_to_maturity'>>;

/** Direct-sown: no tray; cells_per_tray keeps the column's default, it is never read. */
function direct(crop: string, name: string, f: VarietyFigures): DemoVariety {
	return {
		crop,
		name,
		method: 'direct',
		days_in_tray: 0,
		cells_per_tray: 128,
		seeds_per_packet: null,
		gdd_to_maturity: null,
		...f
	};
}

function transplant(
	crop: string,
	name: string,
	tray: { days: number; cells: 72 | 128 | 200 },
	f: VarietyFigures
): DemoVariety {
	return {
		crop,
		name,
		method: 'transplant',
		days_in_tray: tray.days,
		cells_per_tray: tray.cells,
		seeds_per_packet: null,
		gdd_to_maturity: null,
		...f
	};
}

// Yields are whole-window totals per bed-foot, on the generous side of a well-run
// intensive garden: e.g. carrots in 4 rows at ~0.6 lb per row-foot give ~2.5 lb per
// bed-foot; kale at 2 rows × 18 in is ~1.3 plants per bed-foot, each picked for a bunch
// most weeks of a ten-week window.
export const DEMO_VARIETIES: readonly DemoVariety[] = [
	direct('Carrot', 'Long Amber', {
		days_to_maturity: 70,
		harvest_window_days: 21,
		yield_per_bed_foot: 2.5,
		rows_per_bed: 4,
		in_row_spacing_in: 1,
		seeds_per_spot: 1,
		germination_rate: 0.75,
		seeds_per_gram: 800,
		seed_price_cents_per_gram: 90,
		seeds_per_packet: 1500,
		margin: 0.15
	}),
	direct('Carrot', 'Cellar Stout', {
		days_to_maturity: 85,
		harvest_window_days: 35,
		yield_per_bed_foot: 3.0,
		rows_per_bed: 4,
		in_row_spacing_in: 1.5,
		seeds_per_spot: 1,
		germination_rate: 0.75,
		seeds_per_gram: 750,
		seed_price_cents_per_gram: 70,
		seeds_per_packet: 1500,
		margin: 0.15
	}),
	transplant(
		'Beet',
		'Early Red Ball',
		{ days: 21, cells: 128 },
		{
			days_to_maturity: 40,
			harvest_window_days: 14,
			yield_per_bed_foot: 3.0,
			rows_per_bed: 4,
			in_row_spacing_in: 6,
			seeds_per_spot: 3,
			germination_rate: 0.85,
			seeds_per_gram: 60,
			seed_price_cents_per_gram: 25,
			seeds_per_packet: 250,
			margin: 0.1
		}
	),
	direct('Beet', 'Cellar Garnet', {
		days_to_maturity: 60,
		harvest_window_days: 21,
		yield_per_bed_foot: 3,
		rows_per_bed: 4,
		in_row_spacing_in: 3,
		seeds_per_spot: 1,
		germination_rate: 0.8,
		seeds_per_gram: 55,
		seed_price_cents_per_gram: 20,
		seeds_per_packet: 300,
		margin: 0.15
	}),
	direct('Radish', 'Quick Crimson', {
		days_to_maturity: 28,
		harvest_window_days: 7,
		yield_per_bed_foot: 4.0,
		rows_per_bed: 6,
		in_row_spacing_in: 1,
		seeds_per_spot: 1,
		germination_rate: 0.9,
		seeds_per_gram: 90,
		seed_price_cents_per_gram: 10,
		seeds_per_packet: 500,
		margin: 0.1
	}),
	transplant(
		'Radish',
		'Pearl Drop',
		{ days: 10, cells: 200 },
		{
			days_to_maturity: 24,
			harvest_window_days: 7,
			yield_per_bed_foot: 3.5,
			rows_per_bed: 5,
			in_row_spacing_in: 4,
			seeds_per_spot: 4,
			germination_rate: 0.9,
			seeds_per_gram: 85,
			seed_price_cents_per_gram: 12,
			seeds_per_packet: 500,
			margin: 0.1
		}
	),
	transplant(
		'Head lettuce',
		'Butter Lantern',
		{ days: 28, cells: 128 },
		{
			days_to_maturity: 42,
			harvest_window_days: 10,
			yield_per_bed_foot: 2.7,
			rows_per_bed: 3,
			in_row_spacing_in: 12,
			seeds_per_spot: 1,
			germination_rate: 0.9,
			seeds_per_gram: 800,
			seed_price_cents_per_gram: 250,
			seeds_per_packet: 1000,
			margin: 0.15
		}
	),
	transplant(
		'Head lettuce',
		'Rust Oakleaf',
		{ days: 28, cells: 128 },
		{
			days_to_maturity: 45,
			harvest_window_days: 10,
			yield_per_bed_foot: 2.7,
			rows_per_bed: 3,
			in_row_spacing_in: 12,
			seeds_per_spot: 1,
			germination_rate: 0.9,
			seeds_per_gram: 850,
			seed_price_cents_per_gram: 220,
			seeds_per_packet: 1000,
			margin: 0.15
		}
	),
	// A summer crisp type: slower, but holds longer in heat.
	transplant(
		'Head lettuce',
		'Summer Crisp Ridge',
		{ days: 28, cells: 128 },
		{
			days_to_maturity: 50,
			harvest_window_days: 14,
			yield_per_bed_foot: 2.6,
			rows_per_bed: 3,
			in_row_spacing_in: 12,
			seeds_per_spot: 1,
			germination_rate: 0.88,
			seeds_per_gram: 800,
			seed_price_cents_per_gram: 240,
			seeds_per_packet: 1000,
			margin: 0.15
		}
	),
	direct('Salad mix', 'Meadow Cut Mix', {
		days_to_maturity: 30,
		harvest_window_days: 14,
		yield_per_bed_foot: 1.0,
		rows_per_bed: 6,
		in_row_spacing_in: 0.5,
		seeds_per_spot: 1,
		germination_rate: 0.85,
		seeds_per_gram: 800,
		seed_price_cents_per_gram: 150,
		seeds_per_packet: 2000,
		margin: 0.15
	}),
	direct('Salad mix', 'Autumn Tapestry Mix', {
		days_to_maturity: 35,
		harvest_window_days: 14,
		yield_per_bed_foot: 0.9,
		rows_per_bed: 6,
		in_row_spacing_in: 0.5,
		seeds_per_spot: 1,
		germination_rate: 0.85,
		seeds_per_gram: 850,
		seed_price_cents_per_gram: 160,
		seeds_per_packet: 2000,
		margin: 0.15
	}),
	direct('Spinach', 'Broadleaf Dawn', {
		days_to_maturity: 40,
		harvest_window_days: 14,
		yield_per_bed_foot: 0.8,
		rows_per_bed: 5,
		in_row_spacing_in: 1.5,
		seeds_per_spot: 1,
		germination_rate: 0.85,
		seeds_per_gram: 90,
		seed_price_cents_per_gram: 15,
		seeds_per_packet: 500,
		margin: 0.15
	}),
	direct('Spinach', 'Cold Frame Savoy', {
		days_to_maturity: 45,
		harvest_window_days: 21,
		yield_per_bed_foot: 0.9,
		rows_per_bed: 5,
		in_row_spacing_in: 1.5,
		seeds_per_spot: 1,
		germination_rate: 0.85,
		seeds_per_gram: 85,
		seed_price_cents_per_gram: 18,
		seeds_per_packet: 500,
		margin: 0.15
	}),
	direct('Arugula', 'Peppery Lace', {
		days_to_maturity: 30,
		harvest_window_days: 14,
		yield_per_bed_foot: 0.75,
		rows_per_bed: 6,
		in_row_spacing_in: 1,
		seeds_per_spot: 1,
		germination_rate: 0.9,
		seeds_per_gram: 500,
		seed_price_cents_per_gram: 20,
		seeds_per_packet: 1000,
		margin: 0.1
	}),
	transplant(
		'Kale',
		'Curled Fog',
		{ days: 35, cells: 72 },
		{
			days_to_maturity: 50,
			harvest_window_days: 70,
			yield_per_bed_foot: 8,
			rows_per_bed: 2,
			in_row_spacing_in: 18,
			seeds_per_spot: 1,
			germination_rate: 0.9,
			seeds_per_gram: 300,
			seed_price_cents_per_gram: 120,
			seeds_per_packet: 300,
			margin: 0.15
		}
	),
	transplant(
		'Kale',
		'Slate Leaf',
		{ days: 35, cells: 72 },
		{
			days_to_maturity: 55,
			harvest_window_days: 56,
			yield_per_bed_foot: 7,
			rows_per_bed: 2,
			in_row_spacing_in: 18,
			seeds_per_spot: 1,
			germination_rate: 0.9,
			seeds_per_gram: 280,
			seed_price_cents_per_gram: 110,
			seeds_per_packet: 300,
			margin: 0.15
		}
	),
	transplant(
		'Chard',
		'Painted Stem',
		{ days: 28, cells: 128 },
		{
			days_to_maturity: 50,
			harvest_window_days: 56,
			yield_per_bed_foot: 8,
			rows_per_bed: 2,
			in_row_spacing_in: 12,
			seeds_per_spot: 1,
			germination_rate: 0.8,
			seeds_per_gram: 60,
			seed_price_cents_per_gram: 30,
			seeds_per_packet: 250,
			margin: 0.15
		}
	),
	direct('Cilantro', 'Slow Leaf', {
		days_to_maturity: 45,
		harvest_window_days: 14,
		yield_per_bed_foot: 3,
		rows_per_bed: 4,
		in_row_spacing_in: 2,
		seeds_per_spot: 2,
		germination_rate: 0.75,
		seeds_per_gram: 70,
		seed_price_cents_per_gram: 5,
		seeds_per_packet: 500,
		margin: 0.15
	}),
	direct('Dill', 'Feather Bouquet', {
		days_to_maturity: 50,
		harvest_window_days: 21,
		yield_per_bed_foot: 3,
		rows_per_bed: 3,
		in_row_spacing_in: 4,
		seeds_per_spot: 2,
		germination_rate: 0.7,
		seeds_per_gram: 700,
		seed_price_cents_per_gram: 10,
		seeds_per_packet: 500,
		margin: 0.15
	}),
	transplant(
		'Basil',
		'Green Cathedral',
		{ days: 35, cells: 128 },
		{
			days_to_maturity: 30,
			harvest_window_days: 63,
			yield_per_bed_foot: 8,
			rows_per_bed: 3,
			in_row_spacing_in: 10,
			seeds_per_spot: 2,
			germination_rate: 0.85,
			seeds_per_gram: 650,
			seed_price_cents_per_gram: 80,
			seeds_per_packet: 500,
			margin: 0.15
		}
	),
	// Multi-sown: 5 seeds a cell, planted out as a clump.
	transplant(
		'Scallion',
		'Pencil Green',
		{ days: 42, cells: 128 },
		{
			days_to_maturity: 50,
			harvest_window_days: 14,
			yield_per_bed_foot: 5,
			rows_per_bed: 4,
			in_row_spacing_in: 4,
			seeds_per_spot: 5,
			germination_rate: 0.85,
			seeds_per_gram: 300,
			seed_price_cents_per_gram: 60,
			seeds_per_packet: 1000,
			margin: 0.1
		}
	),
	// Sold fresh with tops through late summer; the demo leaves storage onions out, since a
	// flat harvest window would hold the bed through the months they sit in the barn.
	transplant(
		'Onion',
		'Copper Keeper',
		{ days: 56, cells: 200 },
		{
			days_to_maturity: 100,
			harvest_window_days: 21,
			yield_per_bed_foot: 3.5,
			rows_per_bed: 4,
			in_row_spacing_in: 4,
			seeds_per_spot: 1,
			germination_rate: 0.85,
			seeds_per_gram: 250,
			seed_price_cents_per_gram: 90,
			seeds_per_packet: 1000,
			margin: 0.1
		}
	),
	// Planted as cloves in late fall; a clove weighs ~5 g, hence 0.2 "seeds" per gram.
	// Garlic's clock is its degree days (base 40 °F), which stand still through the winter: a clove
	// planted late October and one planted early December are both dug in July. 1,585 °F·days is about
	// what the demo's invented weekly normals give from 3 December to 12 July.
	direct('Garlic', 'Hardneck Blush', {
		days_to_maturity: 240,
		gdd_to_maturity: 1585,
		harvest_window_days: 14,
		yield_per_bed_foot: 7,
		rows_per_bed: 4,
		in_row_spacing_in: 6,
		seeds_per_spot: 1,
		germination_rate: 0.95,
		seeds_per_gram: 0.2,
		seed_price_cents_per_gram: 3,
		margin: 0.1
	}),
	transplant(
		'Tomato',
		'Scarlet Ledger',
		{ days: 49, cells: 72 },
		{
			days_to_maturity: 70,
			harvest_window_days: 63,
			yield_per_bed_foot: 8,
			rows_per_bed: 1,
			in_row_spacing_in: 18,
			seeds_per_spot: 1,
			germination_rate: 0.9,
			seeds_per_gram: 300,
			seed_price_cents_per_gram: 2500,
			seeds_per_packet: 25,
			margin: 0.15,
			gdd_to_maturity: 1150
		}
	),
	transplant(
		'Tomato',
		'Honey Marble',
		{ days: 49, cells: 72 },
		{
			days_to_maturity: 60,
			harvest_window_days: 70,
			yield_per_bed_foot: 6,
			rows_per_bed: 1,
			in_row_spacing_in: 24,
			seeds_per_spot: 1,
			germination_rate: 0.9,
			seeds_per_gram: 320,
			seed_price_cents_per_gram: 3000,
			seeds_per_packet: 25,
			margin: 0.15,
			gdd_to_maturity: 1000
		}
	),
	transplant(
		'Pepper',
		'Ember Bell',
		{ days: 56, cells: 72 },
		{
			days_to_maturity: 75,
			harvest_window_days: 56,
			yield_per_bed_foot: 3,
			rows_per_bed: 2,
			in_row_spacing_in: 18,
			seeds_per_spot: 1,
			germination_rate: 0.8,
			seeds_per_gram: 160,
			seed_price_cents_per_gram: 2000,
			seeds_per_packet: 25,
			margin: 0.15
		}
	),
	transplant(
		'Cucumber',
		'Crisp Rail',
		{ days: 21, cells: 72 },
		{
			days_to_maturity: 50,
			harvest_window_days: 35,
			yield_per_bed_foot: 10,
			rows_per_bed: 1,
			in_row_spacing_in: 12,
			seeds_per_spot: 1,
			germination_rate: 0.9,
			seeds_per_gram: 35,
			seed_price_cents_per_gram: 400,
			seeds_per_packet: 30,
			margin: 0.15,
			gdd_to_maturity: 850
		}
	),
	transplant(
		'Summer squash',
		'Gold Baton',
		{ days: 21, cells: 72 },
		{
			days_to_maturity: 45,
			harvest_window_days: 35,
			yield_per_bed_foot: 8,
			rows_per_bed: 1,
			in_row_spacing_in: 24,
			seeds_per_spot: 1,
			germination_rate: 0.9,
			seeds_per_gram: 8,
			seed_price_cents_per_gram: 150,
			seeds_per_packet: 30,
			margin: 0.15,
			gdd_to_maturity: 750
		}
	),
	direct('Bush bean', 'Slender Meadow', {
		days_to_maturity: 55,
		harvest_window_days: 21,
		yield_per_bed_foot: 1.8,
		rows_per_bed: 2,
		in_row_spacing_in: 3,
		seeds_per_spot: 1,
		germination_rate: 0.85,
		seeds_per_gram: 4,
		seed_price_cents_per_gram: 2,
		seeds_per_packet: 250,
		margin: 0.1
	}),
	direct('Bush bean', 'Butter Lane Wax', {
		days_to_maturity: 58,
		harvest_window_days: 21,
		yield_per_bed_foot: 1.6,
		rows_per_bed: 2,
		in_row_spacing_in: 3,
		seeds_per_spot: 1,
		germination_rate: 0.85,
		seeds_per_gram: 4,
		seed_price_cents_per_gram: 3,
		seeds_per_packet: 250,
		margin: 0.1
	})
];

// ---------------------------------------------------------------------------------------
// 2027: seasons, farm share, other channels
// ---------------------------------------------------------------------------------------

export const DEMO_SEASONS = [
	// A short season only so the "this week" overview of early December 2026 has work in it.
	{ year: 2026, name: '2026 season', starts_on: '2026-01-01', ends_on: '2026-12-31' },
	{ year: 2027, name: '2027 season', starts_on: '2027-01-01', ends_on: '2027-12-31' }
] as const;

export const DEMO_PLAN_YEAR = 2027;

export interface DemoShareSize {
	name: 'Full share' | 'Half share';
	members: number;
	first_week: string;
	last_week: string;
	pickup_days: string;
	price_cents: number;
}

export const DEMO_SHARE_SIZES: readonly DemoShareSize[] = [
	{
		name: 'Full share',
		members: 60,
		first_week: '2027-W24',
		last_week: '2027-W43',
		pickup_days: 'Tue, Fri',
		price_cents: 72_000
	},
	{
		name: 'Half share',
		members: 40,
		first_week: '2027-W24',
		last_week: '2027-W43',
		pickup_days: 'Tue, Fri',
		price_cents: 42_000
	}
];

/**
 * Box contents as runs of ISO weeks (week numbers of 2027): in weeks `from`…`to`, every
 * `every` weeks, each full share gets `full` and each half share `half` of the crop's
 * harvest unit (0 = not in that box). Crops come and go as they would in the field:
 * spring greens, a midsummer gap for salad mix and spinach (heat), fruiting crops from
 * late July, storage crops into October.
 */
interface BoxRun {
	crop: string;
	from: number;
	to: number;
	every?: 1 | 2;
	full: number;
	half: number;
}

const BOX_RUNS: readonly BoxRun[] = [
	{ crop: 'Salad mix', from: 24, to: 28, full: 0.5, half: 0.25 },
	{ crop: 'Salad mix', from: 34, to: 43, every: 2, full: 0.5, half: 0 },
	{ crop: 'Salad mix', from: 35, to: 43, every: 2, full: 0, half: 0.5 },
	{ crop: 'Head lettuce', from: 24, to: 40, every: 2, full: 1, half: 0 },
	{ crop: 'Head lettuce', from: 25, to: 40, every: 2, full: 0, half: 1 },
	{ crop: 'Radish', from: 24, to: 27, full: 1, half: 0 },
	{ crop: 'Radish', from: 25, to: 27, every: 2, full: 0, half: 1 },
	{ crop: 'Radish', from: 36, to: 41, every: 2, full: 1, half: 0 },
	{ crop: 'Radish', from: 37, to: 41, every: 2, full: 0, half: 1 },
	{ crop: 'Spinach', from: 24, to: 26, full: 0.5, half: 0.25 },
	{ crop: 'Spinach', from: 38, to: 43, every: 2, full: 0.5, half: 0 },
	{ crop: 'Spinach', from: 39, to: 43, every: 2, full: 0, half: 0.5 },
	{ crop: 'Arugula', from: 25, to: 27, every: 2, full: 0.25, half: 0 },
	{ crop: 'Arugula', from: 37, to: 43, every: 2, full: 0.25, half: 0 },
	{ crop: 'Scallion', from: 24, to: 33, every: 2, full: 1, half: 0 },
	{ crop: 'Scallion', from: 25, to: 33, every: 2, full: 0, half: 1 },
	{ crop: 'Cilantro', from: 25, to: 27, every: 2, full: 1, half: 0 },
	{ crop: 'Cilantro', from: 37, to: 41, every: 2, full: 1, half: 0 },
	// Leaf crops picked evenly every week go into the boxes in even weekly amounts: a picked
	// bed cannot follow a box that wants twice as much one week as the next.
	{ crop: 'Kale', from: 26, to: 43, full: 1, half: 1 },
	{ crop: 'Chard', from: 28, to: 41, full: 1, half: 0 },
	// Alternating weeks for full and half shares keep each week's harvest even.
	{ crop: 'Beet', from: 28, to: 43, every: 2, full: 1, half: 0 },
	{ crop: 'Beet', from: 29, to: 43, every: 2, full: 0, half: 1 },
	{ crop: 'Carrot', from: 29, to: 43, every: 2, full: 1, half: 0 },
	{ crop: 'Carrot', from: 30, to: 43, every: 2, full: 0, half: 1 },
	{ crop: 'Dill', from: 28, to: 32, every: 2, full: 1, half: 0 },
	{ crop: 'Basil', from: 29, to: 37, full: 1, half: 1 },
	{ crop: 'Summer squash', from: 30, to: 37, full: 1.5, half: 1 },
	{ crop: 'Cucumber', from: 31, to: 37, full: 2, half: 1 },
	// Fruiting crops follow their plants, as a share manager asks of a picked crop: the first light
	// pickings go to the market stall and the restaurants (below), the boxes get a little as picking
	// builds, the full amount at full bearing, and less again as the plants decline in the cool
	// nights before the first fall frost. Every week, not alternating: a picked bed cannot hold a
	// week's beans back for the next box (invented demo figures).
	{ crop: 'Bush bean', from: 32, to: 32, full: 0.5, half: 0 },
	{ crop: 'Bush bean', from: 33, to: 38, full: 0.75, half: 0.5 },
	{ crop: 'Tomato', from: 32, to: 32, full: 1, half: 0.5 },
	{ crop: 'Tomato', from: 33, to: 37, full: 2, half: 1 },
	{ crop: 'Tomato', from: 38, to: 38, full: 1, half: 0.5 },
	{ crop: 'Pepper', from: 33, to: 33, full: 0.5, half: 0 },
	{ crop: 'Pepper', from: 34, to: 37, full: 0.5, half: 0.25 },
	{ crop: 'Pepper', from: 38, to: 38, full: 0.25, half: 0.25 },
	{ crop: 'Onion', from: 34, to: 38, every: 2, full: 1, half: 1 },
	{ crop: 'Garlic', from: 30, to: 42, every: 2, full: 2, half: 0 },
	{ crop: 'Garlic', from: 31, to: 42, every: 2, full: 0, half: 2 }
];

/** Weekly quantities for a channel: in weeks `from`…`to` of 2027, `quantity` a week. */
interface ChannelRun {
	crop: string;
	from: number;
	to: number;
	quantity: number;
}

// Saturday market, mid-May to early November: a small stall, mostly greens and herbs;
// roots, beans and onions go to the shares first. Tender crops stop before the first
// fall frost (W40) so the demo plan does not ask for tomatoes the frost would take.
const MARKET_RUNS: readonly ChannelRun[] = [
	{ crop: 'Salad mix', from: 20, to: 28, quantity: 10 },
	{ crop: 'Salad mix', from: 34, to: 44, quantity: 10 },
	{ crop: 'Head lettuce', from: 20, to: 40, quantity: 10 },
	{ crop: 'Radish', from: 20, to: 27, quantity: 12 },
	{ crop: 'Radish', from: 36, to: 42, quantity: 10 },
	{ crop: 'Spinach', from: 20, to: 26, quantity: 8 },
	{ crop: 'Spinach', from: 37, to: 44, quantity: 8 },
	{ crop: 'Arugula', from: 20, to: 27, quantity: 5 },
	{ crop: 'Arugula', from: 36, to: 44, quantity: 5 },
	{ crop: 'Scallion', from: 22, to: 34, quantity: 10 },
	{ crop: 'Kale', from: 24, to: 44, quantity: 6 },
	{ crop: 'Chard', from: 26, to: 42, quantity: 5 },
	{ crop: 'Cilantro', from: 22, to: 27, quantity: 6 },
	{ crop: 'Cilantro', from: 36, to: 41, quantity: 6 },
	{ crop: 'Dill', from: 27, to: 33, quantity: 5 },
	{ crop: 'Basil', from: 28, to: 37, quantity: 5 },
	{ crop: 'Summer squash', from: 30, to: 37, quantity: 10 },
	{ crop: 'Cucumber', from: 31, to: 37, quantity: 20 },
	// The first pickings of fruiting crops come to the stall the week before the boxes take them.
	{ crop: 'Bush bean', from: 31, to: 38, quantity: 10 },
	{ crop: 'Tomato', from: 31, to: 39, quantity: 25 },
	{ crop: 'Pepper', from: 32, to: 39, quantity: 8 },
	{ crop: 'Garlic', from: 30, to: 44, quantity: 20 }
];

// Standing weekly orders from two (invented) restaurants in town.
const RESTAURANT_RUNS: readonly ChannelRun[] = [
	{ crop: 'Salad mix', from: 20, to: 28, quantity: 6 },
	{ crop: 'Salad mix', from: 34, to: 45, quantity: 6 },
	{ crop: 'Arugula', from: 20, to: 27, quantity: 3 },
	{ crop: 'Arugula', from: 36, to: 45, quantity: 3 },
	{ crop: 'Spinach', from: 20, to: 26, quantity: 4 },
	{ crop: 'Spinach', from: 37, to: 45, quantity: 4 },
	{ crop: 'Head lettuce', from: 22, to: 40, quantity: 6 },
	{ crop: 'Radish', from: 22, to: 27, quantity: 4 },
	{ crop: 'Basil', from: 28, to: 38, quantity: 10 },
	{ crop: 'Tomato', from: 31, to: 39, quantity: 15 },
	{ crop: 'Pepper', from: 32, to: 39, quantity: 5 }
];

function isoWeekLabel(year: number, week: number): string {
	return `${year}-W${String(week).padStart(2, '0')}`;
}

function runWeeks(run: { from: number; to: number; every?: number }): number[] {
	const out: number[] = [];
	for (let w = run.from; w <= run.to; w += run.every ?? 1) out.push(w);
	return out;
}

export interface DemoBoxItem {
	share: DemoShareSize['name'];
	week: string;
	crop: string;
	quantity: number;
}

export const DEMO_BOX_ITEMS: readonly DemoBoxItem[] = BOX_RUNS.flatMap((run) =>
	runWeeks(run).flatMap((w) => {
		const items: DemoBoxItem[] = [];
		const week = isoWeekLabel(DEMO_PLAN_YEAR, w);
		if (run.full > 0) items.push({ share: 'Full share', week, crop: run.crop, quantity: run.full });
		if (run.half > 0) items.push({ share: 'Half share', week, crop: run.crop, quantity: run.half });
		return items;
	})
);

export interface DemoChannelDemand {
	channel: 'market' | 'restaurant';
	crop: string;
	week: string;
	quantity: number;
}

export const DEMO_CHANNEL_DEMAND: readonly DemoChannelDemand[] = [
	...MARKET_RUNS.flatMap((r) =>
		runWeeks(r).map((w) => ({
			channel: 'market' as const,
			crop: r.crop,
			week: isoWeekLabel(DEMO_PLAN_YEAR, w),
			quantity: r.quantity
		}))
	),
	...RESTAURANT_RUNS.flatMap((r) =>
		runWeeks(r).map((w) => ({
			channel: 'restaurant' as const,
			crop: r.crop,
			week: isoWeekLabel(DEMO_PLAN_YEAR, w),
			quantity: r.quantity
		}))
	)
];

// ---------------------------------------------------------------------------------------
// 2026: late-fall plantings around "today" (2026-12-02, ISO week 2026-W49)
// ---------------------------------------------------------------------------------------

export type PlantingStatus = 'planned' | 'sown' | 'transplanted' | 'harvesting' | 'finished' | 'failed';

export interface DemoFallPlanting {
	variety: string;
	bed: string;
	start_ft: number;
	length_ft: number;
	tray_sow_date: string | null;
	field_date: string;
	first_harvest: string;
	last_harvest: string;
	status: PlantingStatus;
	actual_tray_sow_date: string | null;
	actual_field_date: string | null;
	actual_first_harvest: string | null;
	notes: string | null;
	/** Harvests logged so far: [date, quantity in the crop's unit]. */
	harvests: readonly (readonly [string, number])[];
}

/** A fall planting as written below: its planned tray and harvest dates come from the engine. */
type FallPlantingFacts = Omit<DemoFallPlanting, 'tray_sow_date' | 'first_harvest' | 'last_harvest'>;

/**
 * The planned tray sowing and harvest dates of a fall planting as the grid derives them from its
 * field date (the same engine function the server runs on save), so what the seed stores is what
 * the grid shows.
 */
function withPlannedDates(p: FallPlantingFacts): DemoFallPlanting {
	const v = DEMO_VARIETIES.find((x) => x.name === p.variety);
	const crop = v && DEMO_CROPS.find((c) => c.name === v.crop);
	if (!v || !crop) throw new Error(`demo fall planting: unknown variety ${p.variety}`);
	const engine = toEngineVariety(v, crop);
	const d = derivePlanting(
		{
			method: v.method,
			fieldDate: p.field_date,
			lengthFt: p.length_ft,
			rows: v.rows_per_bed,
			inRowSpacingIn: v.in_row_spacing_in,
			seedsPerSpot: v.seeds_per_spot
		},
		engine,
		demoEngineFarm(),
		{ explain: false }
	);
	return { ...p, tray_sow_date: d.traySowDate, first_harvest: d.firstHarvest, last_harvest: d.lastHarvest };
}

export const DEMO_FALL_PLANTINGS_2026: readonly DemoFallPlanting[] = (
	[
		{
			variety: 'Curled Fog',
			bed: 'N01',
			start_ft: 0,
			length_ft: 50,
			field_date: '2026-08-08',
			status: 'harvesting',
			actual_tray_sow_date: '2026-07-04',
			actual_field_date: '2026-08-09',
			actual_first_harvest: '2026-09-30',
			notes: 'Picked weekly until the hard freezes; row cover on from mid-November.',
			harvests: [
				['2026-11-17', 30],
				['2026-11-24', 28],
				['2026-12-01', 24]
			]
		},
		{
			variety: 'Cellar Stout',
			bed: 'N01',
			start_ft: 50,
			length_ft: 50,
			field_date: '2026-07-23',
			status: 'harvesting',
			actual_tray_sow_date: null,
			actual_field_date: '2026-07-24',
			actual_first_harvest: '2026-10-21',
			notes: 'Left in the ground under straw and cover; dug as the winter share needs them.',
			harvests: [
				['2026-11-20', 45],
				['2026-11-27', 40],
				['2026-12-01', 38]
			]
		},
		{
			variety: 'Cold Frame Savoy',
			bed: 'N02',
			start_ft: 0,
			length_ft: 100,
			field_date: '2026-09-14',
			status: 'harvesting',
			actual_tray_sow_date: null,
			actual_field_date: '2026-09-14',
			actual_first_harvest: '2026-11-11',
			notes: 'Under a low tunnel.',
			harvests: [
				['2026-11-16', 9],
				['2026-11-23', 12],
				['2026-11-30', 10]
			]
		},
		{
			variety: 'Autumn Tapestry Mix',
			bed: 'N03',
			start_ft: 0,
			length_ft: 50,
			field_date: '2026-10-05',
			status: 'sown',
			actual_tray_sow_date: null,
			actual_field_date: '2026-10-05',
			actual_first_harvest: null,
			notes: 'Under a low tunnel; short days slow it: first cut due about 5 December.',
			harvests: []
		},
		{
			variety: 'Peppery Lace',
			bed: 'N03',
			start_ft: 50,
			length_ft: 50,
			field_date: '2026-10-06',
			status: 'harvesting',
			actual_tray_sow_date: null,
			actual_field_date: '2026-10-06',
			actual_first_harvest: '2026-11-24',
			notes: null,
			harvests: [['2026-11-30', 6]]
		},
		{
			variety: 'Butter Lantern',
			bed: 'N04',
			start_ft: 0,
			length_ft: 50,
			field_date: '2026-09-26',
			status: 'harvesting',
			actual_tray_sow_date: '2026-08-29',
			actual_field_date: '2026-09-26',
			actual_first_harvest: '2026-12-01',
			notes: 'Short days slowed it by about two weeks.',
			harvests: [['2026-12-01', 60]]
		},
		// Garlic goes in during the fall and is dug the next July: it feeds the 2027 boxes and
		// holds its beds until then, so the 2027 plan must work around it.
		{
			variety: 'Hardneck Blush',
			bed: 'S12',
			start_ft: 0,
			length_ft: 100,
			field_date: '2026-10-26',
			status: 'sown',
			actual_tray_sow_date: null,
			actual_field_date: '2026-10-27',
			actual_first_harvest: null,
			notes: 'Mulched with straw after planting.',
			harvests: []
		},
		{
			variety: 'Hardneck Blush',
			bed: 'S13',
			start_ft: 0,
			length_ft: 100,
			field_date: '2026-12-03',
			status: 'planned',
			actual_tray_sow_date: null,
			actual_field_date: null,
			actual_first_harvest: null,
			notes: 'Second garlic bed, held back by a wet November; plant as soon as the ground allows.',
			harvests: []
		}
	] satisfies FallPlantingFacts[]
).map(withPlannedDates);

// ---------------------------------------------------------------------------------------
// The 2027 plan, laid out by the planning engine
// ---------------------------------------------------------------------------------------

/**
 * Which variety supplies which part of a crop's target: weeks `from`…`to` (ISO week
 * numbers, default all year) and a `fraction` of each of those weeks (default 1).
 */
interface VarietyShare {
	variety: string;
	from?: number;
	to?: number;
	fraction?: number;
}

const VARIETY_PLAN: Readonly<Record<string, readonly VarietyShare[]>> = {
	// Quick carrots through summer, the storage type for the fall run.
	Carrot: [
		{ variety: 'Long Amber', to: 38 },
		{ variety: 'Cellar Stout', from: 39 }
	],
	Beet: [
		{ variety: 'Early Red Ball', to: 32 },
		{ variety: 'Cellar Garnet', from: 33 }
	],
	// Transplanted radish makes the first markets, before direct-sown beds are ready.
	Radish: [
		{ variety: 'Pearl Drop', to: 23 },
		{ variety: 'Quick Crimson', from: 24 }
	],
	// The crisp type covers the hot weeks, when butterheads bolt.
	'Head lettuce': [
		{ variety: 'Butter Lantern', to: 27 },
		{ variety: 'Summer Crisp Ridge', from: 28, to: 35 },
		{ variety: 'Rust Oakleaf', from: 36 }
	],
	'Salad mix': [
		{ variety: 'Meadow Cut Mix', to: 30 },
		{ variety: 'Autumn Tapestry Mix', from: 31 }
	],
	Spinach: [
		{ variety: 'Broadleaf Dawn', to: 30 },
		{ variety: 'Cold Frame Savoy', from: 31 }
	],
	Kale: [
		{ variety: 'Curled Fog', to: 33 },
		{ variety: 'Slate Leaf', from: 34 }
	],
	Tomato: [
		{ variety: 'Scarlet Ledger', fraction: 0.7 },
		{ variety: 'Honey Marble', fraction: 0.3 }
	],
	'Bush bean': [
		{ variety: 'Slender Meadow', fraction: 0.6 },
		{ variety: 'Butter Lane Wax', fraction: 0.4 }
	]
	// Garlic has no entry: the 2027 garlic is already in the ground (planted fall 2026) and goes
	// in as kept plantings. It is dug in July and the shares take it from store (24 weeks, 1 % a
	// week lost) from W30. The two fall beds feed the store into W38; the later weeks would need
	// more garlic planted last autumn, so they come back as unreachable, left in shortfall.
};

/** "Today" for the demo: the 2027 plan may not ask for work before it. */
export const DEMO_TODAY = '2026-12-02';

export interface PlanDemoInput {
	crops: readonly DemoCrop[];
	varieties: readonly DemoVariety[];
	beds: readonly DemoBed[];
	shareSizes: readonly DemoShareSize[];
	boxItems: readonly DemoBoxItem[];
	channelDemand: readonly DemoChannelDemand[];
	/** Plantings already holding beds (and whose families count as "last season"). */
	existing: readonly DemoFallPlanting[];
}

/** A demo variety with its crop as the library shows it (ids aside), for the engine inputs the server builds. */
function demoVarietyView(v: DemoVariety, crop: DemoCrop): VarietyView {
	return {
		id: 0,
		cropId: 0,
		crop: crop.name,
		family: crop.family,
		harvestUnit: crop.harvest_unit,
		frostTolerance: crop.frost_tolerance,
		heatLimitF: crop.heat_limit_f,
		baseTempF: crop.base_temp_f,
		name: v.name,
		method: v.method,
		daysToMaturity: v.days_to_maturity,
		daysInTray: v.days_in_tray,
		harvestWindowDays: v.harvest_window_days,
		yieldPerBedFoot: v.yield_per_bed_foot,
		rows: v.rows_per_bed,
		inRowSpacingIn: v.in_row_spacing_in,
		seedsPerSpot: v.seeds_per_spot,
		germinationRate: v.germination_rate,
		seedsPerGram: v.seeds_per_gram,
		seedPriceCentsPerGram: v.seed_price_cents_per_gram,
		seedsPerPacket: v.seeds_per_packet,
		cellsPerTray: v.cells_per_tray,
		margin: v.margin,
		gddToMaturity: v.gdd_to_maturity,
		harvestCurve: crop.harvest_curve,
		cutIntervalDays: crop.harvest_cut_interval_days,
		sowFrom: crop.sow_from ?? null,
		sowTo: crop.sow_to ?? null,
		storageWeeks: crop.storage_weeks ?? null,
		storageLossPerWeek: crop.storage_loss_per_week ?? null
	};
}

/** A demo variety as the engine takes it: the server's mapping (src/lib/engine-inputs.ts), named by the demo's names. */
export function toEngineVariety(v: DemoVariety, crop: DemoCrop): SeasonVariety {
	return { ...engineVariety(demoVarietyView(v, crop)), id: v.name, cropId: crop.name };
}

export function demoEngineFarm(): Farm {
	// The same farm → engine farm as the server's (src/lib/engine-inputs.ts).
	return engineFarm(
		{
			lastSpringFrost: DEMO_FARM.last_spring_frost,
			firstFallFrost: DEMO_FARM.first_fall_frost,
			latitude: DEMO_FARM.latitude,
			tenderDaysAfterFrost: DEMO_FARM.tender_days_after_frost,
			frostProbabilityPct: DEMO_FARM.frost_probability_pct
		},
		Object.fromEntries(DEMO_WEEKLY_TEMPS.map((t) => [t.week_number, t.mean_temp_f]))
	);
}

export function defaultPlanDemoInput(): PlanDemoInput {
	return {
		crops: DEMO_CROPS,
		varieties: DEMO_VARIETIES,
		beds: DEMO_BEDS,
		shareSizes: DEMO_SHARE_SIZES,
		boxItems: DEMO_BOX_ITEMS,
		channelDemand: DEMO_CHANNEL_DEMAND,
		existing: DEMO_FALL_PLANTINGS_2026
	};
}

/** The demo's variety plan in the engine's terms: ids are variety names, crops are crop names. */
export function demoVarietyPlan(
	varieties: readonly DemoVariety[] = DEMO_VARIETIES
): Record<string, EngineVarietyShare[]> {
	const cropOf = new Map(varieties.map((v) => [v.name, v.crop]));
	const out: Record<string, EngineVarietyShare[]> = {};
	for (const [crop, shares] of Object.entries(VARIETY_PLAN)) {
		// The engine would only warn and leave the share unplanned; a typo in the demo should fail loudly.
		for (const s of shares)
			if (cropOf.get(s.variety) !== crop) throw new Error(`demo plan: ${s.variety} is not a variety of ${crop}`);
		out[crop] = shares.map((s) => ({ varietyId: s.variety, fromWeek: s.from, toWeek: s.to, fraction: s.fraction }));
	}
	return out;
}

/**
 * The 2027 plan from the demand: targets per crop and week (engine `deriveTargets`), then one
 * `planSeason` call that takes off what the plantings already in the ground supply, plans
 * successions per variety share and lays them into the beds around those plantings. Engine
 * ids are names here (crop name, variety name, bed name), so the seed maps them straight to
 * rows. A succession split across beds comes back as one planting per piece, each with its own
 * seed; what cannot be placed comes back with no bed and the reason, never dropped.
 */
export function planDemoSeason(input: PlanDemoInput = defaultPlanDemoInput()): SeasonPlan {
	const cropByName = new Map(input.crops.map((c) => [c.name, c]));
	const varietyByName = new Map(input.varieties.map((v) => [v.name, v]));
	const cropOf = (v: DemoVariety): DemoCrop => {
		const crop = cropByName.get(v.crop);
		if (!crop) throw new Error(`demo plan: variety ${v.name} names unknown crop ${v.crop}`);
		return crop;
	};
	const targets = deriveTargets({
		shareSizes: input.shareSizes.map((s) => ({
			id: s.name,
			members: s.members,
			firstWeek: s.first_week,
			lastWeek: s.last_week
		})),
		boxItems: input.boxItems.map((b) => ({ shareSizeId: b.share, week: b.week, crop: b.crop, quantity: b.quantity })),
		channelDemand: input.channelDemand.map((c) => ({ crop: c.crop, week: c.week, quantity: c.quantity }))
	});
	const varieties: SeasonVariety[] = input.varieties.map((v) => toEngineVariety(v, cropOf(v)));
	// The plantings already in the ground both supply their weeks and hold their bed-feet.
	const kept: KeptPlanting[] = input.existing.map((p, i) => {
		const v = varietyByName.get(p.variety);
		if (!v) throw new Error(`demo plan: existing planting names unknown variety ${p.variety}`);
		return {
			key: `existing#${i + 1}`,
			cropId: v.crop,
			family: cropOf(v).family,
			bedId: p.bed,
			startFt: p.start_ft,
			lengthFt: p.length_ft,
			fieldDate: p.field_date,
			firstHarvest: p.first_harvest,
			lastHarvest: p.last_harvest,
			yieldPerBedFoot: v.yield_per_bed_foot,
			curve: toEngineVariety(v, cropOf(v)).harvestCurve,
			windowDays: v.harvest_window_days
		};
	});
	// Their families also count as what each bed held before the season, for rotation (the same rule
	// as the owner's plan: plan-options.ts).
	const previousFamilyByBed = previousFamiliesByBed(kept, `${DEMO_PLAN_YEAR}-01-01`, DEMO_FARM.rotation_years);
	return planSeason({
		farm: demoEngineFarm(),
		varieties,
		beds: input.beds.map((b) => ({ id: b.name, lengthFt: DEMO_BED_LENGTH_FT, blockId: b.block })),
		targets,
		kept,
		varietyPlan: demoVarietyPlan(input.varieties),
		previousFamilyByBed,
		// The owner's plan with the plan screen's defaults: the same options (plan-options.ts), "today" the demo's.
		options: seasonPlanOptions(
			{
				bedFootIncrement: DEMO_FARM.bed_foot_increment,
				turnaroundDays: DEMO_FARM.turnaround_days,
				lastSpringFrost: DEMO_FARM.last_spring_frost
			},
			{},
			DEMO_TODAY,
			DEMO_PLAN_YEAR
		)
	});
}

/** Per crop: the plan year's supply (kept and planned plantings) against demand. */
export interface DemoCropSupply {
	crop: string;
	supply: number;
	demand: number;
	/** Weeks with demand whose supply is under demand × (1 + margin) and that a planting could reach. */
	shortWeeks: string[];
}

/**
 * How well a plan fits the demo's demand: the engine's forecast over the plantings already in
 * the ground and the plan's, against the targets, over the plan year's weeks. Weeks the plan
 * reports as unreachable (nothing sown after "today" can be ready then) are not counted short.
 */
export function demoPlanSupply(
	plan: SeasonPlan,
	input: PlanDemoInput = defaultPlanDemoInput(),
	margin = 0.1
): DemoCropSupply[] {
	const cropByName = new Map(input.crops.map((c) => [c.name, c]));
	const varietyByName = new Map(input.varieties.map((v) => [v.name, v]));
	const shape = (name: string) => {
		const v = varietyByName.get(name);
		if (!v) throw new Error(`demo plan: unknown variety ${name}`);
		const crop = cropByName.get(v.crop);
		if (!crop) throw new Error(`demo plan: unknown crop ${v.crop}`);
		return {
			crop: v.crop,
			yieldPerBedFoot: v.yield_per_bed_foot,
			curve: toEngineVariety(v, crop).harvestCurve,
			windowDays: v.harvest_window_days
		};
	};
	const plantings = [
		...plan.plantings.map((p) => ({
			...shape(p.varietyId),
			firstHarvest: p.firstHarvest,
			lastHarvest: p.lastHarvest,
			bedFeet: p.lengthFt
		})),
		...input.existing.map((p) => ({
			...shape(p.variety),
			firstHarvest: p.first_harvest,
			lastHarvest: p.last_harvest,
			bedFeet: p.length_ft
		}))
	];
	const targets = deriveTargets({
		shareSizes: input.shareSizes.map((s) => ({
			id: s.name,
			members: s.members,
			firstWeek: s.first_week,
			lastWeek: s.last_week
		})),
		boxItems: input.boxItems.map((b) => ({ shareSizeId: b.share, week: b.week, crop: b.crop, quantity: b.quantity })),
		channelDemand: input.channelDemand.map((c) => ({ crop: c.crop, week: c.week, quantity: c.quantity }))
	});
	const unreachable = new Set(
		plan.warnings
			.filter((w) => w.code === 'unreachable_week')
			.flatMap((w) => (w.weeks ?? []).map((wk) => `${w.cropId}|${wk}`))
	);
	const rows = forecast(plantings, targets);
	// A storage crop's weeks are fed from its store (oldest lot first, with its weekly loss), as in
	// the forecast: a week is short when the store cannot give it demand × (1 + margin).
	const fromStore = new Map<string, Map<string, number>>();
	for (const crop of input.crops) {
		if (!crop.storage_weeks) continue;
		const dug = new Map<string, number>();
		const wanted = new Map<string, number>();
		for (const r of rows) {
			if (r.crop !== crop.name) continue;
			if (r.supply > 0) dug.set(r.week, r.supply);
			if (r.demand > 0) wanted.set(r.week, r.demand * (1 + margin));
		}
		fromStore.set(crop.name, storeSupply(dug, wanted, crop.storage_weeks, crop.storage_loss_per_week ?? 0).supply);
	}
	const out = new Map<string, DemoCropSupply>();
	for (const r of rows) {
		if (!r.week.startsWith(`${DEMO_PLAN_YEAR}-`)) continue;
		const c = out.get(r.crop) ?? { crop: r.crop, supply: 0, demand: 0, shortWeeks: [] };
		c.supply += r.supply;
		c.demand += r.demand;
		const given = fromStore.get(r.crop)?.get(r.week) ?? r.supply;
		if (r.demand > 0 && given < r.demand * (1 + margin) * (1 - 1e-9) && !unreachable.has(`${r.crop}|${r.week}`))
			c.shortWeeks.push(r.week);
		out.set(r.crop, c);
	}
	return [...out.values()].filter((c) => c.demand > 0);
}

/** Median and largest supply ÷ demand over the crops, and the count of short crop-weeks. */
export function supplyRatioSummary(crops: DemoCropSupply[]): { median: number; max: number; shortCropWeeks: number } {
	const ratios = crops.map((c) => c.supply / c.demand).sort((a, b) => a - b);
	const mid = ratios.length >> 1;
	const median = ratios.length % 2 ? ratios[mid] : (ratios[mid - 1] + ratios[mid]) / 2;
	return { median, max: ratios[ratios.length - 1], shortCropWeeks: crops.reduce((n, c) => n + c.shortWeeks.length, 0) };
}

// ---------------------------------------------------------------------------------------
// Writing it to the database
// ---------------------------------------------------------------------------------------

/** The demo farm's id, found through its owner's e-mail; null when it is not there. */
export async function findDemoFarm(knex: Knex, variant: DemoVariant = {}): Promise<number | null> {
	const row = await knex('farm_members as m')
		.join('users as u', 'u.id', 'm.user_id')
		.where({ 'u.email': demoUsers(variant)[0].email, 'm.role': 'owner' })
		.orderBy('m.farm_id')
		.first<{ farm_id: number } | undefined>('m.farm_id');
	return row ? Number(row.farm_id) : null;
}

/**
 * Delete the demo farm and its users. Plantings, beds and blocks go first, by hand:
 * plantings → varieties and beds → blocks are ON DELETE RESTRICT, and InnoDB would
 * refuse a farm-row cascade that reaches a block before its beds.
 */
export async function removeDemoFarm(knex: Knex, variant: DemoVariant = {}): Promise<void> {
	await knex.transaction(async (trx) => {
		const farmId = await findDemoFarm(trx, variant);
		if (farmId !== null) {
			await trx('plantings').where({ farm_id: farmId }).delete();
			await trx('beds').where({ farm_id: farmId }).delete();
			await trx('blocks').where({ farm_id: farmId }).delete();
			await trx('farms').where({ id: farmId }).delete();
		}
		await trx('users')
			.whereIn(
				'email',
				demoUsers(variant).map((u) => u.email)
			)
			.delete();
	});
}

/** Seed the demo farm unless it is there; `reset` removes it first. */
export async function ensureDemoFarm(
	knex: Knex,
	options: { reset?: boolean; variant?: DemoVariant } = {}
): Promise<{ farmId: number; created: boolean }> {
	const variant = options.variant ?? {};
	if (options.reset) await removeDemoFarm(knex, variant);
	const existing = await findDemoFarm(knex, variant);
	if (existing !== null) return { farmId: existing, created: false };
	// Demo users left without their farm (an interrupted run) would block the unique e-mails.
	await knex('users')
		.whereIn(
			'email',
			demoUsers(variant).map((u) => u.email)
		)
		.delete();
	const { farmId } = await seedDemoFarm(knex, variant);
	return { farmId, created: true };
}

export interface DemoFarmCounts {
	beds: number;
	crops: number;
	varieties: number;
	users: number;
	boxItems: number;
	channelDemand: number;
	plantings: number;
	/** Plantings the engine could not fit into a bed (kept with bed_id null and a note). */
	unplaced: number;
	harvestRecords: number;
}

export async function countDemoFarm(knex: Knex, farmId: number): Promise<DemoFarmCounts> {
	const count = async (q: Knex.QueryBuilder): Promise<number> =>
		Number((await q.count<{ n: number }[]>({ n: '*' }))[0].n);
	const [beds, crops, varieties, users, boxItems, channelDemand, plantings, unplaced, harvestRecords] =
		await Promise.all([
			count(knex('beds').where({ farm_id: farmId })),
			count(knex('crops').where({ farm_id: farmId })),
			count(knex('varieties').where({ farm_id: farmId })),
			count(knex('farm_members').where({ farm_id: farmId })),
			count(knex('box_items as b').join('share_sizes as s', 's.id', 'b.share_size_id').where('s.farm_id', farmId)),
			count(knex('channel_demand').where({ farm_id: farmId })),
			count(knex('plantings').where({ farm_id: farmId })),
			count(knex('plantings').where({ farm_id: farmId }).whereNull('bed_id')),
			count(knex('harvest_records').where({ farm_id: farmId }))
		]);
	return { beds, crops, varieties, users, boxItems, channelDemand, plantings, unplaced, harvestRecords };
}

async function idsByName(trx: Knex.Transaction, table: string, farmId: number): Promise<Map<string, number>> {
	const rows = await trx(table).where({ farm_id: farmId }).select<{ id: number; name: string }[]>('id', 'name');
	return new Map(rows.map((r) => [r.name, Number(r.id)]));
}

function need<T>(map: Map<string, T>, key: string, what: string): T {
	const v = map.get(key);
	if (v === undefined) throw new Error(`demo farm: unknown ${what} ${key}`);
	return v;
}

/** Insert the whole demo farm in one transaction; nothing is left half-written on error. */
export async function seedDemoFarm(knex: Knex, variant: DemoVariant = {}): Promise<{ farmId: number }> {
	// Hash before the transaction opens: argon2 takes a moment and holds no locks.
	const passwordHash = await hashPassword(DEMO_PASSWORD);
	const plan = planDemoSeason();
	return knex.transaction(async (trx) => {
		const [farmId] = await trx('farms').insert({
			...DEMO_FARM,
			...(variant.tag ? { name: `${DEMO_FARM.name.replace(/\)$/, '')}, ${variant.tag} copy)` } : {}),
			...(variant.unitSystem ? { unit_system: variant.unitSystem } : {})
		});
		await trx('farm_weekly_temps').insert(DEMO_WEEKLY_TEMPS.map((t) => ({ farm_id: farmId, ...t })));

		const userIds = new Map<string, string>();
		for (const u of demoUsers(variant)) {
			const id = randomUUID();
			userIds.set(u.role, id);
			await trx('users').insert({ id, email: u.email, name: u.name, password_hash: passwordHash });
			await trx('farm_members').insert({ farm_id: farmId, user_id: id, role: u.role });
		}

		await trx('blocks').insert(DEMO_BLOCKS.map((b, i) => ({ farm_id: farmId, name: b.name, position: i + 1 })));
		const blockIds = await idsByName(trx, 'blocks', farmId);
		await trx('beds').insert(
			DEMO_BEDS.map((b) => ({
				farm_id: farmId,
				block_id: need(blockIds, b.block, 'block'),
				name: b.name,
				length_ft: DEMO_BED_LENGTH_FT,
				width_in: DEMO_BED_WIDTH_IN,
				position: b.position
			}))
		);
		const bedIds = await idsByName(trx, 'beds', farmId);

		await trx('crops').insert(DEMO_CROPS.map((c) => ({ farm_id: farmId, ...c })));
		const cropIds = await idsByName(trx, 'crops', farmId);
		await trx('varieties').insert(
			DEMO_VARIETIES.map(({ crop, ...v }) => ({ farm_id: farmId, crop_id: need(cropIds, crop, 'crop'), ...v }))
		);
		// Variety names are unique per crop, and in the demo across the farm too.
		const varietyIds = await idsByName(trx, 'varieties', farmId);
		const varietyByName = new Map(DEMO_VARIETIES.map((v) => [v.name, v]));
		const demoCropByName = new Map(DEMO_CROPS.map((c) => [c.name, c]));
		const unitOf = new Map(DEMO_CROPS.map((c) => [c.name, c.harvest_unit]));

		await trx('seasons').insert(DEMO_SEASONS.map((s) => ({ farm_id: farmId, ...s })));
		const seasonRows = await trx('seasons')
			.where({ farm_id: farmId })
			.select<{ id: number; year: number }[]>('id', 'year');
		const seasonIds = new Map(seasonRows.map((r) => [String(r.year), Number(r.id)]));
		const season2026 = need(seasonIds, '2026', 'season');
		const season2027 = need(seasonIds, String(DEMO_PLAN_YEAR), 'season');

		await trx('share_sizes').insert(DEMO_SHARE_SIZES.map((s) => ({ farm_id: farmId, season_id: season2027, ...s })));
		const shareIds = await idsByName(trx, 'share_sizes', farmId);
		await trx('box_items').insert(
			DEMO_BOX_ITEMS.map((b) => ({
				share_size_id: need(shareIds, b.share, 'share size'),
				week: b.week,
				crop_id: need(cropIds, b.crop, 'crop'),
				quantity: b.quantity,
				unit: need(unitOf, b.crop, 'crop')
			}))
		);
		await trx('channel_demand').insert(
			DEMO_CHANNEL_DEMAND.map((c) => ({
				farm_id: farmId,
				season_id: season2027,
				channel: c.channel,
				crop_id: need(cropIds, c.crop, 'crop'),
				week: c.week,
				quantity: c.quantity
			}))
		);

		const crewId = userIds.get('crew_lead') ?? null;
		for (const p of DEMO_FALL_PLANTINGS_2026) {
			const v = need(varietyByName, p.variety, 'variety');
			const { harvests, variety, bed, ...dates } = p;
			// The seed the server works out for a planting (src/lib/engine-inputs.ts).
			const seed = plantingSeed(
				{
					method: v.method,
					lengthFt: p.length_ft,
					rows: v.rows_per_bed,
					inRowSpacingIn: v.in_row_spacing_in,
					seedsPerSpot: v.seeds_per_spot
				},
				demoVarietyView(v, need(demoCropByName, v.crop, 'crop'))
			);
			const [plantingId] = await trx('plantings').insert({
				farm_id: farmId,
				season_id: season2026,
				variety_id: need(varietyIds, variety, 'variety'),
				bed_id: need(bedIds, bed, 'bed'),
				rows: v.rows_per_bed,
				in_row_spacing_in: v.in_row_spacing_in,
				seeds_per_spot: v.seeds_per_spot,
				method: v.method,
				expected_yield: Math.round(p.length_ft * v.yield_per_bed_foot * 100) / 100,
				seeds_needed: seed.seeds,
				updated_by: crewId,
				...dates
			});
			if (harvests.length > 0) {
				await trx('harvest_records').insert(
					harvests.map(([harvested_on, quantity]) => ({
						farm_id: farmId,
						planting_id: plantingId,
						harvested_on,
						quantity,
						unit: need(unitOf, v.crop, 'crop'),
						recorded_by: crewId
					}))
				);
			}
		}

		const rows = plan.plantings.map((p) =>
			plantingRow(p, {
				farmId: Number(farmId),
				seasonId: season2027,
				varietyId: need(varietyIds, p.varietyId, 'variety'),
				bedId: p.bedId === null ? null : need(bedIds, p.bedId, 'bed')
			})
		);
		for (let i = 0; i < rows.length; i += 100) await trx('plantings').insert(rows.slice(i, i + 100));
		return { farmId: Number(farmId) };
	});
}
