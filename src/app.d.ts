import type { Role } from '$lib/roles';

declare global {
	namespace App {
		interface Error {
			message: string;
			errorId?: string;
			/** For 403 pages: what the page needs and what the user holds. */
			needed?: string;
		}
		interface Locals {
			user: { id: string; email: string; name: string; roles: Role[] } | null;
			session: import('$lib/server/auth/sessions').Session | null;
			/** The API token the request came with (API paths only); null for a session or nobody. */
			apiToken?: import('$lib/server/db/schema').ApiToken | null;
		}
		interface PageData {
			user?: App.Locals['user'];
		}
	}
}

export {};
