// The top bar's links. Each shows to the roles that may take its action (permissions.ts);
// the server's guards are what enforce it. The season's tabs (season-tabs.ts) are links alike.
import type { Role } from './roles';
import { can, type Action } from './permissions';

/** A link or tab, shown to the roles that may take its action. */
export interface RoleLink {
	label: string;
	action: Action;
}

/** The links a role is shown. */
export function shownTo<T extends RoleLink>(role: Role, links: readonly T[]): T[] {
	return links.filter((l) => can(role, l.action));
}

export interface NavItem extends RoleLink {
	href: string;
}

export const navItems: readonly NavItem[] = [
	{ href: '/', label: 'This week', action: 'plan.read' },
	{ href: '/seasons', label: 'Seasons', action: 'plan.read' },
	{ href: '/crops', label: 'Crop library', action: 'plan.read' },
	{ href: '/settings', label: 'Farm & beds', action: 'farm.settings' },
	{ href: '/setup', label: 'Set-up', action: 'farm.settings' },
	{ href: '/import', label: 'Import', action: 'season.import' },
	{ href: '/team', label: 'Team', action: 'team.manage' },
	{ href: '/dev/mail', label: 'Mail (dev)', action: 'mail.read' }
];

export function navFor(role: Role, devMail: boolean): NavItem[] {
	return shownTo(role, navItems).filter((item) => devMail || item.href !== '/dev/mail');
}
