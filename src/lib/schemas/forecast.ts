// The forecast's query string (GET /api/seasons/{id}/forecast) and the box swap input, shared
// by the API routes, the page actions and the browser.
import { z } from 'zod';
import { isoWeekKey } from './common';

/** An ISO week 'YYYY-Www' that exists, in 1900–2200 (the app's one week rule). */
export const isoWeekField = isoWeekKey;

/** Longest range one request may ask for: two years of weeks. */
export const MAX_FORECAST_WEEKS = 106;

export const forecastQuerySchema = z
	.object({
		crops: z
			.string()
			.trim()
			.regex(/^\d+(,\d+)*$/, 'crops must be crop ids separated by commas, like 3,7,12.')
			.transform((v) => [...new Set(v.split(',').map(Number))])
			.optional(),
		from: isoWeekField('from').optional(),
		to: isoWeekField('to').optional(),
		// 'rows' (the default): one object per crop-week. 'series': per crop, one array per
		// figure across the weeks — a quarter of the bytes, what the forecast page asks for.
		shape: z.enum(['rows', 'series'], { error: "shape must be 'rows' or 'series'." }).optional()
	})
	.refine((q) => !q.from || !q.to || q.from <= q.to, { path: ['to'], message: 'to must not be before from.' });

export type ForecastQuery = z.infer<typeof forecastQuerySchema>;

/** A whole number from a form field (a string) or JSON (a number). */
const idField = (label: string) =>
	z.preprocess(
		(v) => (typeof v === 'string' && /^\s*\d+\s*$/.test(v) ? Number(v) : v),
		z
			.number({ error: `${label} must be an id.` })
			.int(`${label} must be an id.`)
			.positive(`${label} must be an id.`)
	);

export const swapSchema = z
	.object({
		shareSizeId: idField('shareSizeId'),
		week: isoWeekField('week'),
		fromCropId: idField('fromCropId'),
		toCropId: idField('toCropId'),
		quantity: z.preprocess(
			(v) => (typeof v === 'string' && v.trim() !== '' ? Number(v.trim().replace(',', '.')) : v),
			z
				.number({ error: 'quantity must be a number.' })
				.positive('quantity must be above 0.')
				.max(10_000, 'quantity must be at most 10,000.')
		),
		// For a substitute of another unit: how much of it goes in per box, as the share manager confirmed it.
		toQuantity: z.preprocess(
			(v) => (v === '' || v === null ? undefined : typeof v === 'string' ? Number(v.trim().replace(',', '.')) : v),
			z
				.number({ error: 'toQuantity must be a number.' })
				.positive('toQuantity must be above 0.')
				.max(10_000, 'toQuantity must be at most 10,000.')
				.optional()
		)
	})
	.strict()
	.refine((s) => s.fromCropId !== s.toCropId, { path: ['toCropId'], message: 'toCropId must differ from fromCropId.' });

export type SwapInput = z.infer<typeof swapSchema>;

/** The fill under which a box item is flagged short, in percent (the share manager sets it). */
export const shortFillSchema = z.object({
	shortFillPct: z.preprocess(
		(v) => (typeof v === 'string' && v.trim() !== '' ? Number(v.trim().replace(',', '.')) : v),
		z
			.number({ error: 'Short below must be a number.' })
			.int('Short below must be a whole percent.')
			.min(50, 'Short below must be at least 50 %.')
			.max(100, 'Short below must be at most 100 %.')
	)
});
