import { error, redirect } from '@sveltejs/kit';
import { getRequestEvent } from '$app/server';
import { accessFor, PERMISSIONS, type Access, type Act } from '$lib/permissions';
import { describeRoles, hasRole, ROLE_LABELS } from '$lib/roles';
import type { Actor } from './audit';
import { tokenGrants } from './auth/api-tokens';
import { ACT_LABELS } from '$lib/token-scopes';

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
	access: Access,
	request: { pathname: string; search?: string; method: string }
): AccessDecision | { kind: 'allow'; user: null } {
	if (access === 'public') return { kind: 'allow', user };
	if (!user) {
		if (request.pathname.startsWith('/api/') || request.method !== 'GET') {
			return {
				kind: 'deny',
				status: 401,
				message: request.pathname.startsWith('/api/')
					? 'Sign in first, or send an API token as Authorization: Bearer <token>.'
					: 'Sign in first: this needs a signed-in user.'
			};
		}
		return { kind: 'sign-in', next: request.pathname + (request.search ?? '') };
	}
	const allowed = access === 'signed-in' ? [] : access;
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

type UserFor<A extends Act> = (typeof PERMISSIONS)[A] extends 'public'
	? SignedInUser | null
	: SignedInUser;

/**
 * The one door check, by the act the door does (its roles are in `$lib/permissions`): call it in every
 * load, and again in every action and endpoint.
 */
export function requirePermission<A extends Act>(act: A): UserFor<A> {
	const event = getRequestEvent();
	const decision = decideAccess(event.locals.user, accessFor(act), {
		pathname: event.url.pathname,
		search: event.url.search,
		method: event.request.method
	});
	if (decision.kind === 'sign-in')
		redirect(303, `/login?next=${encodeURIComponent(decision.next)}`);
	if (decision.kind === 'deny')
		error(decision.status, { message: decision.message, needed: decision.needed });
	const token = event.locals.apiToken;
	if (token && accessFor(act) !== 'public' && decision.user) {
		if (!tokenGrants(token, act, actorOf(decision.user)))
			error(403, {
				message: `This token (“${token.name}”) does not have the scope ${act} (${ACT_LABELS[act]}). Make a token with it under Account → API tokens.`,
				needed: act
			});
	}
	return decision.user as UserFor<A>;
}

/** The door check for a change: the person who passed it, as the audit trail records them. */
export function requireActor(
	act: Exclude<Act, PublicAct>
): SignedInUser & Required<Actor> & { address: string } {
	return actorOf(requirePermission(act) as SignedInUser);
}

type PublicAct = { [A in Act]: (typeof PERMISSIONS)[A] extends 'public' ? A : never }[Act];

export function actorOf(user: SignedInUser): SignedInUser & Required<Actor> & { address: string } {
	const token = tokenOfRequest();
	return {
		...user,
		address: clientAddress(),
		viaToken: token ? { id: token.id, name: token.name } : null
	};
}

function tokenOfRequest(): { id: string; name: string } | null {
	try {
		return getRequestEvent()?.locals.apiToken ?? null;
	} catch {
		return null; // outside a request: seeding, start-up
	}
}

export function clientAddress(): string {
	const event = getRequestEvent();
	try {
		return event.getClientAddress();
	} catch {
		return 'unknown';
	}
}
