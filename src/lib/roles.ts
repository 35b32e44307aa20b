// The three roles of a farm. What each may do is in permissions.ts; the server enforces it (guards.ts).
export const roles = ['owner', 'crew_lead', 'share_manager'] as const;
export type Role = (typeof roles)[number];

export const roleLabels: Record<Role, string> = {
	owner: 'Owner',
	crew_lead: 'Crew lead',
	share_manager: 'Share manager'
};
