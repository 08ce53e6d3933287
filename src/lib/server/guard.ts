import { error, redirect } from '@sveltejs/kit';
import { getRequestEvent } from '$app/server';
import { describeRoles, hasRole, ROLE_LABELS, type Role } from '$lib/roles';

export type SignedInUser = NonNullable<App.Locals['user']>;

export type AccessDecision =
	| { kind: 'allow'; user: SignedInUser }
	| { kind: 'sign-in'; next: string }
	| { kind: 'deny'; status: 401 | 403; message: string; needed?: string };

/**
 * The pure rule behind every door: who may pass, and what anyone else is told.
 * Pages without a session go to sign-in (and come back); endpoints and form posts answer 401.
 */
export function decideAccess(
	user: SignedInUser | null,
	allowed: readonly Role[],
	request: { pathname: string; search?: string; method: string }
): AccessDecision {
	if (!user) {
		if (request.pathname.startsWith('/api/') || request.method !== 'GET') {
			return { kind: 'deny', status: 401, message: 'Sign in first: this needs a signed-in user.' };
		}
		return { kind: 'sign-in', next: request.pathname + (request.search ?? '') };
	}
	if (!hasRole(user, allowed)) {
		const needed = allowed.map((r) => ROLE_LABELS[r]).join(' or ');
		return {
			kind: 'deny',
			status: 403,
			message: `This needs the role ${needed}. You are signed in as ${user.email} with: ${describeRoles(user.roles)}.`,
			needed
		};
	}
	return { kind: 'allow', user };
}

/** The one door check: call it in every load, and again in every action and endpoint. */
export function requireRole(...allowed: Role[]): SignedInUser {
	const event = getRequestEvent();
	const decision = decideAccess(event.locals.user, allowed, {
		pathname: event.url.pathname,
		search: event.url.search,
		method: event.request.method
	});
	if (decision.kind === 'sign-in') redirect(303, `/login?next=${encodeURIComponent(decision.next)}`);
	if (decision.kind === 'deny') error(decision.status, { message: decision.message, needed: decision.needed });
	return decision.user;
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
