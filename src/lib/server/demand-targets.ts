// A season's demand in the engine's shape (crops by id), for target derivation. Apart from the
// rest of demand.ts so that seasons.ts (the plan-against-demand stamp) can read it without a circle.
import type { TargetInput } from '$lib/planning';
import { db } from './db';

export async function targetInput(farmId: number, seasonId: number): Promise<TargetInput> {
	const [shares, items, channels] = await Promise.all([
		db()('share_sizes')
			.where({ farm_id: farmId, season_id: seasonId })
			.select('id', 'members', 'first_week', 'last_week'),
		db()('box_items as i')
			.join('share_sizes as s', 's.id', 'i.share_size_id')
			.where({ 's.farm_id': farmId, 's.season_id': seasonId })
			.select('i.share_size_id', 'i.week', 'i.crop_id', 'i.quantity'),
		db()('channel_demand').where({ farm_id: farmId, season_id: seasonId }).select('crop_id', 'week', 'quantity')
	]);
	return {
		shareSizes: shares.map((s) => ({
			id: String(s.id),
			members: s.members,
			firstWeek: s.first_week,
			lastWeek: s.last_week
		})),
		boxItems: items.map((i) => ({
			shareSizeId: String(i.share_size_id),
			week: i.week,
			crop: String(i.crop_id),
			quantity: Number(i.quantity)
		})),
		channelDemand: channels.map((c) => ({ crop: String(c.crop_id), week: c.week, quantity: Number(c.quantity) }))
	};
}
