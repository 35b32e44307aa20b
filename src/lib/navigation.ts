// The top bar's links. Each shows to the roles that may take its action (permissions.ts);
// the server's guards are what enforce it.
import type { Role } from './roles';
import { can, type Action } from './permissions';

export interface NavItem {
	href: string;
	label: string;
	/** Shown to the roles that may take this action. */
	action: Action;
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
	return navItems.filter((item) => can(role, item.action) && (devMail || item.href !== '/dev/mail'));
}
