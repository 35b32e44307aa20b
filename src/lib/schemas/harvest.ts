// Harvest records as the log takes them: one schema for the phone form, the keyboard table,
// the JSON API and the browser alike. Checks that need the database (the planting's crop
// unit and field date) are made in $lib/server/harvests.ts and name the same fields.
import { z } from 'zod';
import { isoDate, numberField } from './common';

export const harvestUnits = ['lb', 'bunch', 'head', 'each'] as const;
export type HarvestUnit = (typeof harvestUnits)[number];

/**
 * The largest quantity one harvest record may hold, per unit. A record is one planting's
 * harvest on one day; these bounds catch a slipped digit (2500 for 25.00) without getting in
 * the way of a big planting. Chosen as about ten times a generous 300 ft planting's whole
 * window (e.g. 300 ft × 10 lb/ft summer squash = 3,000 lb over weeks):
 * common practice (no published source).
 */
export const maxPerRecord: Record<HarvestUnit, number> = { lb: 5000, bunch: 3000, head: 3000, each: 10000 };

const unit = z.enum(harvestUnits, { error: 'Unit must be one of lb, bunch, head or each.' });
const optionalNotes = z.preprocess(
	(v) => (typeof v === 'string' && v.trim() === '' ? undefined : v),
	z
		.string()
		.trim()
		.max(500, 'Notes must be at most 500 characters.')
		.refine((v) => !/[<>]/.test(v), 'Notes may not contain < or >.')
		.optional()
);
const who = z.preprocess(
	(v) => (typeof v === 'string' && v.trim() === '' ? undefined : v),
	z.string().trim().max(40, 'Who must be a member of the farm.').optional()
);
const flag = z.preprocess((v) => v === true || v === 'on' || v === 'true' || v === '1', z.boolean());

const fields = {
	plantingId: numberField('Planting', 1, 2 ** 31 - 1, { int: true }),
	harvestedOn: isoDate('Date'),
	// Bounds are checked below, per unit, with messages that say what is wrong.
	quantity: numberField('Quantity', -Number.MAX_SAFE_INTEGER, Number.MAX_SAFE_INTEGER),
	unit,
	/** The member who harvested (user id); the person logging, when left empty. */
	harvestedBy: who,
	notes: optionalNotes,
	/** Marks the planting finished: its last harvest is this record's date. */
	finished: flag.optional()
};

/** Quantity above zero, with at most two decimals, and within the unit's plausible maximum. */
function checkQuantity(v: { quantity: number; unit: HarvestUnit }, ctx: z.RefinementCtx): void {
	if (!(v.quantity > 0)) ctx.addIssue({ code: 'custom', path: ['quantity'], message: 'Quantity must be more than 0.' });
	else if (v.quantity > maxPerRecord[v.unit])
		ctx.addIssue({
			code: 'custom',
			path: ['quantity'],
			message: `Quantity of ${v.quantity} ${v.unit} is more than one harvest can hold (at most ${maxPerRecord[v.unit].toLocaleString('en-US')} ${v.unit} a record): check the figure.`
		});
	else if (Math.abs(Math.round(v.quantity * 100) - v.quantity * 100) > 1e-6)
		ctx.addIssue({ code: 'custom', path: ['quantity'], message: 'Quantity takes at most two decimals.' });
}

export const harvestSchema = z.strictObject(fields).superRefine(checkQuantity);
export type HarvestInput = z.infer<typeof harvestSchema>;

/** An edit: every field but the planting may change. */
export const harvestPatchSchema = z
	.strictObject({
		harvestedOn: fields.harvestedOn,
		quantity: fields.quantity,
		unit,
		harvestedBy: who,
		notes: optionalNotes
	})
	.superRefine(checkQuantity);
export type HarvestPatch = z.infer<typeof harvestPatchSchema>;

/** A morning's sheet from the keyboard table: rows share the date and who, all or none saved. */
export const harvestBatchSchema = z.strictObject({
	records: z
		.array(harvestSchema, { error: 'Records must be a list.' })
		.min(1, 'Enter at least one row.')
		.max(200, 'At most 200 rows at once.')
});
export type HarvestBatch = z.infer<typeof harvestBatchSchema>;

/** "Use these figures" for one variety (owner, results page). */
export const varietyFiguresSchema = z.strictObject({
	varietyId: numberField('Variety', 1, 2 ** 31 - 1, { int: true })
});
/** Undo one recorded change of variety figures. */
export const figureChangeSchema = z.strictObject({ changeId: numberField('Change', 1, 2 ** 31 - 1, { int: true }) });
