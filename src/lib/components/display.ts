// The signed-in farm's display choices (unit system, currency, time zone, date style), as the
// (app) layout loads them, for components that format quantities without a page's data in hand.
import { page } from '$app/state';
import { defaultPrefs, type DisplayPrefs } from '$lib/format';

export function farmDisplay(): DisplayPrefs {
	return (page.data.display as DisplayPrefs | undefined) ?? defaultPrefs;
}
