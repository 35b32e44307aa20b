import type { ForecastRow } from './forecast';
import type { TargetInput } from './targets';

export interface BoxCheck {
	shareSizeId: string;
	week: string;
	fillable: boolean;
	/** Crops in the box whose week's supply is below that week's total demand, with the fraction supplied. */
	short: { crop: string; fillRatio: number }[];
}

/**
 * For each share size and distribution week with box items: can the planned
 * box be filled? A crop counts as short when its forecast supply is below its
 * total demand that week (boxes and channels together); how a short harvest is
 * divided between shares and channels is the share manager's call, so the
 * fraction supplied is reported rather than an allocation.
 */
export function checkBoxes(rows: ForecastRow[], input: TargetInput): BoxCheck[] {
	const ratio = new Map<string, number>();
	for (const r of rows) ratio.set(`${r.crop}\u0000${r.week}`, r.demand > 0 ? Math.min(1, r.supply / r.demand) : 1);
	const shares = new Map(input.shareSizes.map((s) => [s.id, s]));
	const boxes = new Map<string, BoxCheck>();
	for (const item of input.boxItems) {
		const share = shares.get(item.shareSizeId);
		if (!share || item.week < share.firstWeek || item.week > share.lastWeek || item.quantity <= 0) continue;
		const k = `${item.shareSizeId}\u0000${item.week}`;
		let box = boxes.get(k);
		if (!box) boxes.set(k, (box = { shareSizeId: item.shareSizeId, week: item.week, fillable: true, short: [] }));
		const fill = ratio.get(`${item.crop}\u0000${item.week}`) ?? 0;
		if (fill < 1 - 1e-9) {
			box.fillable = false;
			box.short.push({ crop: item.crop, fillRatio: fill });
		}
	}
	return [...boxes.values()].sort((a, b) =>
		a.week < b.week ? -1 : a.week > b.week ? 1 : a.shareSizeId < b.shareSizeId ? -1 : 1
	);
}
