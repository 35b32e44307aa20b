import { type Bed, type BedPlanting, DEFAULT_TURNAROUND_DAYS, FT_EPSILON } from './bed-types';
import { requireNonNegativeInteger } from './errors';
import { toDayNumber } from './day-number';

export interface BedConflict {
	plantingKey: string;
	bedId: string;
	code: 'overlap' | 'past_bed_end' | 'unknown_bed';
	message: string;
	/** The other planting, for overlaps. */
	withKey?: string;
}

/**
 * Overlap and past-the-end warnings for plantings already in beds (DESIGN
 * step 4), for the grid and the bed timeline. Two plantings overlap when they
 * share bed-feet in the same bed while both hold it: [fieldDate, lastHarvest +
 * turnaroundDays]. Each overlap is reported on both plantings. Per bed, a sweep
 * in field-date order compares a planting only with those still in the ground.
 */
export function checkBedConflicts(
	plantings: BedPlanting[],
	beds: Bed[],
	turnaroundDays = DEFAULT_TURNAROUND_DAYS
): BedConflict[] {
	requireNonNegativeInteger('turnaroundDays', turnaroundDays);
	const bedById = new Map(beds.map((b) => [b.id, b]));
	const out: BedConflict[] = [];
	const byBed = new Map<string, { p: BedPlanting; s: number; e: number }[]>();
	plantings.forEach((p, i) => {
		const bed = bedById.get(p.bedId);
		if (!bed) {
			out.push({ plantingKey: p.key, bedId: p.bedId, code: 'unknown_bed', message: `Bed ${p.bedId} does not exist.` });
			return;
		}
		if (p.startFt < -FT_EPSILON || p.startFt + p.lengthFt > bed.lengthFt + FT_EPSILON) {
			out.push({
				plantingKey: p.key,
				bedId: p.bedId,
				code: 'past_bed_end',
				message: `Range ${p.startFt}–${p.startFt + p.lengthFt} ft runs past bed ${bed.id} (0–${bed.lengthFt} ft).`
			});
		}
		const s = toDayNumber(p.fieldDate, `plantings[${i}].fieldDate`);
		const e = toDayNumber(p.lastHarvest, `plantings[${i}].lastHarvest`) + turnaroundDays + 1;
		const list = byBed.get(p.bedId) ?? [];
		list.push({ p, s, e });
		byBed.set(p.bedId, list);
	});
	for (const [bedId, list] of byBed) {
		list.sort((x, y) => x.s - y.s);
		let active: typeof list = [];
		for (const cur of list) {
			active = active.filter((o) => o.e > cur.s);
			const a = cur.p.startFt;
			const b = a + cur.p.lengthFt;
			for (const o of active) {
				const oa = o.p.startFt;
				const ob = oa + o.p.lengthFt;
				if (oa < b - FT_EPSILON && a < ob - FT_EPSILON) {
					const msg = (x: BedPlanting, y: BedPlanting): string =>
						`${x.key} (${x.startFt}–${x.startFt + x.lengthFt} ft, ${x.fieldDate} to ${x.lastHarvest}) overlaps ${y.key} (${y.startFt}–${y.startFt + y.lengthFt} ft, ${y.fieldDate} to ${y.lastHarvest}) in bed ${bedId}, counting ${turnaroundDays} turnaround days.`;
					out.push({ plantingKey: cur.p.key, bedId, code: 'overlap', message: msg(cur.p, o.p), withKey: o.p.key });
					out.push({ plantingKey: o.p.key, bedId, code: 'overlap', message: msg(o.p, cur.p), withKey: cur.p.key });
				}
			}
			active.push(cur);
		}
	}
	return out;
}
