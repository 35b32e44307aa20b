// A crop's field dates as a file cell: MM-DD text, or a date a spreadsheet made of it (only its month
// and day count), blank for none, absent when the file has no such column.
import { describe, expect, it } from 'vitest';
import { cropRowSchema } from '$lib/schemas/import';

const crop = { crop: 'Garlic', family: 'Amaryllidaceae', harvestUnit: 'head', frostTolerance: 'hardy' };

describe('field dates in an imported Crops & varieties row', () => {
	it('reads MM-DD text, a date cell and an Excel day number alike', () => {
		expect(cropRowSchema.parse({ ...crop, sowFrom: ' 10-01 ', sowTo: '12-15' })).toMatchObject({
			sowFrom: '10-01',
			sowTo: '12-15'
		});
		// A spreadsheet that took "10-01" for 1 October keeps a date: its month and day are the field date.
		const asDate = cropRowSchema.parse({ ...crop, sowFrom: new Date('2027-10-01T00:00:00Z'), sowTo: null });
		expect(asDate.sowFrom).toBe('10-01');
		expect(asDate.sowTo).toBeNull();
		// Excel's day 46661 is 2027-10-01 (day 25569 is 1970-01-01; + 21,092 days).
		expect(cropRowSchema.parse({ ...crop, sowFrom: 46661 }).sowFrom).toBe('10-01');
	});

	it('leaves them undefined when the file has no such column, and refuses a day no year has', () => {
		const none = cropRowSchema.parse(crop);
		expect(none.sowFrom).toBeUndefined();
		expect(none.sowTo).toBeUndefined();
		expect(cropRowSchema.safeParse({ ...crop, sowFrom: '02-30' }).success).toBe(false);
		expect(cropRowSchema.safeParse({ ...crop, sowFrom: 'October' }).success).toBe(false);
	});
});
