import { json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guards';

export const GET: RequestHandler = async (event) => {
	const { user, farm } = requireUser(event);
	return json({ user, farm });
};
