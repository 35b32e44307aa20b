// Every writing route, fed hostile input: wrong types, impossible and far-away dates, huge
// numbers, oversized bodies and other farms' ids. Each answers 4xx naming the field, and the
// tables a route could touch are byte-for-byte as before (MariaDB's CHECKSUM TABLE).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, html, signedIn } from '../helpers/http';
import { closeTestDb, testDb } from '../helpers/db';
import { baseUrl, demo } from '../helpers/env';
import { signUpFarm, writeHandPlan, type NewFarm } from '../helpers/transfer';

afterAll(closeTestDb);

// Every table a farm's writes can reach (sessions and rate-limit counters change on sign-in).
const TABLES = [
	'farms',
	'farm_weekly_temps',
	'farm_members',
	'invites',
	'password_resets',
	'users',
	'blocks',
	'beds',
	'crops',
	'varieties',
	'seasons',
	'plantings',
	'share_sizes',
	'box_items',
	'channel_demand',
	'harvest_records',
	'harvest_audit',
	'box_swaps',
	'user_grid_prefs',
	'calendar_feeds',
	'variety_figure_changes'
];

async function checksums(): Promise<Record<string, string>> {
	const [rows] = await testDb().raw(`CHECKSUM TABLE ${TABLES.map((t) => `\`${t}\``).join(', ')}`);
	return Object.fromEntries(
		(rows as { Table: string; Checksum: string | number }[]).map((r) => [
			r.Table.split('.').pop() ?? r.Table,
			String(r.Checksum)
		])
	);
}

interface Ids {
	season: number;
	planting: number;
	plantingVersion: number;
	harvestSeason: number;
	harvest: number;
	share: number;
	block: number;
	bed: number;
	crop: number;
	variety: number;
	/** Another farm's rows, named in this farm's requests. */
	otherVariety: number;
	otherBed: number;
	otherBlock: number;
	otherCrop: number;
	otherPlanting: number;
	otherShare: number;
	otherSeason: number;
}

type Who = 'owner' | 'crew';
interface Case {
	name: string;
	who?: Who;
	/** JSON route: method and path; form action: path with ?/name. */
	json?: [method: string, path: (i: Ids) => string, body: (i: Ids) => unknown];
	form?: [path: (i: Ids) => string, fields: (i: Ids) => Record<string, string | number>];
	raw?: [method: string, path: (i: Ids) => string, body: () => string, contentType: string];
	status: number | number[];
	/** The field the answer must name: a key of `errors` (JSON) or text of the page (forms). */
	field?: string;
}

const big = 1e308;
// Valid forms, each case spoiling one field. The crop and variety figures are invented.
const cropForm: Record<string, string> = {
	name: 'Hostile crop',
	family: 'Fabaceae',
	harvestUnit: 'lb',
	frostTolerance: 'tender',
	heatLimitF: '',
	baseTempF: '50',
	harvestCurve: 'flat',
	cutIntervalDays: '',
	storageWeeks: '',
	storageLossPct: '',
	price: '2.50',
	source: 'test'
};
const varietyForm: Record<string, string> = {
	name: 'Hostile variety',
	method: 'direct',
	daysToMaturity: '60',
	daysInTray: '0',
	harvestWindowDays: '14',
	yieldPerBedFoot: '1',
	rows: '2',
	inRowSpacingIn: '4',
	seedsPerSpot: '1',
	germinationRate: '80',
	seedsPerGram: '5',
	seedPrice: '0.10',
	seedsPerPacket: '',
	cellsPerTray: '128',
	margin: '10',
	harvestCurve: '',
	gddToMaturity: '',
	source: 'test'
};
const locationForm: Record<string, string> = {
	latitude: '42',
	timeZone: 'America/New_York',
	unitSystem: 'imperial',
	lastSpringFrost: '2027-05-10',
	firstFallFrost: '2027-10-05'
};
const bedsForm: Record<string, string> = {
	block: 'Hostile block',
	count: '3',
	lengthFt: '100',
	widthIn: '30',
	prefix: 'H',
	firstNumber: '1'
};
const cases: Case[] = [
	// Plantings
	{
		name: 'POST plantings: variety as text',
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/plantings`,
			() => ({ plantings: [{ varietyId: 'carrots', lengthFt: 10, fieldDate: '2027-05-03' }] })
		],
		status: 400,
		field: 'plantings.0.varietyId'
	},
	{
		name: 'POST plantings: 30 February',
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/plantings`,
			(i) => ({ plantings: [{ varietyId: i.variety, lengthFt: 10, fieldDate: '2027-02-30' }] })
		],
		status: 400,
		field: 'plantings.0.fieldDate'
	},
	{
		name: 'POST plantings: year 1899',
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/plantings`,
			(i) => ({ plantings: [{ varietyId: i.variety, lengthFt: 10, fieldDate: '1899-05-03' }] })
		],
		status: 400,
		field: 'plantings.0.fieldDate'
	},
	{
		name: 'POST plantings: 1e308 bed-feet',
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/plantings`,
			(i) => ({ plantings: [{ varietyId: i.variety, lengthFt: big, fieldDate: '2027-05-03' }] })
		],
		status: 400,
		field: 'plantings.0.lengthFt'
	},
	{
		name: "POST plantings: another farm's variety",
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/plantings`,
			(i) => ({ plantings: [{ varietyId: i.otherVariety, lengthFt: 10, fieldDate: '2027-05-03' }] })
		],
		status: 400,
		field: 'plantings.0.varietyId'
	},
	{
		name: "POST plantings: another farm's bed",
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/plantings`,
			(i) => ({ plantings: [{ varietyId: i.variety, bedId: i.otherBed, lengthFt: 10, fieldDate: '2027-05-03' }] })
		],
		status: 400,
		field: 'plantings.0.bedId'
	},
	{
		name: 'POST plantings: 5,001 rows',
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/plantings`,
			(i) => ({
				plantings: Array.from({ length: 5001 }, () => ({ varietyId: i.variety, lengthFt: 10, fieldDate: '2027-05-03' }))
			})
		],
		status: 400,
		field: 'plantings'
	},
	{
		name: 'POST plantings: a 7 MB body',
		raw: [
			'POST',
			(i) => `/api/seasons/${i.season}/plantings`,
			() => JSON.stringify({ plantings: [], pad: 'x'.repeat(7 * 1024 * 1024) }),
			'application/json'
		],
		status: 413
	},
	{
		name: 'POST plantings: not JSON',
		raw: ['POST', (i) => `/api/seasons/${i.season}/plantings`, () => '{"plantings": [', 'application/json'],
		status: 400,
		field: '_body'
	},
	{
		name: 'PATCH planting: version as text',
		json: ['PATCH', (i) => `/api/plantings/${i.planting}`, () => ({ version: 'one', notes: 'x' })],
		status: 400,
		field: 'version'
	},
	{
		name: 'PATCH planting: month 13',
		json: [
			'PATCH',
			(i) => `/api/plantings/${i.planting}`,
			(i) => ({ version: i.plantingVersion, fieldDate: '2027-13-01' })
		],
		status: 400,
		field: 'fieldDate'
	},
	{
		name: 'PATCH planting: 1e308 rows',
		json: ['PATCH', (i) => `/api/plantings/${i.planting}`, (i) => ({ version: i.plantingVersion, rows: big })],
		status: 400,
		field: 'rows'
	},
	{
		name: "PATCH planting: another farm's bed",
		json: ['PATCH', (i) => `/api/plantings/${i.planting}`, (i) => ({ version: i.plantingVersion, bedId: i.otherBed })],
		status: 400,
		field: 'bedId'
	},
	{
		name: 'PATCH planting: crew lead, actual date in 9999',
		who: 'crew',
		json: [
			'PATCH',
			(i) => `/api/plantings/${i.planting}`,
			(i) => ({ version: i.plantingVersion, actualFieldDate: '9999-01-01' })
		],
		status: 400,
		field: 'actualFieldDate'
	},
	{
		name: "PATCH planting: another farm's planting",
		json: ['PATCH', (i) => `/api/plantings/${i.otherPlanting}`, () => ({ version: 1, notes: 'x' })],
		status: 404
	},
	{
		name: "DELETE planting: another farm's planting",
		json: ['DELETE', (i) => `/api/plantings/${i.otherPlanting}`, () => undefined],
		status: 404
	},

	// Demand
	{
		name: 'POST share size: members -1',
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/demand/share-sizes`,
			() => ({ name: 'Bad', members: -1, firstWeek: '2027-W24', lastWeek: '2027-W30', pickupDays: ['Tue'], price: 10 })
		],
		status: 400,
		field: 'members'
	},
	{
		name: 'POST share size: week 60',
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/demand/share-sizes`,
			() => ({ name: 'Bad', members: 5, firstWeek: '2027-W60', lastWeek: '2027-W30', pickupDays: ['Tue'], price: 10 })
		],
		status: 400,
		field: 'firstWeek'
	},
	{
		name: 'POST share size: price 1e308',
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/demand/share-sizes`,
			() => ({ name: 'Bad', members: 5, firstWeek: '2027-W24', lastWeek: '2027-W30', pickupDays: ['Tue'], price: big })
		],
		status: 400,
		field: 'price'
	},
	{
		name: 'PUT share size: members as text',
		json: [
			'PUT',
			(i) => `/api/seasons/${i.season}/demand/share-sizes/${i.share}`,
			() => ({
				name: 'Bad',
				members: 'many',
				firstWeek: '2027-W24',
				lastWeek: '2027-W30',
				pickupDays: ['Tue'],
				price: 10
			})
		],
		status: 400,
		field: 'members'
	},
	{
		name: "PUT share size: another farm's share size",
		json: [
			'PUT',
			(i) => `/api/seasons/${i.season}/demand/share-sizes/${i.otherShare}`,
			() => ({ name: 'Bad', members: 5, firstWeek: '2027-W24', lastWeek: '2027-W30', pickupDays: ['Tue'], price: 10 })
		],
		status: 404
	},
	{
		name: 'PATCH demand cells: week 0999-W10',
		json: [
			'PATCH',
			(i) => `/api/seasons/${i.season}/demand/cells`,
			(i) => ({ grid: 'market', cells: [{ crop: i.crop, week: '0999-W10', quantity: 1, unit: 'lb' }] })
		],
		status: 400,
		field: 'cells.0.week'
	},
	{
		name: 'PATCH demand cells: 1e308',
		json: [
			'PATCH',
			(i) => `/api/seasons/${i.season}/demand/cells`,
			(i) => ({ grid: 'market', cells: [{ crop: i.crop, week: '2027-W24', quantity: big, unit: 'lb' }] })
		],
		status: 400,
		field: 'cells.0.quantity'
	},
	{
		name: "PATCH demand cells: another farm's crop",
		json: [
			'PATCH',
			(i) => `/api/seasons/${i.season}/demand/cells`,
			(i) => ({ grid: 'market', cells: [{ crop: i.otherCrop, week: '2027-W24', quantity: 1, unit: 'lb' }] })
		],
		status: 400,
		field: 'cells.0.crop'
	},
	{
		name: 'POST copy-week: 9999-W52',
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/demand/copy-week`,
			() => ({ grid: 'market', fromWeek: '2027-W24', toFirst: '2027-W25', toLast: '9999-W52' })
		],
		status: 400,
		field: 'toLast'
	},

	// Harvests and boxes
	{
		name: 'POST harvest: 31 April',
		who: 'crew',
		json: [
			'POST',
			(i) => `/api/seasons/${i.harvestSeason}/harvests`,
			(i) => ({ plantingId: i.planting, harvestedOn: '2026-04-31', quantity: 1, unit: 'lb' })
		],
		status: 400,
		field: 'harvestedOn'
	},
	{
		name: 'POST harvest: 1e308 lb',
		who: 'crew',
		json: [
			'POST',
			(i) => `/api/seasons/${i.harvestSeason}/harvests`,
			(i) => ({ plantingId: i.planting, harvestedOn: '2026-07-01', quantity: big, unit: 'lb' })
		],
		status: 400,
		field: 'quantity'
	},
	{
		name: "POST harvest: another farm's planting",
		who: 'crew',
		json: [
			'POST',
			(i) => `/api/seasons/${i.harvestSeason}/harvests`,
			(i) => ({ plantingId: i.otherPlanting, harvestedOn: '2026-07-01', quantity: 1, unit: 'lb' })
		],
		status: [400, 404],
		field: 'plantingId'
	},
	{
		name: 'PATCH harvest: quantity as text',
		who: 'crew',
		json: ['PATCH', (i) => `/api/seasons/${i.harvestSeason}/harvests/${i.harvest}`, () => ({ quantity: 'heaps' })],
		status: 400,
		field: 'quantity'
	},
	{
		name: 'POST swap: week 2027-W99',
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/boxes/swaps`,
			(i) => ({ shareSizeId: i.share, week: '2027-W99', fromCropId: i.crop, toCropId: i.crop + 1, quantity: 1 })
		],
		status: 400,
		field: 'week'
	},
	{
		name: "POST swap: another farm's share size",
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/boxes/swaps`,
			(i) => ({ shareSizeId: i.otherShare, week: '2027-W30', fromCropId: i.crop, toCropId: i.crop + 1, quantity: 1 })
		],
		status: 400,
		field: 'shareSizeId'
	},

	// Plan, preferences
	{
		name: 'POST plan preview: margin 5',
		json: ['POST', (i) => `/api/seasons/${i.season}/plan/preview`, () => ({ margin: 5 })],
		status: 400,
		field: 'margin'
	},
	{
		name: 'POST plan apply: intervalWeeks as text',
		json: ['POST', (i) => `/api/seasons/${i.season}/plan/apply`, () => ({ intervalWeeks: 'weekly' })],
		status: 400,
		field: 'intervalWeeks'
	},
	{
		name: 'PUT grid prefs: 1e308 px',
		json: ['PUT', () => '/api/me/prefs/grid', () => ({ widths: { crop: big }, hidden: [] })],
		status: 400,
		field: 'widths.crop'
	},

	// Form actions
	{
		name: 'settings: latitude 1000 and frost in 0999',
		form: [
			() => '/settings?/farm',
			() => ({
				name: 'Renamed',
				timeZone: 'America/New_York',
				latitude: 1000,
				unitSystem: 'imperial',
				lastSpringFrost: '0999-04-20',
				firstFallFrost: '2027-10-20',
				bedFootIncrement: 5,
				turnaroundDays: 7
			})
		],
		status: 400,
		field: 'Latitude'
	},
	{
		name: "settings: a bed in another farm's block",
		form: [
			() => '/settings?/saveBed',
			(i) => ({ name: 'Stray', blockId: i.otherBlock, lengthFt: 10, widthIn: 30, position: 0 })
		],
		status: 400,
		field: "this farm's blocks"
	},
	{
		name: 'settings: a bed 1e308 ft long',
		form: [
			() => '/settings?/saveBed',
			(i) => ({ name: 'Huge', blockId: i.block, lengthFt: '1e308', widthIn: 30, position: 0 })
		],
		status: 400,
		field: 'Length'
	},
	{
		name: 'settings: a block name of 5,000 characters',
		form: [() => '/settings?/addBlock', () => ({ name: 'B'.repeat(5000) })],
		status: 400,
		field: 'Block name'
	},
	{
		name: 'team: invite with role king',
		form: [() => '/team?/invite', () => ({ email: 'someone@example.test', role: 'king' })],
		status: 400,
		field: 'Role'
	},
	{
		name: 'harvest log form: date 9999-12-31',
		who: 'crew',
		form: [
			(i) => `/seasons/${i.harvestSeason}/harvests?/log`,
			(i) => ({ plantingId: i.planting, harvestedOn: '9999-12-31', quantity: 1, unit: 'lb' })
		],
		status: 400,
		field: 'Date must be between 1900 and 2200'
	},
	{
		name: 'crew sheet: done on 0001-01-01',
		who: 'crew',
		form: [
			(i) => `/seasons/${i.season}/week/2027-W21?/done`,
			(i) => ({ plantingId: i.planting, kind: 'harvest', date: '0001-01-01' })
		],
		status: 400,
		field: 'Actual date must be between 1900 and 2200'
	},
	{
		name: 'demand form: members sixty',
		form: [
			(i) => `/seasons/${i.season}/demand?/addShare`,
			() => ({ name: 'Sixty', members: 'sixty', firstWeek: '2027-W24', lastWeek: '2027-W30', price: '10' })
		],
		status: 400,
		field: 'Members must be a number'
	},

	// Crop library: add, edit, archive
	{
		name: 'crop add: base temperature 1e308',
		form: [() => '/crops/new', () => ({ ...cropForm, name: 'Hostile bean', baseTempF: '1e308' })],
		status: 400,
		field: 'Base temperature must be at most 80.'
	},
	{
		name: 'crop add: name of 5,000 characters',
		form: [() => '/crops/new', () => ({ ...cropForm, name: 'N'.repeat(5000) })],
		status: 400,
		field: 'Crop name must be at most 80 characters.'
	},
	{
		name: 'crop add: harvest unit bushel',
		form: [() => '/crops/new', () => ({ ...cropForm, name: 'Hostile pea', harvestUnit: 'bushel' })],
		status: 400,
		field: 'Harvest unit: choose'
	},
	{
		name: 'crop add: price a fraction of a cent',
		form: [() => '/crops/new', () => ({ ...cropForm, name: 'Hostile leek', price: '0.001' })],
		status: 400,
		field: 'whole cents'
	},
	{
		name: 'crop add: a 7 MB body',
		raw: [
			'POST',
			() => '/crops/new',
			() => new URLSearchParams({ ...cropForm, name: 'Padded', source: 'x'.repeat(7 * 1024 * 1024) }).toString(),
			'application/x-www-form-urlencoded'
		],
		status: 413
	},
	{
		name: 'crop add: the name sent as a file (multipart)',
		raw: [
			'POST',
			() => '/crops/new',
			() =>
				[
					'--hostile',
					'Content-Disposition: form-data; name="name"; filename="name.txt"',
					'Content-Type: text/plain',
					'',
					'Filed bean',
					'--hostile',
					'Content-Disposition: form-data; name="harvestUnit"',
					'',
					'lb',
					'--hostile--',
					''
				].join('\r\n'),
			'multipart/form-data; boundary=hostile'
		],
		status: 400
	},
	{
		name: 'seasons create: JSON sent to the form action',
		raw: ['POST', () => '/seasons?/create', () => JSON.stringify({ year: 2091, name: 'JSON' }), 'application/json'],
		status: [400, 415]
	},
	{
		name: 'crop edit: heat limit as text',
		form: [(i) => `/crops/${i.crop}?/save`, () => ({ ...cropForm, heatLimitF: 'hot' })],
		status: 400,
		field: 'Heat limit must be a number.'
	},
	{
		name: "crop edit: another farm's crop",
		form: [(i) => `/crops/${i.otherCrop}?/save`, () => cropForm],
		status: 404,
		field: "No such crop in this farm's library."
	},
	{
		name: "crop archive: another farm's crop",
		form: [(i) => `/crops/${i.otherCrop}?/archive`, () => ({})],
		status: 404,
		field: "No such crop in this farm's library."
	},
	{
		name: 'crop archive: crop id 1e308',
		form: [() => '/crops/1e308?/archive', () => ({})],
		status: 404,
		field: "No such crop in this farm's library."
	},
	{
		name: 'variety add: germination 500 %',
		form: [(i) => `/crops/${i.crop}/varieties/new`, () => ({ ...varietyForm, germinationRate: '500' })],
		status: 400,
		field: 'Germination must be at most'
	},
	{
		name: 'variety add: days in tray for a direct-sown variety',
		form: [(i) => `/crops/${i.crop}/varieties/new`, () => ({ ...varietyForm, daysInTray: '20' })],
		status: 400,
		field: 'Days in tray must be 0 for a direct-sown variety.'
	},
	{
		name: "variety add: under another farm's crop",
		form: [(i) => `/crops/${i.otherCrop}/varieties/new`, () => varietyForm],
		status: 404
	},
	{
		name: 'variety edit: days to maturity 1e308',
		form: [(i) => `/crops/${i.crop}/varieties/${i.variety}?/save`, () => ({ ...varietyForm, daysToMaturity: '1e308' })],
		status: 400,
		field: 'must be at most'
	},
	{
		name: "variety edit: another farm's variety under this farm's crop",
		form: [(i) => `/crops/${i.crop}/varieties/${i.otherVariety}?/save`, () => varietyForm],
		status: 404
	},
	{
		name: "variety archive: another farm's variety",
		form: [(i) => `/crops/${i.otherCrop}/varieties/${i.otherVariety}?/archive`, () => ({})],
		status: 404
	},
	{
		name: "variety delete: another farm's variety",
		form: [(i) => `/crops/${i.otherCrop}/varieties/${i.otherVariety}?/delete`, () => ({})],
		status: 404
	},

	// The set-up path
	{
		name: 'setup location: latitude 1000',
		form: [() => '/setup', () => ({ ...locationForm, latitude: '1000' })],
		status: 400,
		field: 'Latitude must be at most 66.'
	},
	{
		name: 'setup location: 30 February frost',
		form: [() => '/setup', () => ({ ...locationForm, lastSpringFrost: '2027-02-30' })],
		status: 400,
		field: 'Last spring frost is not a real calendar date.'
	},
	{
		name: 'setup location: frost in 9999',
		form: [() => '/setup', () => ({ ...locationForm, firstFallFrost: '9999-10-01' })],
		status: 400,
		field: 'First fall frost must be between 1900 and 2200.'
	},
	{
		name: 'setup location: time zone Mars/Olympus',
		form: [() => '/setup', () => ({ ...locationForm, timeZone: 'Mars/Olympus' })],
		status: 400
	},
	{
		name: 'setup beds: 1e308 beds',
		form: [() => '/setup/beds', () => ({ ...bedsForm, count: '1e308' })],
		status: 400,
		field: 'Number of beds must be at most 200.'
	},
	{
		name: 'setup beds: length as text',
		form: [() => '/setup/beds', () => ({ ...bedsForm, lengthFt: 'long' })],
		status: 400,
		field: 'Length (ft) must be a number.'
	},
	{
		name: 'setup crops: a crop not in the starter library',
		form: [() => '/setup/crops', () => ({ crop: '<script>' })],
		status: 400,
		field: 'is not in the starter library.'
	},
	{
		name: 'setup crops: nothing ticked',
		form: [() => '/setup/crops', () => ({})],
		status: 400,
		field: 'Tick at least one crop'
	},
	{
		name: 'setup season: year 99999',
		form: [() => '/setup/season', () => ({ year: '99999', name: 'Far away' })],
		status: 400,
		field: 'Year must be at most 2100.'
	},
	{
		name: 'setup season: year as text',
		form: [() => '/setup/season', () => ({ year: 'next', name: 'Next' })],
		status: 400,
		field: 'Year must be a number.'
	},

	// Seasons page: create, copy, rename, archive
	{
		name: 'seasons create: year 1e308',
		form: [() => '/seasons?/create', () => ({ year: '1e308', name: 'Huge' })],
		status: 400,
		field: 'Year must be at most 2100.'
	},
	{
		name: 'seasons create: a year the farm already has',
		form: [() => '/seasons?/create', () => ({ year: '2027', name: 'Again' })],
		status: [400, 409]
	},
	{
		name: 'seasons create: name of 5,000 characters',
		form: [() => '/seasons?/create', () => ({ year: '2090', name: 'S'.repeat(5000) })],
		status: 400,
		field: 'Season name must be at most 80 characters.'
	},
	{
		name: "seasons copy: another farm's season",
		form: [() => '/seasons?/copy', (i) => ({ from: i.otherSeason })],
		status: 400,
		field: "Choose one of this farm's seasons."
	},
	{
		name: 'seasons copy: season as text',
		form: [() => '/seasons?/copy', () => ({ from: 'last' })],
		status: 400,
		field: 'Season to copy must be a number.'
	},
	{
		name: "seasons rename: another farm's season",
		form: [() => '/seasons?/rename', (i) => ({ id: i.otherSeason, name: 'Mine now' })],
		status: 404,
		field: 'No such season on this farm.'
	},
	{
		name: 'seasons rename: name with markup',
		form: [() => '/seasons?/rename', (i) => ({ id: i.season, name: '<b>bold</b>' })],
		status: 400,
		field: 'Season name'
	},
	{
		name: 'seasons rename: id 1e308',
		form: [() => '/seasons?/rename', () => ({ id: '1e308', name: 'Far' })],
		status: 404
	},
	{
		name: "seasons archive: another farm's season",
		form: [() => '/seasons?/archive', (i) => ({ id: i.otherSeason })],
		status: 404,
		field: 'No such season on this farm.'
	},
	{
		name: 'seasons archive: id as text',
		form: [() => '/seasons?/archive', () => ({ id: 'all' })],
		status: 404
	},

	// Results (actual against plan)
	{
		name: "results: use figures of another farm's variety",
		form: [(i) => `/seasons/${i.season}/results?/useFigures`, (i) => ({ varietyId: i.otherVariety })],
		status: [400, 404]
	},
	{
		name: 'results: use figures, variety 1e308',
		form: [(i) => `/seasons/${i.season}/results?/useFigures`, () => ({ varietyId: '1e308' })],
		status: 400,
		field: 'Variety must be at most'
	},
	{
		name: 'results: undo a change that is not there',
		form: [(i) => `/seasons/${i.season}/results?/undoFigures`, () => ({ changeId: '2147483647' })],
		status: [400, 404]
	},
	{
		name: 'results: undo, change as text',
		form: [(i) => `/seasons/${i.season}/results?/undoFigures`, () => ({ changeId: 'last' })],
		status: 400,
		field: 'Change must be a number.'
	},
	{
		name: "results: copy another farm's season",
		form: [(i) => `/seasons/${i.otherSeason}/results?/copySeason`, () => ({})],
		status: 404
	},

	// Box swaps (share boxes page)
	{
		name: 'boxes swap: quantity 1e308',
		form: [
			(i) => `/seasons/${i.season}/boxes?/swap`,
			(i) => ({ shareSizeId: i.share, week: '2027-W30', fromCropId: i.crop, toCropId: i.crop + 1, quantity: '1e308' })
		],
		status: 400,
		field: 'quantity must be at most 10,000.'
	},
	{
		name: 'boxes swap: week 0999-W10',
		form: [
			(i) => `/seasons/${i.season}/boxes?/swap`,
			(i) => ({ shareSizeId: i.share, week: '0999-W10', fromCropId: i.crop, toCropId: i.crop + 1, quantity: '1' })
		],
		status: 400
	},
	{
		name: "boxes swap: another farm's crop",
		form: [
			(i) => `/seasons/${i.season}/boxes?/swap`,
			(i) => ({ shareSizeId: i.share, week: '2027-W30', fromCropId: i.crop, toCropId: i.otherCrop, quantity: '1' })
		],
		status: 400
	},
	{
		name: "boxes swap: in another farm's season",
		form: [
			(i) => `/seasons/${i.otherSeason}/boxes?/swap`,
			(i) => ({
				shareSizeId: i.otherShare,
				week: '2027-W30',
				fromCropId: i.otherCrop,
				toCropId: i.otherCrop,
				quantity: '1'
			})
		],
		status: 404
	},
	{
		name: 'boxes short fill: 1e308 %',
		form: [(i) => `/seasons/${i.season}/boxes?/shortFill`, () => ({ shortFillPct: '1e308' })],
		status: 400,
		field: 'Short below must be'
	},
	{
		name: 'boxes undo: swap id as text',
		form: [(i) => `/seasons/${i.season}/boxes?/undo`, () => ({ swapId: 'all' })],
		status: 400,
		field: 'No such swap in this season.'
	},

	// The plan screen (its actions are the plan API)
	{
		name: 'POST plan preview: intervalWeeks 1e308',
		json: ['POST', (i) => `/api/seasons/${i.season}/plan/preview`, () => ({ intervalWeeks: big })],
		status: 400,
		field: 'intervalWeeks'
	},
	{
		name: 'POST plan preview: variety share fraction 5',
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/plan/preview`,
			(i) => ({ varietyPlan: { [String(i.crop)]: [{ varietyId: i.variety, fraction: 5 }] } })
		],
		status: 400
	},
	{
		name: 'POST plan apply: a made-up fingerprint',
		json: ['POST', (i) => `/api/seasons/${i.season}/plan/apply`, () => ({ fingerprint: 'not-a-preview' })],
		status: 400,
		field: 'fingerprint'
	},
	{
		name: "POST plan apply: another farm's variety in the plan",
		json: [
			'POST',
			(i) => `/api/seasons/${i.season}/plan/apply`,
			(i) => ({ varietyPlan: { [String(i.crop)]: [{ varietyId: i.otherVariety }] } })
		],
		status: 400
	},
	{
		name: "POST plan apply: another farm's season",
		json: ['POST', (i) => `/api/seasons/${i.otherSeason}/plan/apply`, () => ({})],
		status: 404
	},
	{
		name: "POST plan undo: another farm's season",
		json: ['POST', (i) => `/api/seasons/${i.otherSeason}/plan/undo`, () => ({})],
		status: 404
	},
	{
		name: 'POST plan apply: a 7 MB body',
		raw: [
			'POST',
			(i) => `/api/seasons/${i.season}/plan/apply`,
			() => JSON.stringify({ margin: 0.1, pad: 'x'.repeat(7 * 1024 * 1024) }),
			'application/json'
		],
		status: 413
	}
];

let ids: Ids;
let clients: Record<Who, Client>;
let other: NewFarm;

beforeAll(async () => {
	const db = testDb();
	const u = await db('users').where({ email: demo.owner }).first('id');
	const farmId = (await db('farm_members').where({ user_id: u.id }).first('farm_id')).farm_id;
	const season = (await db('seasons').where({ farm_id: farmId, year: 2027 }).first('id')).id;
	const harvest = await db('harvest_records as h')
		.join('plantings as p', 'p.id', 'h.planting_id')
		.where({ 'h.farm_id': farmId })
		.first('h.id', 'p.season_id');
	const planting = await db('plantings').where({ farm_id: farmId, season_id: season }).first('id', 'version');
	const bed = await db('beds').where({ farm_id: farmId }).first('id', 'block_id');
	const variety = await db('varieties').where({ farm_id: farmId }).first('id', 'crop_id');
	const share = await db('share_sizes').where({ season_id: season }).first('id');
	other = await signUpFarm('bad-input');
	const hand = await writeHandPlan(other.farmId);
	const [otherShare] = await db('share_sizes').insert({
		farm_id: other.farmId,
		season_id: hand.seasonId,
		name: 'Theirs',
		members: 3,
		first_week: '2027-W24',
		last_week: '2027-W30'
	});
	ids = {
		season,
		planting: planting.id,
		plantingVersion: planting.version,
		harvestSeason: harvest.season_id,
		harvest: harvest.id,
		share: share.id,
		block: bed.block_id,
		bed: bed.id,
		crop: variety.crop_id,
		variety: variety.id,
		otherVariety: (await db('varieties').where({ farm_id: other.farmId }).first('id')).id,
		otherBed: (await db('beds').where({ farm_id: other.farmId }).first('id')).id,
		otherBlock: (await db('blocks').where({ farm_id: other.farmId }).first('id')).id,
		otherCrop: hand.cropIds.carrot,
		otherPlanting: (await db('plantings').where({ farm_id: other.farmId }).first('id')).id,
		otherShare,
		otherSeason: hand.seasonId
	};
	clients = { owner: await signedIn(demo.owner, demo.password), crew: await signedIn(demo.crew, demo.password) };
});

describe('hostile input to every writing route', () => {
	for (const c of cases) {
		it(c.name, async () => {
			const before = await checksums();
			const client = clients[c.who ?? 'owner'];
			let res: Response;
			if (c.json) {
				const [method, path, body] = c.json;
				res = await client.json(path(ids), method, body(ids));
			} else if (c.form) {
				const [path, fields] = c.form;
				res = await client.postForm(path(ids), fields(ids));
			} else {
				const [method, path, body, type] = c.raw!;
				// Pages answer a browser's form post with HTML (and the failure's status); the API with JSON.
				const accept = path(ids).startsWith('/api/') ? 'application/json' : 'text/html';
				res = await client.request(path(ids), {
					method,
					body: body(),
					headers: { origin: baseUrl(), 'content-type': type, accept }
				});
			}
			const wanted = Array.isArray(c.status) ? c.status : [c.status];
			const text = c.form ? await html(res) : await res.text();
			expect(wanted, `${c.name}: answered ${res.status} ${text.slice(0, 300)}`).toContain(res.status);
			if (c.field) {
				if (c.form) expect(text).toContain(c.field);
				else expect(Object.keys(JSON.parse(text).errors ?? {}), text.slice(0, 300)).toContain(c.field);
			}
			expect(await checksums()).toEqual(before);
		});
	}
});

it('the checksums do see a change (control)', async () => {
	const before = await checksums();
	const row = await testDb()('plantings').where({ id: ids.planting }).first();
	await testDb()('plantings')
		.where({ id: ids.planting })
		.update({ notes: `${row.notes ?? ''} control` });
	const changed = await checksums();
	await testDb()('plantings').where({ id: ids.planting }).update({ notes: row.notes });
	expect(changed.plantings).not.toBe(before.plantings);
	// Put back as it was, but for its change stamp: any write moves that (the answer cache's
	// migration, 20261203_11d_change_stamps.ts), so a write that puts back the same values is seen too.
	expect({ ...(await checksums()), plantings: 'the row below' }).toEqual({ ...before, plantings: 'the row below' });
	const { change_seq: was, ...rest } = row;
	const { change_seq: now, ...restNow } = await testDb()('plantings').where({ id: ids.planting }).first();
	expect(restNow).toEqual(rest);
	expect(now).not.toBe(was);
});
