// Guards called at the top of every load, action and API handler. Pages without a session
// redirect to sign-in; API routes answer 401. A signed-in user in the wrong role gets 403.
import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import type { Role } from '$lib/roles';
import { roleLabels } from '$lib/roles';
import { rolesFor, type Action } from '$lib/permissions';

export interface Viewer {
	user: { id: string; email: string; name: string };
	farm: { id: number; name: string; role: Role };
}

function isApi(event: RequestEvent): boolean {
	return event.url.pathname.startsWith('/api/');
}

export function requireUser(event: RequestEvent): Viewer {
	const { user, farm } = event.locals;
	if (!user) {
		if (isApi(event)) error(401, 'Sign in first: this request has no valid session.');
		const next = event.url.pathname + event.url.search;
		redirect(303, `/signin?next=${encodeURIComponent(next)}`);
	}
	if (!farm) error(403, 'Your account is not a member of any farm.');
	return { user, farm };
}

/** The signed-in viewer, when its role may take `action` (src/lib/permissions.ts); else 403 naming who may. */
export function requireCan(event: RequestEvent, action: Action): Viewer {
	return requireRole(event, ...rolesFor(action));
}

function requireRole(event: RequestEvent, ...allowed: readonly Role[]): Viewer {
	const viewer = requireUser(event);
	if (!allowed.includes(viewer.farm.role)) {
		const who = allowed.map((r) => roleLabels[r].toLowerCase()).join(' or ');
		error(
			403,
			`Only the farm's ${who} may do this; you are signed in as ${roleLabels[viewer.farm.role].toLowerCase()}.`
		);
	}
	return viewer;
}
