import { PlanningInputError, requireNonNegative } from './errors';
import { parseIsoWeek } from './iso-week';
import type { CropWeekQuantity, ExplainStep } from './types';

export interface ShareSize {
	id: string;
	members: number;
	/** First and last distribution weeks, inclusive, "YYYY-Www". */
	firstWeek: string;
	lastWeek: string;
}

export interface BoxItem {
	shareSizeId: string;
	week: string;
	crop: string;
	/** Per box, in the crop's harvest unit. */
	quantity: number;
}

export interface TargetInput {
	shareSizes: ShareSize[];
	boxItems: BoxItem[];
	channelDemand: CropWeekQuantity[];
}

export interface TargetNote {
	code: 'box_outside_distribution' | 'unknown_share_size';
	message: string;
	item: BoxItem;
}

// ISO week strings are zero-padded and year-first, so string order is week order.
function inWeeks(week: string, share: ShareSize): boolean {
	return week >= share.firstWeek && week <= share.lastWeek;
}

function validate(input: TargetInput): Map<string, ShareSize> {
	const shares = new Map<string, ShareSize>();
	input.shareSizes.forEach((s, i) => {
		requireNonNegative(`shareSizes[${i}].members`, s.members);
		parseIsoWeek(s.firstWeek, `shareSizes[${i}].firstWeek`);
		parseIsoWeek(s.lastWeek, `shareSizes[${i}].lastWeek`);
		if (s.lastWeek < s.firstWeek) throw new PlanningInputError(`shareSizes[${i}].lastWeek`, 'is before firstWeek');
		shares.set(s.id, s);
	});
	input.boxItems.forEach((b, i) => {
		parseIsoWeek(b.week, `boxItems[${i}].week`);
		requireNonNegative(`boxItems[${i}].quantity`, b.quantity);
	});
	input.channelDemand.forEach((c, i) => {
		parseIsoWeek(c.week, `channelDemand[${i}].week`);
		requireNonNegative(`channelDemand[${i}].quantity`, c.quantity);
	});
	return shares;
}

/**
 * Weekly targets per crop (DESIGN "Demand"): Σ members × box quantity over
 * share sizes, counting a box item only in its share's distribution weeks,
 * plus other channels (market, restaurant). Box items outside the weeks, or
 * for an unknown share size, are left out and reported in `notes`.
 */
export function deriveTargetsWithNotes(input: TargetInput): { targets: CropWeekQuantity[]; notes: TargetNote[] } {
	const shares = validate(input);
	const sums = new Map<string, CropWeekQuantity>();
	const add = (crop: string, week: string, q: number): void => {
		const k = `${crop}\u0000${week}`;
		const row = sums.get(k);
		if (row) row.quantity += q;
		else sums.set(k, { crop, week, quantity: q });
	};
	const notes: TargetNote[] = [];
	for (const item of input.boxItems) {
		const share = shares.get(item.shareSizeId);
		if (!share) {
			notes.push({
				code: 'unknown_share_size',
				message: `Box item for ${item.crop} in ${item.week} names unknown share size ${item.shareSizeId}.`,
				item
			});
			continue;
		}
		if (!inWeeks(item.week, share)) {
			notes.push({
				code: 'box_outside_distribution',
				message: `Box item for ${item.crop} in ${item.week} falls outside share ${share.id}'s weeks ${share.firstWeek}–${share.lastWeek}; not counted.`,
				item
			});
			continue;
		}
		add(item.crop, item.week, share.members * item.quantity);
	}
	for (const c of input.channelDemand) add(c.crop, c.week, c.quantity);
	const targets = [...sums.values()].sort((a, b) =>
		a.crop < b.crop ? -1 : a.crop > b.crop ? 1 : a.week < b.week ? -1 : a.week > b.week ? 1 : 0
	);
	return { targets, notes };
}

export function deriveTargets(input: TargetInput): CropWeekQuantity[] {
	return deriveTargetsWithNotes(input).targets;
}

/** How one crop's target in one week was reached. */
export function explainTargets(input: TargetInput, crop: string, week: string): ExplainStep[] {
	const shares = validate(input);
	const steps: ExplainStep[] = [];
	let total = 0;
	for (const item of input.boxItems) {
		if (item.crop !== crop || item.week !== week) continue;
		const share = shares.get(item.shareSizeId);
		if (!share || !inWeeks(week, share)) {
			steps.push({
				label: `${item.shareSizeId} box (not distributing in ${week})`,
				value: 0,
				formula: 'outside distribution weeks'
			});
			continue;
		}
		const q = share.members * item.quantity;
		total += q;
		steps.push({
			label: `${share.id} shares`,
			value: q,
			formula: `${share.members} members × ${item.quantity} per box`
		});
	}
	for (const c of input.channelDemand) {
		if (c.crop !== crop || c.week !== week) continue;
		total += c.quantity;
		steps.push({ label: 'other channels', value: c.quantity, formula: 'market, restaurant' });
	}
	steps.push({ label: `${crop} target in ${week}`, value: total, formula: 'Σ members × box quantity + channels' });
	return steps;
}
