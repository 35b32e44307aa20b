// See https://svelte.dev/docs/kit/types#app.d.ts
import type { Role } from '$lib/roles';

declare global {
	namespace App {
		interface Locals {
			user: { id: string; email: string; name: string } | null;
			sessionId: string | null;
			/** The farm this session works in, with the user's role there. */
			farm: { id: number; name: string; role: Role } | null;
		}
		interface Error {
			message: string;
		}
	}
}

export {};
