// Shared by the demand JSON routes: a refused write becomes its status with the named errors.
import { json } from '@sveltejs/kit';
import { DemandInputError } from '$lib/server/demand';

export async function respond(work: () => Promise<Response>): Promise<Response> {
	try {
		return await work();
	} catch (e) {
		if (e instanceof DemandInputError) return json({ message: e.message, errors: e.errors }, { status: e.status });
		throw e;
	}
}
