// The parts of a season, as tabs under its name. Which roles see a tab mirrors what the server
// allows on that page; the server's guards are what enforce it.
import type { Role } from './roles';
import { can, type Action } from './permissions';

export interface SeasonTab {
	/** Path below /seasons/{id}; '' is the season's overview. */
	path: string;
	label: string;
	/** Shown to the roles that may take this action. */
	action: Action;
}

export const seasonTabs: readonly SeasonTab[] = [
	{ path: '', label: 'Overview', action: 'plan.read' },
	{ path: 'plantings', label: 'Planting grid', action: 'plan.read' },
	{ path: 'beds', label: 'Bed timeline', action: 'plan.read' },
	{ path: 'demand', label: 'Demand', action: 'plan.read' },
	{ path: 'plan', label: 'Plan', action: 'plan.read' },
	{ path: 'seeds', label: 'Seed order', action: 'plan.read' },
	{ path: 'forecast', label: 'Forecast', action: 'plan.read' },
	{ path: 'boxes', label: 'Share boxes', action: 'plan.read' },
	{ path: 'week', label: 'Crew sheets', action: 'plan.read' },
	{ path: 'transfer', label: 'Export & import', action: 'plan.read' },
	{ path: 'harvests', label: 'Harvest log', action: 'plan.read' },
	{ path: 'results', label: 'Actual vs plan', action: 'plan.read' }
];

export function seasonTabsFor(role: Role): SeasonTab[] {
	return seasonTabs.filter((t) => can(role, t.action));
}
