import { error, redirect } from '@sveltejs/kit';
import { getRequestEvent } from '$app/server';
import { describeRoles, hasRole, ROLE_LABELS, type Role } from '$lib/roles';

export type SignedInUser = NonNullable<App.Locals['user']>;

function isApiRequest(pathname: string): boolean {
	return pathname.startsWith('/api/');
}

/**
 * The one door check: call it in every load, and again in every action and endpoint.
 * Pages without a session go to sign-in (and come back); endpoints answer 401. Missing roles answer 403.
 */
export function requireRole(...allowed: Role[]): SignedInUser {
	const event = getRequestEvent();
	const user = event.locals.user;
	if (!user) {
		if (isApiRequest(event.url.pathname) || event.request.method !== 'GET') {
			error(401, { message: 'Sign in first: this needs a signed-in user.' });
		}
		const next = event.url.pathname + event.url.search;
		redirect(303, `/login?next=${encodeURIComponent(next)}`);
	}
	if (!hasRole(user, allowed)) {
		const needed = allowed.map((r) => ROLE_LABELS[r]).join(' or ');
		error(403, {
			message: `This needs the role ${needed}. You are signed in as ${user.email} with: ${describeRoles(user.roles)}.`,
			needed
		});
	}
	return user;
}

/** Any signed-in user. */
export function requireUser(): SignedInUser {
	return requireRole();
}

export function clientAddress(): string {
	const event = getRequestEvent();
	try {
		return event.getClientAddress();
	} catch {
		return 'unknown';
	}
}
