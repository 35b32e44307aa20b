// Demand inputs: share sizes, grid cells (box contents and channel demand), copy-a-week, and one
// row of a demand upload. Shared by the page forms, the JSON routes, the upload and the browser.
import { z } from 'zod';
import { isoWeekKey, moneyCents, numberField, plainText } from './common';

export const harvestUnits = ['lb', 'bunch', 'head', 'each'] as const;
export type HarvestUnit = (typeof harvestUnits)[number];

export const pickupDayNames = ['Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat', 'Sun'] as const;
export const channels = ['market', 'restaurant'] as const;
export type Channel = (typeof channels)[number];

/** An ISO 8601 week, "YYYY-Www", that exists in its year, in 1900–2200: the app's one week rule. */
export const isoWeekField = isoWeekKey;

export const shareSizeSchema = z
	.object({
		name: plainText('Name', 60),
		members: numberField('Members', 0, 100_000, { int: true }),
		firstWeek: isoWeekField('First week'),
		lastWeek: isoWeekField('Last week'),
		pickupDays: z
			.preprocess(
				(v) =>
					v === undefined || v === null || v === ''
						? []
						: typeof v === 'string'
							? v.split(/[,\s]+/).filter(Boolean)
							: v,
				z.array(z.enum(pickupDayNames, { error: 'Pickup days must be among Mon, Tue, Wed, Thu, Fri, Sat, Sun.' }))
			)
			.transform((days) => pickupDayNames.filter((d) => days.includes(d))),
		price: moneyCents('Price', 10_000_000)
	})
	.strict()
	.refine((v) => v.lastWeek >= v.firstWeek, {
		message: 'Last week must not be before the first week.',
		path: ['lastWeek']
	});
export type ShareSizeInput = z.infer<typeof shareSizeSchema>;

/** Which editable table a cell belongs to: a share size's boxes, or a channel. */
export const gridSchema = z.union([z.string().regex(/^share:\d+$/), z.enum(channels)], {
	error: 'Grid must be share:<id>, market or restaurant.'
});
export type GridKey = z.infer<typeof gridSchema>;

export const cellSchema = z
	.object({
		crop: numberField('Crop', 1, Number.MAX_SAFE_INTEGER, { int: true }),
		week: isoWeekField('Week'),
		// Empty (null) or 0 clears the cell.
		quantity: z.preprocess(
			(v) => (v === '' || v === undefined ? null : v),
			numberField('Quantity', 0, 100_000).nullable()
		),
		unit: z.enum(harvestUnits, { error: 'Unit must be lb, bunch, head or each.' }),
		// What the cell held when the editor opened it (empty: nothing). A cell sent unchanged from
		// that is left as it is now, so a save never undoes what someone else saved meanwhile.
		was: z.preprocess((v) => (v === '' ? null : v), numberField('Previous quantity', 0, 100_000).nullable()).optional()
	})
	.strict();
export type CellInput = z.infer<typeof cellSchema>;

export const cellsSchema = z
	.object({
		grid: gridSchema,
		cells: z.array(cellSchema).max(20_000, 'At most 20,000 cells at once.')
	})
	.strict();
export type CellsInput = z.infer<typeof cellsSchema>;

export const copyWeekSchema = z
	.object({
		grid: gridSchema,
		fromWeek: isoWeekField('Copy from'),
		toFirst: isoWeekField('First week of the range'),
		toLast: isoWeekField('Last week of the range')
	})
	.strict()
	.refine((v) => v.toLast >= v.toFirst, {
		message: 'The range must end on or after its first week.',
		path: ['toLast']
	});
export type CopyWeekInput = z.infer<typeof copyWeekSchema>;

/**
 * One data row of a demand upload (see README "Demand upload"): channel is a share size's name,
 * `market` or `restaurant`; crop is the library name; unit is optional but, when given, must be
 * the crop's harvest unit.
 */
export const uploadColumns = ['channel', 'crop', 'week', 'quantity', 'unit'] as const;
export const uploadRowSchema = z.object({
	channel: plainText('channel', 60),
	crop: plainText('crop', 80),
	week: isoWeekField('week'),
	quantity: numberField('quantity', 0, 100_000),
	unit: z.preprocess(
		(v) => (typeof v === 'string' && v.trim() === '' ? undefined : typeof v === 'string' ? v.trim().toLowerCase() : v),
		// kg: a metric farm's file (the database keeps lb; the upload converts).
		z.enum([...harvestUnits, 'kg'], { error: 'unit must be lb, kg, bunch, head or each (or empty).' }).optional()
	)
});
export type UploadRow = z.infer<typeof uploadRowSchema>;

export const uploadModeSchema = z.enum(['merge', 'replace'], { error: 'Mode must be merge or replace.' });
