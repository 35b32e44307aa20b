import type { RequestHandler } from './$types';
import { saveCells } from '$lib/server/demand-cells';
import { demandWrite } from '../respond';

/** Sets cells of one grid ({ grid, cells: [{ crop, week, quantity, unit }] }); all or none. */
export const PATCH: RequestHandler = demandWrite(saveCells);
