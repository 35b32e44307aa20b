// The three roles of a farm and what each may open. The server enforces these (guards.ts);
// the navigation only mirrors them.
export const roles = ['owner', 'crew_lead', 'share_manager'] as const;
export type Role = (typeof roles)[number];

export const roleLabels: Record<Role, string> = {
	owner: 'Owner',
	crew_lead: 'Crew lead',
	share_manager: 'Share manager'
};

export interface NavItem {
	href: string;
	label: string;
	roles: readonly Role[];
}

const everyone = roles;

export const navItems: readonly NavItem[] = [
	{ href: '/', label: 'This week', roles: everyone },
	{ href: '/seasons', label: 'Seasons', roles: everyone },
	{ href: '/crops', label: 'Crop library', roles: everyone },
	{ href: '/settings', label: 'Farm & beds', roles: ['owner'] },
	{ href: '/setup', label: 'Set-up', roles: ['owner'] },
	{ href: '/import', label: 'Import', roles: ['owner'] },
	{ href: '/team', label: 'Team', roles: ['owner'] },
	{ href: '/dev/mail', label: 'Mail (dev)', roles: ['owner'] }
];

export function navFor(role: Role, devMail: boolean): NavItem[] {
	return navItems.filter((item) => item.roles.includes(role) && (devMail || item.href !== '/dev/mail'));
}
