// The parts of a season, as tabs under its name. Which roles see a tab mirrors what the server
// allows on that page; the server's guards are what enforce it.
import type { Role } from './roles';
import type { Action } from './permissions';
import { shownTo, type RoleLink } from './navigation';

export interface SeasonTab extends RoleLink {
	/** Path below /seasons/{id}; '' is the season's overview. */
	path: string;
}

/** A tab shown to the roles that may take `action`: by default whoever may read the plan. */
const tab = (path: string, label: string, action: Action = 'plan.read'): SeasonTab => ({ path, label, action });

export const seasonTabs: readonly SeasonTab[] = [
	tab('', 'Overview'),
	tab('plantings', 'Planting grid'),
	tab('beds', 'Bed timeline'),
	tab('demand', 'Demand'),
	tab('plan', 'Plan'),
	tab('seeds', 'Seed order'),
	tab('forecast', 'Forecast'),
	tab('boxes', 'Share boxes'),
	tab('week', 'Crew sheets'),
	tab('transfer', 'Export & import'),
	tab('harvests', 'Harvest log'),
	tab('results', 'Actual vs plan')
];

export function seasonTabsFor(role: Role): SeasonTab[] {
	return shownTo(role, seasonTabs);
}
