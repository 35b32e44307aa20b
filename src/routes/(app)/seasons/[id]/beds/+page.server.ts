import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guards';
import * as farms from '$lib/server/farms';
import { freeSpaceFor, loadTimeline, type FreeSpaceAnswer } from '$lib/server/timeline';
import { freeSpaceQuerySchemaFor } from '$lib/schemas/free-space';
import { fieldErrors, type FieldErrors } from '$lib/schemas/common';
import { addWeeks, isoWeek } from '$lib/planning';
import { todayIn } from '$lib/today';

export const load = (async (event) => {
	const { farm } = requireUser(event);
	const { season } = await event.parent();
	const sp = event.url.searchParams;
	const rawBlock = sp.get('block') ?? '';
	const blockId = /^\d+$/.test(rawBlock) ? Number(rawBlock) : null;
	const [timeline, settings] = await Promise.all([loadTimeline(farm.id, season, blockId), farms.get(farm.id)]);

	// The free-space form is a GET form: its answer is part of the page (and the URL can be shared).
	const today = todayIn(settings.timeZone);
	const start = today >= season.startsOn && today <= season.endsOn ? today : season.startsOn;
	const values = {
		from: sp.get('from') ?? isoWeek(start),
		to: sp.get('to') ?? addWeeks(isoWeek(start), 3),
		minFt: sp.get('minFt') ?? ''
	};
	let free: { answer: FreeSpaceAnswer; errors?: undefined } | { errors: FieldErrors; answer?: undefined } | null = null;
	if (sp.has('from') || sp.has('to')) {
		const parsed = freeSpaceQuerySchemaFor(settings.unitSystem).safeParse({ ...values, block: blockId ?? undefined });
		free = parsed.success
			? { answer: await freeSpaceFor(farm.id, parsed.data) }
			: { errors: fieldErrors(parsed.error) };
	}
	return { timeline, blockId: timeline.blocks.some((b) => b.id === blockId) ? blockId : null, values, free };
}) satisfies PageServerLoad;
