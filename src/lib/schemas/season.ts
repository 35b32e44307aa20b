// The seasons page's forms: a new season (empty, or copied from another), a new name.
import { z } from 'zod';
import { numberField, plainText } from './common';

export const seasonCreateSchema = z.object({
	year: numberField('Year', 2000, 2100, { int: true }),
	name: plainText('Season name', 80)
});

export const seasonRenameSchema = z.object({ name: plainText('Season name', 80) });

export const seasonCopySchema = z.object({ from: numberField('Season to copy', 1, 2 ** 31 - 1, { int: true }) });
