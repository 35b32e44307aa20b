// The first day on or after a date when a season has crew work: a tray to sow, a bed to sow or
// plant, or a harvest running. The crew sheets open on it when the current week has nothing
// (in winter the season's first week is often empty), so the crew lead lands on real work.
import { db } from '../db';

export async function nextTaskDate(
	farmId: number,
	seasonId: number,
	from: string,
	until: string
): Promise<string | null> {
	const live = { 'p.farm_id': farmId, 'p.season_id': seasonId };
	const [tray, field, harvest] = await Promise.all([
		db()('plantings as p')
			.where(live)
			.whereNot('p.status', 'failed')
			.whereBetween('p.tray_sow_date', [from, until])
			.min({ d: 'p.tray_sow_date' })
			.first(),
		db()('plantings as p')
			.where(live)
			.whereNot('p.status', 'failed')
			.whereBetween('p.field_date', [from, until])
			.min({ d: 'p.field_date' })
			.first(),
		// A harvest already running on `from` counts from `from`; one still to come from its first day.
		db()('plantings as p')
			.where(live)
			.whereNotIn('p.status', ['failed', 'finished'])
			.where('p.last_harvest', '>=', from)
			.where('p.first_harvest', '<=', until)
			.min({ d: 'p.first_harvest' })
			.first()
	]);
	const dates = [tray?.d, field?.d, harvest?.d && harvest.d < from ? from : harvest?.d].filter(
		(d): d is string => typeof d === 'string' && d !== ''
	);
	return dates.length ? dates.sort()[0] : null;
}
