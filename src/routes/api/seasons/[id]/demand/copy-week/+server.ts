import type { RequestHandler } from './$types';
import { copyWeek } from '$lib/server/demand-cells';
import { demandWrite } from '../respond';

/** Copies one week of a grid onto a range of weeks ({ grid, fromWeek, toFirst, toLast }). */
export const POST: RequestHandler = demandWrite(copyWeek);
