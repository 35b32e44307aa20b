// Who may do what, in one table. The server's guards (requireCan) enforce it; the pages, the
// grid and the navigation ask the same table so that what they offer matches what is allowed.
// The README's "Who does what" table is checked against this one by tests/unit/permissions.test.ts.
import { roles, type Role } from './roles';

const everyone = roles;

/** Every guarded action, with the roles that may take it. Order of roles: owner, crew lead, share manager. */
export const permissions = {
	/** Farm settings and beds. */
	'farm.settings': ['owner'],
	/** Team members and invites. */
	'team.manage': ['owner'],
	/** The development mailbox (read the mail the app sent). */
	'mail.read': ['owner'],
	/** Read the plan, the demand, the forecast, the boxes and the sheets. */
	'plan.read': everyone,
	/** Generate and apply a plan; add, remove and edit every field of a planting. */
	'plan.edit': ['owner'],
	/** Record what happened to a planting: its status, actual dates and notes (see plantingRecordFields). */
	'planting.record': ['owner', 'crew_lead'],
	/** Import a workbook into the farm or a season. */
	'season.import': ['owner'],
	/** Start next season as a copy of this one. */
	'season.copy': ['owner'],
	/** Start an empty season, rename a season, archive it and bring it back. */
	'seasons.manage': ['owner'],
	/** Add, edit, archive and delete crops and varieties; pick crops from the starter library. */
	'library.edit': ['owner'],
	/** Take observed yields and days to maturity into the variety figures (and undo it). */
	'varieties.adopt': ['owner'],
	/** Mark the week's tasks done and send the crew sheets by e-mail. */
	'tasks.mark': ['owner', 'crew_lead'],
	/** Log, edit and remove harvest records. */
	'harvests.log': ['owner', 'crew_lead'],
	/** Keep share sizes, members, box contents and market and restaurant demand. */
	'demand.edit': ['owner', 'share_manager'],
	/** Swap short box items for crops in surplus, and undo a swap. */
	'boxes.swap': ['owner', 'share_manager'],
	/** Set the fill under which a box item is flagged short. */
	'boxes.settings': ['owner', 'share_manager']
} as const satisfies Record<string, readonly Role[]>;

export type Action = keyof typeof permissions;

export function can(role: Role, action: Action): boolean {
	return (permissions[action] as readonly Role[]).includes(role);
}

/** The roles that may take an action, in the table's order. */
export function rolesFor(action: Action): readonly Role[] {
	return permissions[action];
}

/** Every action a role may take. */
export function actionsOf(role: Role): Action[] {
	return (Object.keys(permissions) as Action[]).filter((a) => can(role, a));
}
