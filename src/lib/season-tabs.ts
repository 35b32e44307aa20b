// The parts of a season, as tabs under its name. Which roles see a tab mirrors what the server
// allows on that page; the server's guards are what enforce it.
import type { Role } from './roles';

export interface SeasonTab {
	/** Path below /seasons/{id}; '' is the season's overview. */
	path: string;
	label: string;
	roles: readonly Role[];
}

const everyone: readonly Role[] = ['owner', 'crew_lead', 'share_manager'];

export const seasonTabs: readonly SeasonTab[] = [
	{ path: '', label: 'Overview', roles: everyone },
	{ path: 'plantings', label: 'Planting grid', roles: everyone },
	{ path: 'beds', label: 'Bed timeline', roles: everyone },
	{ path: 'demand', label: 'Demand', roles: everyone },
	{ path: 'plan', label: 'Plan', roles: everyone },
	{ path: 'forecast', label: 'Forecast', roles: everyone },
	{ path: 'boxes', label: 'Share boxes', roles: everyone },
	{ path: 'week', label: 'Crew sheets', roles: everyone },
	{ path: 'transfer', label: 'Export & import', roles: everyone },
	{ path: 'harvests', label: 'Harvest log', roles: everyone },
	{ path: 'results', label: 'Actual vs plan', roles: everyone }
];

export function seasonTabsFor(role: Role): SeasonTab[] {
	return seasonTabs.filter((t) => t.roles.includes(role));
}
